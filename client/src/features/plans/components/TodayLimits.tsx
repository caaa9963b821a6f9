import { useId } from 'react';
import type { InForceDto } from '../../../../../policies/dto';
import type { Unit } from '../../../../../policies/schemas';
import { MOVEMENT_PATTERNS } from '../../../../../policies/load/patterns';
import { describeDate } from '../../../../../policies/load/describe';
import { describeRuleOnTheBar } from '../../../../../policies/load/day-words';
import { StatusMark } from '../../../components/ui/StatusMark';
import { restrictedPatterns } from './InForceSummary';
import { patternList } from './plan-words';

/** Status in one line, large, for the athlete's and guardian's phone screens. */
export function StatusToday({ inForce, name }: { inForce: InForceDto; name?: string }) {
  return (
    <div className="space-y-1">
      <StatusMark status={inForce.status} size="lg" explain />
      <p className="text-sm text-ink-2">
        {inForce.statusEffectiveFrom
          ? `${name ? `${name} has` : 'You have'} been ${inForce.status === 'full' ? 'on Full' : inForce.status === 'out' ? 'Out' : 'Limited'} since ${describeDate(inForce.statusEffectiveFrom)}.`
          : `No open case: ${name ?? 'you'} may train fully.`}
      </p>
    </div>
  );
}

/**
 * "What you may do today" in plain words: each limited movement, the free ones in one line, until
 * when, the pain ceiling and the clinician's guidance. `name` words it for a guardian.
 */
export function TodayLimits({ inForce, unit, name }: { inForce: InForceDto; unit: Unit; name?: string }) {
  const headingId = useId();
  const restricted = restrictedPatterns(inForce);
  const free = MOVEMENT_PATTERNS.filter((p) => !restricted.includes(p));
  const ends = inForce.stages.map((s) => s.stage.endDate).sort()[0];
  const reviews = inForce.stages
    .map((s) => s.stage.reviewDate)
    .filter((d): d is string => !!d && d >= inForce.date)
    .sort();
  const Who = name ?? 'You';

  return (
    <section aria-labelledby={headingId} className="rounded-lg border border-rule bg-sheet p-4 sm:p-5">
      <h2 id={headingId} className="text-xl font-bold">
        {name ? `What ${name} may do today` : 'What you may do today'}
      </h2>
      <div className="mt-3 space-y-3 text-base">
        {inForce.status === 'out' ? (
          <p className="font-semibold">
            {Who} {name ? 'is' : 'are'} Out: no training until the clinician says so.
          </p>
        ) : restricted.length === 0 ? (
          <p>No movement limits today{inForce.status === 'limited' ? ', but follow what the clinician told you' : ''}.</p>
        ) : (
          <>
            <ul className="space-y-2">
              {restricted.map((p) => (
                <li key={p} className="flex min-h-11 items-center rounded-md border border-rule border-l-4 border-l-line px-3 py-2">
                  {describeRuleOnTheBar(p, inForce.patterns[p], unit)}
                </li>
              ))}
            </ul>
            {free.length > 0 && <p>Everything else has no limits: {patternList(free)}.</p>}
            {ends && <p>These limits apply until {describeDate(ends)}.</p>}
            {reviews[0] && <p>Next check with the clinician: {describeDate(reviews[0])}.</p>}
          </>
        )}
        {inForce.stages.length > 0 && (
          <p className="rounded-md bg-shade px-3 py-2 font-semibold">
            {name
              ? `${name} should stop a session and tell the clinician if pain rises past ${inForce.painCeiling}/10.`
              : `Stop a session and tell your clinician if pain rises past ${inForce.painCeiling}/10.`}
          </p>
        )}
        {inForce.guidance.length > 0 && (
          <div>
            <p className="font-semibold">From {name ? `${name}'s` : 'your'} clinician</p>
            {inForce.guidance.map((g, i) => (
              <p key={i} className="mt-1 border-l-2 border-rule pl-3 whitespace-pre-wrap">
                {g}
              </p>
            ))}
          </div>
        )}
      </div>
    </section>
  );
}
