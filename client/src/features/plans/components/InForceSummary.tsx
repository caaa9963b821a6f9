import type { InForceDto } from '../../../../../policies/dto';
import type { Unit } from '../../../../../policies/schemas';
import { MOVEMENT_PATTERNS, PATTERN_LABELS, type MovementPattern } from '../../../../../policies/load/patterns';
import { describeRule } from '../../../../../policies/load/describe';
import { LineBar } from '../../../components/ui/LineBar';
import { StatusMark } from '../../../components/ui/StatusMark';
import { formatDate } from '../../../lib/format';
import { dateRange, patternList } from './plan-words';

const percent = (n: number) => `${n}%`;

/** Blocked patterns first, then capped, each in the catalogue's order. */
export function restrictedPatterns(inForce: Pick<InForceDto, 'patterns'>): MovementPattern[] {
  const blocked = MOVEMENT_PATTERNS.filter((p) => inForce.patterns[p].mode === 'blocked');
  const capped = MOVEMENT_PATTERNS.filter((p) => inForce.patterns[p].mode === 'capped');
  return [...blocked, ...capped];
}

/**
 * What applies on one date, for staff: status, the stages that cover it, each restricted pattern in
 * plain words with its lines drawn, the free patterns in one line, pain ceiling and guidance.
 */
export function InForceSummary({ inForce, unit, showStatus = true }: { inForce: InForceDto; unit: Unit; showStatus?: boolean }) {
  const restricted = restrictedPatterns(inForce);
  const free = MOVEMENT_PATTERNS.filter((p) => !restricted.includes(p));
  return (
    <div className="space-y-3 text-sm">
      {showStatus && (
        <p className="flex flex-wrap items-center gap-x-2">
          <StatusMark status={inForce.status} />
          <span className="text-ink-2 tabular-nums">
            {inForce.statusEffectiveFrom ? `since ${formatDate(inForce.statusEffectiveFrom)}` : 'no open case'}
          </span>
        </p>
      )}
      {inForce.stages.length === 0 ? (
        <p className="text-ink-2">No restriction plan covers this date: every movement pattern is free.</p>
      ) : (
        <>
          <ul className="space-y-0.5">
            {inForce.stages.map((s) => (
              <li key={`${s.planId}-${s.stage.id}`} className="tabular-nums">
                <span className="font-semibold">{s.stage.label || 'Stage'}</span>{' '}
                <span className="text-ink-2">
                  {dateRange(s.stage.startDate, s.stage.endDate)}
                  {s.stage.reviewDate && ` · review ${formatDate(s.stage.reviewDate)}`} · plan version {s.planVersion}
                </span>
              </li>
            ))}
          </ul>
          {restricted.length > 0 && (
            <ul className="divide-y divide-rule rounded-md border border-rule">
              {restricted.map((p) => {
                const rule = inForce.patterns[p];
                return (
                  <li key={p} className="grid gap-2 px-3 py-2 sm:grid-cols-[1fr_minmax(10rem,16rem)] sm:items-center">
                    <p>{describeRule(p, rule, unit, 'staff')}</p>
                    {rule.mode === 'capped' && rule.caps?.maxPercent1RM !== undefined && (
                      <LineBar
                        label={`${PATTERN_LABELS[p]}: share of best lift allowed`}
                        value={rule.caps.maxPercent1RM}
                        limit={rule.caps.maxPercent1RM}
                        max={100}
                        format={percent}
                        showLabel={false}
                      />
                    )}
                  </li>
                );
              })}
            </ul>
          )}
          {free.length > 0 && (
            <p className="text-ink-2">{restricted.length === 0 ? 'Every movement pattern is free.' : `No limits: ${patternList(free)}.`}</p>
          )}
          <LineBar
            className="max-w-sm"
            label="Pain ceiling during training"
            value={inForce.painCeiling}
            limit={inForce.painCeiling}
            max={10}
            format={(n) => `${n}/10`}
          />
        </>
      )}
      {inForce.guidance.length > 0 && (
        <div>
          <p className="font-semibold">Guidance for the athlete and family</p>
          {inForce.guidance.map((g, i) => (
            <p key={i} className="mt-1 border-l-2 border-rule pl-3 whitespace-pre-wrap">
              {g}
            </p>
          ))}
        </div>
      )}
    </div>
  );
}
