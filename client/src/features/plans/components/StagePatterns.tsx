import { useId, useState } from 'react';
import { useFormContext, useWatch } from 'react-hook-form';
import type { Unit } from '../../../../../policies/schemas';
import { MOVEMENT_PATTERNS, PATTERN_LABELS, type MovementPattern } from '../../../../../policies/load/patterns';
import { Button } from '../../../components/ui/Button';
import type { PlanForm } from './plan-form';
import { PatternRuleHeader, PatternRuleRow } from './PatternRuleRow';

/**
 * The movement patterns of one stage, limited ones first: each blocked or capped pattern with its
 * controls, the rest in one line as "no limit", and a control to bring one of those in. Every pattern
 * stays in the form, so what is saved is the same as when all thirteen rows were drawn (a pattern
 * without a limit is sent as free, i.e. left out). A row once shown stays shown while the editor is
 * open, so setting it back to Free does not pull it from under the pointer.
 */
export function StagePatterns({ stageIndex, unit }: { stageIndex: number; unit: Unit }) {
  const { control, setValue, setFocus } = useFormContext<PlanForm>();
  const modes = useWatch({
    control,
    name: MOVEMENT_PATTERNS.map((p) => `stages.${stageIndex}.patterns.${p}.mode` as const),
  });
  const limited = MOVEMENT_PATTERNS.filter((_p, k) => modes[k] !== 'free');
  const [kept, setKept] = useState<readonly MovementPattern[]>(limited);
  // A pattern limited since (a copied or reloaded plan) joins the rows; adjusting state while rendering, as React documents.
  const joined = limited.filter((p) => !kept.includes(p));
  if (joined.length > 0) setKept([...kept, ...joined]);
  const [choice, setChoice] = useState('');
  const addId = useId();

  const shown = MOVEMENT_PATTERNS.filter((p) => kept.includes(p) || limited.includes(p));
  const others = MOVEMENT_PATTERNS.filter((p) => !shown.includes(p));
  const picked = others.find((p) => p === choice);

  function addLimit() {
    if (!picked) return;
    setKept([...kept, picked]);
    // A limit is asked for, so it opens as Capped with its caps; Blocked is one press away.
    setValue(`stages.${stageIndex}.patterns.${picked}.mode`, 'capped', { shouldDirty: true });
    setChoice('');
    requestAnimationFrame(() => setFocus(`stages.${stageIndex}.patterns.${picked}.caps.maxPercent1RM`));
  }

  return (
    <>
      {shown.length > 0 ? (
        <>
          <PatternRuleHeader unit={unit} />
          {shown.map((pattern) => (
            <PatternRuleRow key={pattern} stageIndex={stageIndex} pattern={pattern} unit={unit} />
          ))}
        </>
      ) : (
        <p className="border-t border-rule py-2 text-sm text-ink-2">No movement is limited in this stage yet.</p>
      )}
      {others.length > 0 && (
        <div className="border-t border-rule pt-2">
          <p className="text-sm text-ink-2">
            <span className="font-semibold text-ink">No limit:</span> {others.map((p) => PATTERN_LABELS[p]).join(', ')}.
          </p>
          <div className="mt-2 flex flex-wrap items-end gap-2">
            <div className="min-w-0 flex-1 sm:flex-none">
              <label htmlFor={addId} className="block text-sm font-semibold">
                Add a limit for another movement
              </label>
              <select
                id={addId}
                value={choice}
                onChange={(e) => setChoice(e.target.value)}
                className="mt-1 block min-h-10 w-full rounded-md border border-rule-strong bg-sheet px-2 text-sm sm:w-64"
              >
                <option value="">Choose a movement</option>
                {others.map((p) => (
                  <option key={p} value={p}>
                    {PATTERN_LABELS[p]}
                  </option>
                ))}
              </select>
            </div>
            <Button variant="secondary" disabled={!picked} onClick={addLimit}>
              Add limit
            </Button>
          </div>
        </div>
      )}
    </>
  );
}
