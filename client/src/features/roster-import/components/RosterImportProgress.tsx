import type { ReactNode } from 'react';
import type { RosterImportDto } from '../../../../../policies/dto';
import { Button, ButtonLink } from '../../../components/ui/Button';
import { ErrorNotice, Notice } from '../../../components/ui/Notice';
import { Facts } from '../../../components/ui/Panel';
import { summaryFacts } from './roster-words';

/**
 * A started import as the server reports it: waiting for the queue, a bar of the rows done while it
 * runs, the counts when it is done, or the reason it stopped with a way to start it again (the server
 * resumes after the last batch it committed). Pure: the page polls and passes the latest state in.
 */
export function RosterImportProgress({
  state,
  onResume,
  resuming,
  resumeError,
  after,
}: {
  state: RosterImportDto;
  onResume: () => void;
  resuming: boolean;
  resumeError: unknown;
  /** Shown once the import has finished or stopped (e.g. "Check another file"). */
  after?: ReactNode;
}) {
  const file = state.fileName ? ` of ${state.fileName}` : '';
  if (state.status === 'done')
    return (
      <div className="space-y-3">
        <Notice tone="done" role="status" title={`The import${file} is done`}>
          <p>Everyone added has been sent an invitation; the e-mails go out in the background.</p>
        </Notice>
        <div data-testid="roster-summary">
          <Facts items={summaryFacts(state)} />
        </div>
        <div className="flex flex-wrap gap-2">
          <ButtonLink to="/admin/people">See the people</ButtonLink>
          {after}
        </div>
      </div>
    );
  if (state.status === 'failed')
    return (
      <div className="space-y-3">
        <Notice tone="problem" role="alert" title={`The import${file} stopped`}>
          <p>{state.error ?? 'It stopped before the end.'}</p>
          <p>
            {state.processed.toLocaleString('en-US')} of {state.totalRows.toLocaleString('en-US')} rows were done and stay done. Starting
            again carries on from there.
          </p>
        </Notice>
        <ErrorNotice error={resumeError} title="The import did not start again" />
        <div className="flex flex-wrap gap-2">
          <Button onClick={onResume} busy={resuming}>
            Start again
          </Button>
          {after}
        </div>
      </div>
    );
  if (state.status === 'previewed')
    return (
      <div className="space-y-3">
        <p className="text-sm text-muted">This file was checked but not imported.</p>
        {after}
      </div>
    );
  return <RowsBar state={state} />;
}

function RowsBar({ state }: { state: RosterImportDto }) {
  const total = Math.max(state.totalRows, 1);
  const percent = Math.min(100, Math.floor((state.processed / total) * 100));
  const words =
    state.status === 'queued'
      ? 'Waiting for the import to start…'
      : `${state.processed.toLocaleString('en-US')} of ${state.totalRows.toLocaleString('en-US')} rows imported`;
  return (
    <div className="rounded-md border border-rule bg-sheet p-3 text-sm">
      <div className="flex items-center gap-3">
        <div
          role="progressbar"
          aria-label="Rows imported"
          aria-valuemin={0}
          aria-valuemax={state.totalRows}
          aria-valuenow={state.processed}
          aria-valuetext={words}
          className="relative h-3 min-w-32 flex-1 overflow-hidden rounded-sm bg-shade"
        >
          <div className="absolute inset-y-0 left-0 bg-ink-2 transition-[width]" style={{ width: `${percent}%` }} />
        </div>
        <span className="w-12 shrink-0 text-right font-semibold tabular-nums">{percent}%</span>
      </div>
      <p className="mt-1 text-muted tabular-nums" role="status">
        {words}
      </p>
    </div>
  );
}
