import { useId, useState } from 'react';
import { asSubject } from '../../../../../policies/access';
import type { ClipDto, ClipNoteDto } from '../../../../../policies/dto';
import { ClipNoteCreateSchema } from '../../../../../policies/schemas';
import { Button } from '../../../components/ui/Button';
import { TextAreaField } from '../../../components/ui/Field';
import { ErrorNotice } from '../../../components/ui/Notice';
import { cx } from '../../../components/ui/cx';
import { useAppAbility } from '../../../lib/ability';
import { isApiError } from '../../../lib/api-client';
import { useAddClipNote, useDeleteClipNote } from '../api/clip-changes';
import { clipTimeWords, formatClipTime, toMs } from './clip-time';

const ROLE_WORDS: Record<ClipNoteDto['authorRole'], string> = { coach: 'coach', clinician: 'clinician', athlete: 'athlete' };

/** Notes in the order they come in the clip, whatever order they were written in. */
export function notesInClipOrder(notes: readonly ClipNoteDto[]): ClipNoteDto[] {
  return [...notes].sort((a, b) => a.atMs - b.atMs || a.createdAt.localeCompare(b.createdAt));
}

/**
 * The notes beside the player (below it on a phone). Choosing one pauses the clip at its moment;
 * staff write new ones at the moment the player shows.
 */
export function ClipNotes({
  orgId,
  clip,
  timeSeconds,
  onChoose,
  onWriting,
}: {
  orgId: string;
  clip: ClipDto;
  timeSeconds: number;
  onChoose: (note: ClipNoteDto) => void;
  /** Called when someone starts writing, so the clip stops moving under the time they pin to. */
  onWriting: () => void;
}) {
  const ability = useAppAbility();
  const headingId = useId();
  const notes = notesInClipOrder(clip.notes ?? []);
  const scope = { organizationId: orgId, athleteId: clip.athleteId };
  const canWrite = ability.can('create', asSubject('ClipNote', { id: '', ...scope, authorUserId: '' }));
  const nowMs = toMs(timeSeconds);

  return (
    <section aria-labelledby={headingId} className="rounded-lg border border-rule bg-sheet p-4 lg:sticky lg:top-4">
      <h2 id={headingId} className="text-lg font-bold">
        Notes <span className="text-base font-normal text-muted tabular-nums">({notes.length})</span>
      </h2>
      <p className="mb-3 text-sm text-muted">Choose a note to pause the clip at its moment.</p>
      {notes.length === 0 ? (
        <p className="text-sm text-ink-2">
          {canWrite ? 'No notes yet. Pause where you see something and pin a note there.' : 'No notes yet.'}
        </p>
      ) : (
        <ol className="space-y-2">
          {notes.map((note) => (
            <NoteItem key={note.id} orgId={orgId} clip={clip} note={note} active={Math.abs(nowMs - note.atMs) < 50} onChoose={onChoose} />
          ))}
        </ol>
      )}
      {canWrite && <NoteForm orgId={orgId} clipId={clip.id} atMs={nowMs} onWriting={onWriting} />}
    </section>
  );
}

function NoteItem({
  orgId,
  clip,
  note,
  active,
  onChoose,
}: {
  orgId: string;
  clip: ClipDto;
  note: ClipNoteDto;
  active: boolean;
  onChoose: (note: ClipNoteDto) => void;
}) {
  const ability = useAppAbility();
  const remove = useDeleteClipNote(orgId, clip.id);
  const canRemove = ability.can(
    'delete',
    asSubject('ClipNote', { id: note.id, organizationId: orgId, athleteId: clip.athleteId, authorUserId: note.authorUserId }),
  );
  return (
    <li className={cx('rounded-md border', active ? 'border-line border-l-4' : 'border-rule')}>
      <button
        type="button"
        onClick={() => onChoose(note)}
        aria-current={active ? 'true' : undefined}
        aria-label={`At ${clipTimeWords(note.atMs)}, ${note.authorName}: ${note.body}`}
        className="block w-full px-3 py-2 text-left text-sm hover:bg-shade"
      >
        <span className="flex flex-wrap items-baseline gap-x-2">
          <span className="font-bold tabular-nums">{formatClipTime(note.atMs)}</span>
          <span className="text-muted">
            {note.authorName} · {ROLE_WORDS[note.authorRole]}
          </span>
        </span>
        <span className="mt-0.5 block break-words whitespace-pre-line">{note.body}</span>
      </button>
      {canRemove && (
        <div className="border-t border-rule px-3 py-1">
          <Button
            variant="quiet"
            size="sm"
            busy={remove.isPending}
            onClick={() => remove.mutate(note.id)}
            aria-label={`Remove your note at ${formatClipTime(note.atMs)}`}
          >
            Remove
          </Button>
          <ErrorNotice error={remove.error} className="mt-1" />
        </div>
      )}
    </li>
  );
}

function NoteForm({ orgId, clipId, atMs, onWriting }: { orgId: string; clipId: string; atMs: number; onWriting: () => void }) {
  const add = useAddClipNote(orgId, clipId);
  const [body, setBody] = useState('');
  const [problem, setProblem] = useState<string | undefined>();
  const at = formatClipTime(atMs);

  return (
    <form
      aria-label="Pin a note"
      noValidate
      className="mt-4 space-y-2 border-t border-rule pt-3"
      onSubmit={(e) => {
        e.preventDefault();
        const parsed = ClipNoteCreateSchema.safeParse({ atMs, body });
        if (!parsed.success) {
          setProblem(parsed.error.issues[0]?.message);
          return;
        }
        setProblem(undefined);
        add.mutate(parsed.data, {
          onSuccess: () => setBody(''),
          onError: (error) => {
            if (isApiError(error) && error.fields.body) setProblem(error.fields.body.join(' '));
          },
        });
      }}
    >
      <p className="text-sm">
        Pinned at{' '}
        <strong className="tabular-nums" data-testid="note-pin-time">
          {at}
        </strong>
        , where the player is now.
      </p>
      <TextAreaField
        label="Note"
        hint="Everyone who can watch this clip reads it, the athlete too."
        value={body}
        error={problem}
        onFocus={onWriting}
        onChange={(e) => setBody(e.currentTarget.value)}
      />
      <ErrorNotice error={add.isError && !(isApiError(add.error) && add.error.fields.body) ? add.error : null} />
      <Button type="submit" busy={add.isPending}>
        Pin note at {at}
      </Button>
    </form>
  );
}
