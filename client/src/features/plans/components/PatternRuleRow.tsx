import { memo, useId } from 'react';
import { useFormContext, useWatch } from 'react-hook-form';
import type { Unit } from '../../../../../policies/schemas';
import { PATTERN_LABELS, PATTERN_MODES, type MovementPattern, type PatternMode } from '../../../../../policies/load/patterns';
import { fieldSentence } from '../../../lib/form-errors';
import { cx } from '../../../components/ui/cx';
import type { PlanForm } from './plan-form';
import { CAP_COLUMNS } from './plan-words';

export const MODE_WORDS: Record<PatternMode, string> = { blocked: 'Blocked', capped: 'Capped', free: 'Free' };

/** Shared by the header row and each pattern row, so the columns line up on a wide screen. */
export const RULE_GRID = 'lg:grid lg:grid-cols-[8.5rem_12.5rem_repeat(7,minmax(4.25rem,1fr))] lg:items-center lg:gap-x-2';

const INPUT =
  'block min-h-9 w-full min-w-0 rounded border border-rule-strong bg-sheet px-2 text-sm tabular-nums ' +
  'aria-[invalid=true]:border-2 aria-[invalid=true]:border-line-deep';

/**
 * One movement pattern in one stage: blocked, capped or free, and when capped the seven caps. On a
 * phone the caps wrap under the pattern with their own short labels; on a laptop they are columns.
 */
export const PatternRuleRow = memo(function PatternRuleRow({
  stageIndex,
  pattern,
  unit,
}: {
  stageIndex: number;
  pattern: MovementPattern;
  unit: Unit;
}) {
  const { register, control, formState } = useFormContext<PlanForm>();
  const base = `stages.${stageIndex}.patterns.${pattern}` as const;
  const mode = useWatch({ control, name: `${base}.mode` });
  const errorId = useId();
  const unitId = useId();
  const idBase = useId();
  const name = PATTERN_LABELS[pattern];
  const ruleErrors = formState.errors.stages?.[stageIndex]?.patterns?.[pattern];
  const capErrors = ruleErrors?.caps;

  const messages: string[] = [];
  if (capErrors?.message) messages.push(`${name}: ${capErrors.message}`);
  if (ruleErrors?.mode?.message) messages.push(`${name} mode ${ruleErrors.mode.message}`);
  for (const col of CAP_COLUMNS) {
    const message = capErrors?.[col.field]?.message;
    if (message) messages.push(fieldSentence(`${name} ${col.name}`, message) ?? message);
  }
  const invalid = (field: (typeof CAP_COLUMNS)[number]['field']) => Boolean(capErrors?.[field] || capErrors?.message);

  return (
    <div className={cx('border-t border-rule py-2', mode !== 'free' && 'bg-paper/60')} data-pattern={pattern}>
      <div className={cx('flex flex-wrap items-center justify-between gap-2', RULE_GRID)}>
        <span className="text-sm font-semibold">{name}</span>
        <fieldset className="min-w-0">
          <legend className="sr-only">{name} mode</legend>
          <div className="inline-flex overflow-hidden rounded-md border border-rule-strong">
            {PATTERN_MODES.map((m) => (
              <label
                key={m}
                className={cx(
                  'relative inline-flex min-h-9 cursor-pointer items-center px-2.5 text-sm font-semibold select-none',
                  'border-l border-rule-strong first:border-l-0 has-[:focus-visible]:outline-3 has-[:focus-visible]:outline-line',
                  mode === m ? 'bg-ink text-paper' : 'bg-sheet text-ink-2 hover:bg-shade',
                )}
              >
                <input type="radio" value={m} className="sr-only" {...register(`${base}.mode`)} />
                {MODE_WORDS[m]}
              </label>
            ))}
          </div>
        </fieldset>

        {mode === 'capped' ? (
          <div className="mt-2 grid w-full grid-cols-2 gap-2 sm:grid-cols-4 lg:contents">
            {CAP_COLUMNS.map((col) => {
              const inputName = `${base}.caps.${col.field}` as const;
              const id = `${idBase}-${col.field}`;
              const described = cx(messages.length > 0 && errorId, col.field === 'maxLoad' && unitId) || undefined;
              return (
                <div key={col.field} className="min-w-0">
                  <label htmlFor={id} className="block text-xs text-ink-2 lg:sr-only">
                    <span className="sr-only">{name} </span>
                    {col.name}
                  </label>
                  {col.field === 'impactAllowed' ? (
                    <select
                      id={id}
                      className={cx(INPUT, 'mt-0.5 lg:mt-0')}
                      aria-invalid={invalid(col.field) || undefined}
                      aria-describedby={described}
                      {...register(`${base}.caps.impactAllowed`)}
                    >
                      <option value="">No limit</option>
                      <option value="yes">Allowed</option>
                      <option value="no">Not allowed</option>
                    </select>
                  ) : (
                    <span className="mt-0.5 flex items-center gap-1 lg:mt-0">
                      <input
                        id={id}
                        type="text"
                        inputMode="decimal"
                        autoComplete="off"
                        className={INPUT}
                        aria-invalid={invalid(col.field) || undefined}
                        aria-describedby={described}
                        {...register(inputName)}
                      />
                      {col.field === 'maxLoad' && (
                        <span id={unitId} className="text-xs text-muted lg:sr-only">
                          {unit}
                        </span>
                      )}
                    </span>
                  )}
                </div>
              );
            })}
          </div>
        ) : (
          <p className={cx('w-full text-sm text-muted lg:col-span-7 lg:block lg:w-auto', mode === 'free' && 'hidden')}>
            {mode === 'blocked' ? 'Not allowed during this stage' : 'No limits'}
          </p>
        )}
      </div>
      {messages.length > 0 && (
        <ul id={errorId} className="mt-1 space-y-0.5 text-sm font-semibold text-line-deep">
          {messages.map((m) => (
            <li key={m} className="flex items-start gap-1.5">
              <span aria-hidden="true">▲</span>
              <span>{m}</span>
            </li>
          ))}
        </ul>
      )}
    </div>
  );
});

/** Column headings for a wide screen; each input still carries its full name for assistive tech. */
export function PatternRuleHeader({ unit }: { unit: Unit }) {
  return (
    <div aria-hidden="true" className={cx('hidden pb-1 text-xs font-semibold text-muted', RULE_GRID)}>
      <span>Pattern</span>
      <span>Mode</span>
      {CAP_COLUMNS.map((col) => (
        <span key={col.field}>{col.heading(unit)}</span>
      ))}
    </div>
  );
}
