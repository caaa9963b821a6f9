import type { PainRuleDto } from '../../../../../policies/dto';
import { cx } from '../../../components/ui/cx';

/**
 * What the pain rule says, where the athlete cannot miss it. "Ease off" and "stop" carry a warning
 * shape and a heavy border, so they read without colour.
 */
export function PainRuleMessage({ painRule, className }: { painRule: PainRuleDto; className?: string }) {
  const reduce = painRule.action === 'reduce';
  return (
    <div
      role={reduce ? 'alert' : 'status'}
      className={cx(
        'rounded-lg bg-sheet px-4 py-4',
        reduce ? 'border-2 border-l-8 border-line-deep' : 'border border-l-8 border-ink',
        className,
      )}
    >
      <p className="flex items-start gap-2 text-lg leading-snug font-bold">
        <span aria-hidden="true" className={reduce ? 'text-line-deep' : 'text-ink'}>
          {reduce ? '▲' : '■'}
        </span>
        <span>{painRule.athleteMessage}</span>
      </p>
      {reduce && painRule.flags.length > 0 && (
        <ul className="mt-2 list-disc space-y-0.5 pl-9 text-sm text-ink-2">
          {painRule.flags.map((f) => (
            <li key={f.kind}>{f.message}</li>
          ))}
        </ul>
      )}
    </div>
  );
}
