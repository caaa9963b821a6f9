import { useId, useState } from 'react';
import type { ProgramSessionDto } from '../../../../../policies/dto';
import type { Breach } from '../../../../../policies/load/compliance';
import { PROGRAM_CAUTION } from '../../../../../policies/cautions';
import { ActionCaution } from '../../../components/Cautions';
import { Button } from '../../../components/ui/Button';
import { ErrorNotice, Notice } from '../../../components/ui/Notice';
import { useDeleteSession, usePublishSession, useUnpublishSession } from '../api/sessions';
import { BreachList } from './BreachList';
import { ExceptionRequestForm } from './ExceptionRequestForm';
import { plural } from './program-words';

export interface Refusal {
  message: string;
  results: { athleteId: string; athleteName: string; breaches: Breach[] }[];
}

export const STALE_SESSION =
  'Someone changed this session after you opened it, so your changes were not saved. Reload it to see their version, then make your change again.';

/**
 * Save, publish (off while any set breaches), unpublish, ask for an exception, delete — and what
 * came back: a stale version, the server's refusal with its own breach list.
 */
export function SessionActions({
  orgId,
  formId,
  session,
  athletes,
  dirty,
  saving,
  saveError,
  conflict,
  blocking,
  waivedSets,
  empty,
  checking,
  refusal,
  setLabel,
  saveIfChanged,
  onPublished,
  onRefused,
  onReload,
  onDeleted,
  clearRefusal,
}: {
  orgId: string;
  /** The session form the Save button submits (this bar sits outside it, so forms never nest). */
  formId: string;
  session: ProgramSessionDto;
  athletes: { id: string; name: string }[];
  dirty: boolean;
  saving: boolean;
  saveError: unknown;
  conflict: boolean;
  /** Unwaived breaches per athlete, from the live check. */
  blocking: { athleteId: string; athleteName: string; breaches: Breach[] }[];
  /** Sets that go past a cap but are covered by a granted exception. */
  waivedSets: number;
  empty: boolean;
  checking: boolean;
  refusal: Refusal | null;
  setLabel: (setId: string) => string;
  saveIfChanged: () => Promise<number | null>;
  onPublished: (session: ProgramSessionDto) => void;
  onRefused: (error: unknown) => void;
  onReload: () => void;
  onDeleted: () => void;
  clearRefusal: () => void;
}) {
  const whyId = useId();
  const publish = usePublishSession(orgId, session.id);
  const unpublish = useUnpublishSession(orgId, session.id);
  const remove = useDeleteSession(orgId, session.id);
  const [asking, setAsking] = useState(false);
  const [sent, setSent] = useState(false);
  const [confirmDelete, setConfirmDelete] = useState(false);
  const published = session.status === 'published';
  const breachCount = blocking.reduce((n, r) => n + r.breaches.length, 0);
  const setCount = new Set(blocking.flatMap((r) => r.breaches.map((b) => b.setId))).size;
  const busy = saving || publish.isPending || unpublish.isPending || remove.isPending;
  const actionError = publish.error ?? unpublish.error ?? remove.error;
  const staleAction = conflict || (!!actionError && (actionError as { code?: string }).code === 'version_conflict');

  async function onPublish() {
    clearRefusal();
    setSent(false);
    const version = await saveIfChanged();
    if (version === null) return;
    publish.mutate(version, {
      onSuccess: onPublished,
      onError: (error) => {
        if ((error as { status?: number }).status === 422) onRefused(error);
      },
    });
  }

  const setsFor = (athleteId: string) => {
    const mine = blocking.find((r) => r.athleteId === athleteId)?.breaches ?? [];
    const ids = [...new Set(mine.map((b) => b.setId))];
    return ids.map((setId) => ({
      setId,
      label: setLabel(setId),
      words: mine
        .filter((b) => b.setId === setId)
        .map((b) => b.message)
        .join(' '),
    }));
  };

  return (
    <>
      <div className="space-y-2 rounded-lg border border-rule bg-shade p-3 lg:sticky lg:top-0 lg:z-10">
        <div className="flex flex-wrap items-center gap-2">
          <Button type="submit" form={formId} variant={published ? 'primary' : 'secondary'} busy={saving} disabled={busy && !saving}>
            {published ? 'Save changes' : 'Save draft'}
          </Button>
          {published ? (
            <Button
              variant="secondary"
              busy={unpublish.isPending}
              disabled={busy}
              onClick={() => unpublish.mutate(session.version, { onSuccess: onPublished })}
            >
              Back to draft
            </Button>
          ) : (
            <Button
              busy={publish.isPending}
              disabled={busy || breachCount > 0 || empty}
              aria-describedby={whyId}
              onClick={() => void onPublish()}
            >
              Publish
            </Button>
          )}
          {(breachCount > 0 || session.holds.length > 0) && (
            <Button variant="secondary" disabled={busy} onClick={() => setAsking((v) => !v)} aria-expanded={asking}>
              Ask for an exception
            </Button>
          )}
          <span className="grow" />
          {confirmDelete ? (
            <span className="flex items-center gap-2 text-sm">
              Delete this session?
              <Button size="sm" variant="danger" busy={remove.isPending} onClick={() => remove.mutate(undefined, { onSuccess: onDeleted })}>
                Yes, delete it
              </Button>
              <Button size="sm" variant="quiet" onClick={() => setConfirmDelete(false)}>
                Keep it
              </Button>
            </span>
          ) : (
            <Button size="sm" variant="quiet" onClick={() => setConfirmDelete(true)}>
              Delete session
            </Button>
          )}
        </div>
        <p id={whyId} aria-live="polite" className="text-sm tabular-nums">
          {breachCount > 0 ? (
            <span className="font-semibold text-line-deep">
              ▲ {plural(setCount, 'set')} {setCount === 1 ? 'is' : 'are'} over a limit ({plural(breachCount, 'limit')} crossed).{' '}
              {published ? 'Changes are refused until they fit.' : 'Publish is off until they fit, or the clinician grants an exception.'}
            </span>
          ) : empty ? (
            <span className="text-ink-2">Add at least one exercise to publish.</span>
          ) : (
            <span className="text-ink-2">
              {checking
                ? 'Checking against the limits…'
                : waivedSets > 0
                  ? `Every set is within the limits for this date, or is covered by a granted exception (${plural(waivedSets, 'set')}).`
                  : 'Every set is within the limits for this date.'}
              {dirty && ' Unsaved changes.'}
            </span>
          )}
        </p>
      </div>
      <ActionCaution caution={PROGRAM_CAUTION} />
      {dirty && asking && <p className="text-sm text-ink-2">Save first: the clinician decides on the sets as saved.</p>}
      {asking && !dirty && (
        <ExceptionRequestForm
          orgId={orgId}
          sessionId={session.id}
          athletes={athletes}
          setsFor={setsFor}
          onCancel={() => setAsking(false)}
          onDone={() => {
            setAsking(false);
            setSent(true);
          }}
        />
      )}
      {sent && (
        <Notice tone="done" role="status" title="Request sent">
          <p>The clinician has been told. Each set shows the request until they decide.</p>
        </Notice>
      )}
      {staleAction && (
        <Notice tone="problem" role="alert" title="This session changed elsewhere">
          <p>{STALE_SESSION}</p>
          <p>
            <Button size="sm" variant="secondary" className="mt-1" onClick={onReload}>
              Reload the session
            </Button>
          </p>
        </Notice>
      )}
      {refusal && (
        <Notice tone="problem" role="alert" title="Not published">
          <p>{refusal.message}</p>
          {refusal.results.map((r) => (
            <BreachList
              key={r.athleteId}
              label={`Over a limit, as the server checked, for ${r.athleteName}`}
              items={r.breaches.map((breach) => ({
                athleteId: r.athleteId,
                athleteName: refusal.results.length > 1 || athletes.length > 1 ? r.athleteName : null,
                breach,
              }))}
            />
          ))}
        </Notice>
      )}
      {!staleAction && !refusal && saveError ? <ErrorNotice error={saveError} /> : null}
      {!staleAction && !refusal && actionError && (actionError as { status?: number }).status !== 422 ? (
        <ErrorNotice error={actionError} />
      ) : null}
    </>
  );
}
