import type { CaseDocumentDto, ClipDto, ClipNoteDto } from '../../../policies/dto';
import type { CaseDocumentFieldsInput, ClipFieldsInput, ClipNoteCreateInput } from '../../../policies/schemas';
import { CaseDocument, Clip, ClipNote } from '../entities';
import { authorize } from '../core/authorize';
import { orgCommand, type OrgCommandCtx } from '../core/command';
import { notify } from '../services/notify';
import { memberName } from '../queries/members';
import type { ReceivedFile } from '../storage/receive';
import { clipsFor, readableClip, readableUpload, resolveUploadTarget, toDocumentDto, toNoteDto, type UploadKind } from '../queries/uploads';

/**
 * Writes of upload records (clips and case documents), one path for both kinds. The file itself is
 * put into storage before `recordUpload` runs and removed again if it fails (storeThenRecord in
 * services/uploads.ts); a deleted record's file is removed after `deleteUpload` commits
 * (removeStored), so a failure leaves an orphan file, never a row without its file.
 */

type FileFacts = Pick<ReceivedFile, 'size' | 'sha256' | 'mediaType'>;

export type RecordUploadInput =
  | { kind: 'clip'; fields: ClipFieldsInput; file: FileFacts; storageKey: string }
  | { kind: 'document'; caseId: string; fields: CaseDocumentFieldsInput; file: FileFacts; storageKey: string };

const fileFacts = (file: FileFacts) => ({ mediaType: file.mediaType, sizeBytes: file.size, sha256: file.sha256 });

/** The row of a file already in storage, with its audit entry. The target is checked again: a care team may change during a long upload. */
export const recordUpload = orgCommand<RecordUploadInput, ClipDto | CaseDocumentDto>({
  name: 'uploads.record',
  async run(ctx, input) {
    const { m, actor, userId } = ctx;
    const target = await resolveUploadTarget(m, ctx, input.kind === 'clip' ? { kind: 'clip', fields: input.fields } : input);
    const common = {
      organizationId: actor.organizationId,
      athleteId: target.athleteId,
      mediaType: input.file.mediaType,
      sizeBytes: String(input.file.size),
      sha256: input.file.sha256,
      storageKey: input.storageKey,
      uploadedByUserId: userId,
      uploadedByName: await memberName(m, actor.membershipId, ''),
    };
    if (target.kind === 'clip' && input.kind === 'clip') {
      const clip = await m.save(
        m.create(Clip, {
          ...common,
          trainingLogId: target.trainingLogId,
          exercise: target.exercise,
          caption: input.fields.caption ?? null,
        }),
      );
      await ctx.audit({
        action: 'clip.uploaded',
        subjectType: 'Clip',
        subjectId: clip.id,
        athleteId: target.athleteId,
        after: { trainingLogId: target.trainingLogId, exercise: target.exercise, ...fileFacts(input.file) },
      });
      return (await clipsFor(m, ctx.ability, actor.organizationId, { id: clip.id }))[0];
    }
    if (target.kind !== 'document' || input.kind !== 'document') throw new Error('upload kind and target disagree');
    const { title, documentDate, issuedBy } = input.fields;
    const doc = await m.save(m.create(CaseDocument, { ...common, caseId: target.caseId, title, documentDate, issuedBy }));
    await ctx.audit({
      action: 'case_document.uploaded',
      subjectType: 'CaseDocument',
      subjectId: doc.id,
      athleteId: target.athleteId,
      after: { caseId: target.caseId, title, documentDate, issuedBy, ...fileFacts(input.file) },
    });
    return toDocumentDto(doc);
  },
});

const AUDIT = {
  clip: { subjectType: 'Clip', prefix: 'clip', read: 'clip.viewed' },
  document: { subjectType: 'CaseDocument', prefix: 'case_document', read: 'case_document.downloaded' },
} as const;

/** A read of the file itself (a clip watched, a document downloaded) is audited; the record is checked again here. */
export const recordUploadRead = orgCommand<{ kind: UploadKind; id: string }, void>({
  name: 'uploads.recordRead',
  async run(ctx, { kind, id }) {
    const { stored } = await readableUpload(ctx.m, ctx.ability, ctx.actor.organizationId, kind, id);
    await ctx.audit({ action: AUDIT[kind].read, subjectType: AUDIT[kind].subjectType, subjectId: stored.id, athleteId: stored.athleteId });
  },
});

