import { useId } from 'react';
import { CLINICIAN_RECORD_CAUTION, PAIN_CEILING_CAUTION, TEAM_RECORD_CAUTION, type Caution } from '../../../policies/cautions';
import { WARNING_TIERS } from '../../../policies/red-flags';

// In a file of its own so the frame of every page does not load the warning signs (a small first load).
export { CareCaution } from './CareCaution';

/**
 * The warning signs, in the same two tiers and with the same items the pain report routes by
 * (`WARNING_TIERS` in policies/red-flags.ts). Shown in full on the athlete's and guardian's pages,
 * with the organization's emergency number when we know it.
 */
export function RedFlagCaution({ emergencyNumber }: { emergencyNumber?: string | null }) {
  const id = useId();
  return (
    <section aria-labelledby={id} className="rounded-lg border-2 border-line-deep bg-sheet p-4 text-sm sm:p-5">
      <h2 id={id} className="flex items-center gap-2 text-base font-bold">
        <span aria-hidden="true" className="text-line-deep">
          ▲
        </span>
        Warning signs
      </h2>
      <p className="mt-1 text-ink-2">
        These are rare, but they need care quickly. They are not a diagnosis: a clinician or doctor decides what they mean.
      </p>
      {WARNING_TIERS.map((tier) => (
        <section
          key={tier.tier}
          aria-labelledby={`${id}-${tier.tier}`}
          className={`mt-3 border-l-4 pl-3 ${tier.tier === 'emergency' ? 'border-line-deep' : 'border-rule-strong'}`}
        >
          <h3 id={`${id}-${tier.tier}`} className="font-bold">
            {tier.heading}
          </h3>
          <p className="mt-0.5">{tier.action}</p>
          <ul className="mt-1 list-disc space-y-0.5 pl-5">
            {tier.items.map((item) => (
              <li key={item.id}>{item.sign}</li>
            ))}
          </ul>
          {tier.tier === 'emergency' && emergencyNumber && (
            <p className="mt-1 font-semibold">
              In an emergency call{' '}
              <a href={`tel:${emergencyNumber.replace(/[^\d+]/g, '')}`} className="tabular-nums">
                {emergencyNumber}
              </a>
              .
            </p>
          )}
        </section>
      ))}
      <p className="mt-3">{PAIN_CEILING_CAUTION}</p>
    </section>
  );
}

/**
 * The caution at the top of case and plan screens, where clinical decisions are written down or
 * read. It is part of the page, not a dialog: it never needs a click to be read.
 */
export function ClinicalRecordCaution({ audience = 'clinician', className }: { audience?: 'clinician' | 'team'; className?: string }) {
  const caution = audience === 'clinician' ? CLINICIAN_RECORD_CAUTION : TEAM_RECORD_CAUTION;
  return (
    <p className={`rounded-md border border-rule border-l-4 border-l-line bg-sheet px-3 py-2 text-sm text-ink-2 ${className ?? ''}`}>
      <span className="font-semibold text-ink">{caution.lead}</span> {caution.text}
    </p>
  );
}

/**
 * A short caution beside an action that acts on the clinician's decisions (publishing a program,
 * deciding an exception), so it is read where the choice is made and not only in the footer.
 */
export function ActionCaution({ caution, className }: { caution: Caution; className?: string }) {
  return (
    <p role="note" aria-label="Caution" className={`border-l-4 border-l-line pl-2 text-xs text-ink-2 ${className ?? ''}`}>
      <span className="font-semibold text-ink">{caution.lead}</span> {caution.text}
    </p>
  );
}
