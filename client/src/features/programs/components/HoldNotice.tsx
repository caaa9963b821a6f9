import type { Breach } from '../../../../../policies/load/compliance';
import { Notice } from '../../../components/ui/Notice';

/**
 * A published session that a later plan change put past a cap: the athlete sees it without loads
 * until the coach changes it to fit (or an exception covers it).
 */
export function HoldNotice({ athleteName, breaches }: { athleteName: string; breaches: Breach[] }) {
  return (
    <Notice tone="problem" title={`On hold for ${athleteName} — update it to fit`}>
      <p>
        The limits changed after this session was published. {athleteName} sees it without loads until every set below fits again; saving a
        version that fits takes it off hold.
      </p>
      <ul aria-label={`Why it is on hold for ${athleteName}`} className="mt-1 list-disc space-y-0.5 pl-5 tabular-nums">
        {breaches.map((b, i) => (
          <li key={`${b.setId}-${b.rule}-${i}`}>{b.message}</li>
        ))}
      </ul>
    </Notice>
  );
}