/** Removes the row (a clip with its notes) and records what it was; returns the storage key to remove once committed. */
export const deleteUpload = orgCommand<{ kind: UploadKind; id: string }, { storageKey: string }>({
  name: 'uploads.delete',
  async run(ctx, { kind, id }) {
    const { m, ability } = ctx;
    const { record, stored } = await readableUpload(m, ability, ctx.actor.organizationId, kind, id);
    let before: Record<string, unknown>;
    if (record instanceof Clip) {
      authorize(ability, 'delete', 'Clip', record);
      const notes = await m.count(ClipNote, { where: { clipId: record.id } });
      await m.delete(Clip, { id: record.id });
      before = { trainingLogId: record.trainingLogId, exercise: record.exercise, ...uploadFacts(record), notes };
    } else {
      authorize(ability, 'delete', 'CaseDocument', record);
      await m.delete(CaseDocument, { id: record.id });
      const { caseId, title, documentDate, issuedBy } = record;
      before = { caseId, title, documentDate, issuedBy, ...uploadFacts(record) };
    }
    await ctx.audit({
      action: `${AUDIT[kind].prefix}.deleted`,
      subjectType: AUDIT[kind].subjectType,
      subjectId: stored.id,
      athleteId: stored.athleteId,
      before,
    });
    return { storageKey: stored.storageKey };
  },
});

const uploadFacts = (r: Clip | CaseDocument) => ({ mediaType: r.mediaType, sizeBytes: Number(r.sizeBytes), sha256: r.sha256 });

function noteRole(ctx: OrgCommandCtx, athleteId: string): ClipNoteDto['authorRole'] {
  if (ctx.actor.clinicianOf.includes(athleteId)) return 'clinician';
  if (ctx.actor.coachOf.includes(athleteId)) return 'coach';
  return 'athlete';
}

/** A note pinned to a time in a clip; the athlete is told in the app. */
export const addClipNote = orgCommand<{ clipId: string } & ClipNoteCreateInput, ClipNoteDto>({
  name: 'uploads.addClipNote',
  async run(ctx, { clipId, atMs, body }) {
    const { m, actor, userId } = ctx;
    const clip = await readableClip(m, ctx.ability, actor.organizationId, clipId);
    authorize(ctx.ability, 'create', 'ClipNote', {
      id: '',
      organizationId: clip.organizationId,
      athleteId: clip.athleteId,
      authorUserId: userId,
    });
    const authorName = await memberName(m, actor.membershipId, '');
    const saved = await m.save(
      m.create(ClipNote, {
        organizationId: clip.organizationId,
        athleteId: clip.athleteId,
        clipId: clip.id,
        atMs,
        body,
        authorUserId: userId,
        authorName,
        authorRole: noteRole(ctx, clip.athleteId),
      }),
    );
    // The note's text stays out of the trail; its place in the clip and length are enough.
    await ctx.audit({
      action: 'clip_note.added',
      subjectType: 'ClipNote',
      subjectId: saved.id,
      athleteId: clip.athleteId,
      after: { clipId: clip.id, atMs, length: body.length },
    });
    await notify(m, [clip.athleteId], {
      organizationId: clip.organizationId,
      athleteId: clip.athleteId,
      kind: 'clip_note',
      severity: 'routine',
      title: `${authorName} left a note on your clip of ${clip.exercise}`,
      body: body.slice(0, 300),
    });
    return toNoteDto(saved);
  },
});

/** Removes a note (its author). */
export const removeClipNote = orgCommand<{ clipId: string; noteId: string }, void>({
  name: 'uploads.removeClipNote',
  async run(ctx, { clipId, noteId }) {
    const { m, actor } = ctx;
    await readableClip(m, ctx.ability, actor.organizationId, clipId);
    const note = await m.findOne(ClipNote, { where: { id: noteId, clipId, organizationId: actor.organizationId } });
    authorize(ctx.ability, 'delete', 'ClipNote', note);
    await m.delete(ClipNote, { id: note.id });
    await ctx.audit({
      action: 'clip_note.removed',
      subjectType: 'ClipNote',
      subjectId: note.id,
      athleteId: note.athleteId,
      before: { clipId: note.clipId, atMs: note.atMs, length: note.body.length },
    });
  },
});
