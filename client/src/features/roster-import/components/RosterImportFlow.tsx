import { useEffect, useRef, useState } from 'react';
import { useSearchParams } from 'react-router-dom';
import { useQueryClient } from '@tanstack/react-query';
import type { RosterLastCheckDto } from '../../../../../policies/dto';
import { humanDateTime } from '../../../../../policies/words/dates';
import { Button } from '../../../components/ui/Button';
import { ErrorNotice, Notice } from '../../../components/ui/Notice';
import { Loading, Panel } from '../../../components/ui/Panel';
import {
  rosterLastCheckKey,
  useLastRosterCheck,
  useRefreshAfterImport,
  useRosterImport,
  useStartRosterImport,
} from '../api/roster-imports';
import { RosterImportProgress } from './RosterImportProgress';
import { RosterPreview } from './RosterPreview';
import { RosterUploadForm } from './RosterUploadForm';

/** Where a started import's id is kept, so a reload (or a link) follows the same import. */
const IMPORT_PARAM = 'import';

/**
 * Check a file, read its preview, import it, follow it to the end. The checked file waits on the
 * server (one per admin) until it is imported, so a reload before importing shows it again.
 */
export function RosterImportFlow({ orgId }: { orgId: string }) {
  const [params, setParams] = useSearchParams();
  const importId = params.get(IMPORT_PARAM);
  const queryClient = useQueryClient();
  const lastCheck = useLastRosterCheck(orgId, !importId);
  const preview = lastCheck.data?.preview ?? null;
  const [checkedHere, setCheckedHere] = useState<string | null>(null);
  const [startedHere, setStartedHere] = useState(false);
  const start = useStartRosterImport(orgId);
  // A new preview appears below the form: focus moves to it, so a keyboard or screen reader user lands
  // on the result. One shown again after a reload leaves the focus where the page puts it.
  const previewRef = useRef<HTMLDivElement>(null);
  useEffect(() => {
    if (checkedHere) previewRef.current?.focus();
  }, [checkedHere]);

  if (importId)
    return (
      <StartedImport
        orgId={orgId}
        importId={importId}
        takeFocus={startedHere}
        onAnother={() => {
          setCheckedHere(null);
          start.reset();
          void queryClient.invalidateQueries({ queryKey: rosterLastCheckKey(orgId) });
          setParams({});
        }}
      />
    );
  return (
    <>
      <Panel title="Check a file">
        <RosterUploadForm
          orgId={orgId}
          onPreview={(p) => {
            start.reset();
            queryClient.setQueryData<RosterLastCheckDto>(rosterLastCheckKey(orgId), { preview: p });
            setCheckedHere(p.import.id);
          }}
        />
      </Panel>
      {lastCheck.isError && <ErrorNotice error={lastCheck.error} title="The file checked last could not be shown" />}
      {preview && (
        <div ref={previewRef} tabIndex={-1} data-testid="roster-preview" className="outline-none">
          <Panel title={`What importing ${preview.import.fileName ?? 'the file'} would do`}>
            {checkedHere !== preview.import.id && (
              <Notice tone="info" role="status" className="mb-4">
                <p>
                  Checked on {humanDateTime(preview.import.createdAt, Intl.DateTimeFormat().resolvedOptions().timeZone)} and not imported
                  yet. The rows are checked again against the people here now. Import them below, or check another file to replace it.
                </p>
              </Notice>
            )}
            <RosterPreview
              preview={preview}
              importing={start.isPending}
              error={start.error}
              onImport={() =>
                start.mutate(preview.import.id, {
                  onSuccess: (started) => {
                    setStartedHere(true);
                    setParams({ [IMPORT_PARAM]: started.id });
                  },
                })
              }
            />
          </Panel>
        </div>
      )}
    </>
  );
}

function StartedImport({
  orgId,
  importId,
  takeFocus,
  onAnother,
}: {
  orgId: string;
  importId: string;
  /** The import button that was pressed is gone: its place in the focus order passes to the progress. */
  takeFocus: boolean;
  onAnother: () => void;
}) {
  const state = useRosterImport(orgId, importId);
  const panelRef = useRef<HTMLDivElement>(null);
  useEffect(() => {
    if (takeFocus) panelRef.current?.focus();
  }, [takeFocus]);
  const resume = useStartRosterImport(orgId);
  const refresh = useRefreshAfterImport(orgId);
  const status = state.data?.status;
  useEffect(() => {
    if (status === 'done') refresh();
  }, [status, refresh]);
  const another = (
    <Button variant="secondary" onClick={onAnother}>
      Check another file
    </Button>
  );
  return (
    <div ref={panelRef} tabIndex={-1} data-testid="roster-progress" className="outline-none">
      <Panel title="Importing">
        {state.isPending ? (
          <Loading what="the import" />
        ) : state.isError ? (
          <div className="space-y-3">
            <ErrorNotice error={state.error} />
            {another}
          </div>
        ) : (
          <RosterImportProgress
            state={state.data}
            onResume={() => resume.mutate(importId)}
            resuming={resume.isPending}
            resumeError={resume.error}
            after={another}
          />
        )}
      </Panel>
    </div>
  );
}
