import { useState } from 'react';
import { Button } from '../../../components/ui/Button';
import { ErrorNotice, Notice } from '../../../components/ui/Notice';
import { ScoreScale } from '../../../components/ui/ScoreScale';
import { useRateReadiness, useStageCriteria } from '../api/stage-criteria';

// A file of its own, apart from the care team's StageCriteriaPanel: the athlete's and family's homes
// show it, and need none of the panel's forms and fields (a fast first load on a slow phone).
/** What the athlete or family reads: what unlocks the next stage, how far along, and (for the athlete) the readiness question. */
export function NextStageUnlocks({ orgId, planId, name }: { orgId: string; planId: string; name?: string }) {
  const q = useStageCriteria(orgId, planId);
  const rate = useRateReadiness(orgId, planId);
  const [value, setValue] = useState<number | null>(null);
  if (q.isPending || q.isError) return null;
  const d = q.data;
  if (!d.stage || !d.nextStage || d.criteria.length === 0) return null;
  const asksReadiness = d.canRate && d.criteria.some((c) => c.criterion.kind === 'athlete');
  return (
    <section aria-label="What unlocks the next stage" className="rounded-lg border border-rule bg-sheet p-4 sm:p-5">
      <h2 className="mb-1 text-xl font-bold">What unlocks the next stage</h2>
      <p className="text-sm text-ink-2">
        {d.metCount} of {d.criteria.length} done. When they are all done, the clinician talks it through with{' '}
        {name ? `${name} and you` : 'you'} before the next stage starts.
      </p>
      <ul className="mt-2 space-y-1 text-sm">
        {d.criteria.map((c) => (
          <li key={c.criterion.id}>
            <span className="font-semibold">{c.result.state === 'met' ? '✓' : '○'}</span> {c.plain}{' '}
            <span className="text-muted">{c.plainProgress}</span>
          </li>
        ))}
      </ul>
      {asksReadiness && (
        <form
          className="mt-3 space-y-2"
          onSubmit={(e) => {
            e.preventDefault();
            if (value !== null) rate.mutate({ stageId: d.stage!.id, value });
          }}
        >
          <ScoreScale
            label="How ready do you feel to move on?"
            value={value}
            onChange={setValue}
            low="Not ready at all"
            high="Completely ready"
          />
          {rate.isError && <ErrorNotice error={rate.error} />}
          {rate.isSuccess && (
            <Notice tone="done" role="status">
              <p>Thanks — your clinician will see it.</p>
            </Notice>
          )}
          <Button type="submit" size="sm" busy={rate.isPending} disabled={value === null}>
            Send
          </Button>
        </form>
      )}
    </section>
  );
}
