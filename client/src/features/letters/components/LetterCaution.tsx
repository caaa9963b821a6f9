import { cx } from '../../../components/ui/cx';

/**
 * The caution on every screen that writes or shows a clearance letter. Part of the page, never
 * behind a click; worded for the person reading.
 */
export function LetterCaution({ audience, className }: { audience: 'clinician' | 'family' | 'team'; className?: string }) {
  const lead =
    audience === 'clinician'
      ? 'A clearance letter records your decision as the athlete’s licensed clinician.'
      : 'This letter records a decision made by the athlete’s licensed clinician.';
  return (
    <p className={cx('rounded-md border border-rule border-l-4 border-l-line bg-sheet px-3 py-2 text-sm text-ink-2', className)}>
      <span className="font-semibold text-ink">{lead}</span> Loadline keeps the record; it does not diagnose, treat or replace professional
      care.{' '}
      {audience === 'clinician'
        ? 'Follow local law, your governing body’s rules and your organization’s policies.'
        : 'Ask the clinician about anything in it you are unsure of.'}
    </p>
  );
}
