import { DataSource, type EntityManager } from 'typeorm';
import type { AppAbility } from '../../../policies/access';
import type { CaseDocumentDto, ClipDto, ClipNoteDto } from '../../../policies/dto';
import type { ClipFieldsInput } from '../../../policies/schemas';
import { CaseDocument, CaseRecord, Clip, ClipNote, TrainingLog } from '../entities';
import { accessibleWhere } from '../core/accessible';
import { authorize } from '../core/authorize';
import { orgQuery } from '../core/command';
import { AppError } from '../core/errors';
import type { ActorWithOrg } from '../services/actor';
import { requireMemberWithRole } from '../services/org-members';
import { EXTENSIONS, slug } from '../services/uploads';

/**
 * Upload records: technique clips and outside documents on a case. Both live the same life — checked
 * before a byte is kept, stored then recorded, listed and opened through the access rules, audited
 * when opened, deleted row first then file — so both go through this module and commands/uploads.ts,
 * and a fix to one reaches the other. Only who may see them and what describes them differ.
 */
export type UploadKind = 'clip' | 'document';

type Db = DataSource | EntityManager;

/** A stored file as the routes that serve or remove it need it. */
export interface StoredUpload {
  kind: UploadKind;
  id: string;
  organizationId: string;
  athleteId: string;
  storageKey: string;
  mediaType: string;
  sizeBytes: number;
  /** The server-made download name (never the uploader's file name). */
  filename: string;
}

/** Where an upload goes, checked before its bytes are kept and again when its row is written. */
export type UploadTargetInput = { kind: 'clip'; fields: ClipFieldsInput } | { kind: 'document'; caseId: string };
export type UploadTarget =
  { kind: 'clip'; athleteId: string; trainingLogId: string; exercise: string } | { kind: 'document'; athleteId: string; caseId: string };

interface Reader {
  ability: AppAbility;
  actor: ActorWithOrg;
  userId: string;
}

const managerOf = (db: Db): EntityManager => (db instanceof DataSource ? db.manager : db);

/**
 * May this reader add this upload, and where does it go? A clip belongs to a logged session of the
 * athlete and one exercise in it (as the athlete spelled it); a document to a case the reader can
 * read. Anything the reader may not see answers 404, like any hidden record.
 */
export async function resolveUploadTarget(db: Db, reader: Reader, input: UploadTargetInput): Promise<UploadTarget> {
  const org = reader.actor.organizationId;
  if (input.kind === 'document') {
    const c = await db.getRepository(CaseRecord).findOne({ where: { id: input.caseId, organizationId: org } });
    authorize(reader.ability, 'read', 'Case', c);
    authorize(reader.ability, 'create', 'CaseDocument', {
      id: '',
      organizationId: c.organizationId,
      athleteId: c.athleteId,
      uploadedByUserId: reader.userId,
    });
    return { kind: 'document', athleteId: c.athleteId, caseId: c.id };
  }
  const { athleteId, trainingLogId } = input.fields;
  authorize(reader.ability, 'create', 'Clip', { id: '', organizationId: org, athleteId, uploadedByUserId: reader.userId });
  await requireMemberWithRole(managerOf(db), org, athleteId, 'athlete', 'athleteId');
  const log = await db.getRepository(TrainingLog).findOne({ where: { id: trainingLogId, organizationId: org, athleteId } });
  if (!log) {
    throw new AppError('validation_failed', "Please check the form: trainingLogId must be one of this athlete's logged sessions.", {
      trainingLogId: ["must be one of this athlete's logged sessions"],
    });
  }
  const wanted = input.fields.exercise.trim().toLowerCase();
  const match = log.sets.find((s) => s.exercise.trim().toLowerCase() === wanted);
  if (!match) {
    throw new AppError('validation_failed', 'Please check the form: exercise must be one of the exercises logged in that session.', {
      exercise: ['must be one of the exercises logged in that session'],
    });
  }
  return { kind: 'clip', athleteId, trainingLogId, exercise: match.exercise };
}

export const uploadTarget = orgQuery<UploadTargetInput, UploadTarget>({
  name: 'uploads.target',
  run: (ctx, input) => resolveUploadTarget(ctx.db, ctx, input),
});

export const documentFilename = (d: Pick<CaseDocument, 'title' | 'documentDate' | 'mediaType'>) =>
  `${slug(d.title)}-${d.documentDate}.${EXTENSIONS[d.mediaType] ?? 'bin'}`;

/** The record, if the reader may open it (404 otherwise, its existence not revealed). */
export async function readableClip(db: Db, ability: AppAbility, organizationId: string, id: string): Promise<Clip> {
  const clip = await db.getRepository(Clip).findOne({ where: { id, organizationId } });
  authorize(ability, 'read', 'Clip', clip);
  return clip;
}

export async function readableDocument(db: Db, ability: AppAbility, organizationId: string, id: string): Promise<CaseDocument> {
  const d = await db.getRepository(CaseDocument).findOne({ where: { id, organizationId } });
  authorize(ability, 'read', 'CaseDocument', d);
  return d;
}

export async function readableUpload(db: Db, ability: AppAbility, organizationId: string, kind: UploadKind, id: string) {
  const record =
    kind === 'clip' ? await readableClip(db, ability, organizationId, id) : await readableDocument(db, ability, organizationId, id);
  const stored: StoredUpload = {
    kind,
    id: record.id,
    organizationId: record.organizationId,
    athleteId: record.athleteId,
    storageKey: record.storageKey,
    mediaType: record.mediaType,
    sizeBytes: Number(record.sizeBytes),
    filename: record instanceof CaseDocument ? documentFilename(record) : `clip.${EXTENSIONS[record.mediaType] ?? 'bin'}`,
  };
  return { record, stored };
}

/** Download authorization: the stored file of a record the reader may open. */
export const uploadFile = orgQuery<{ kind: UploadKind; id: string }, StoredUpload>({
  name: 'uploads.file',
  run: async (ctx, { kind, id }) => (await readableUpload(ctx.db, ctx.ability, ctx.actor.organizationId, kind, id)).stored,
});

export function toDocumentDto(d: CaseDocument): CaseDocumentDto {
  return {
    id: d.id,
    caseId: d.caseId,
    athleteId: d.athleteId,
    title: d.title,
    documentDate: d.documentDate,
    issuedBy: d.issuedBy,
    mediaType: d.mediaType,
    sizeBytes: Number(d.sizeBytes),
    sha256: d.sha256,
    uploadedByName: d.uploadedByName,
    uploadedByUserId: d.uploadedByUserId,
    uploadedAt: d.createdAt.toISOString(),
    downloadPath: `/api/orgs/${d.organizationId}/documents/${d.id}/file`,
  };
}

/**
 * A case's outside documents. Route-level access is "may read cases"; then a coach or guardian (who
 * may read the case but never its documents) gets 404 for the whole list, and the list itself is
 * filtered by the same rules in SQL.
 */
export const caseDocuments = orgQuery<{ caseId: string }, CaseDocumentDto[]>({
  name: 'uploads.caseDocuments',
  async run({ db, ability, actor }, { caseId }) {
    const c = await db.getRepository(CaseRecord).findOne({ where: { id: caseId, organizationId: actor.organizationId } });
    authorize(ability, 'read', 'Case', c);
    // A probe record: may this reader read documents of this athlete at all?
    authorize(ability, 'read', 'CaseDocument', { id: '', organizationId: c.organizationId, athleteId: c.athleteId, uploadedByUserId: '' });
    const acl = accessibleWhere(ability, 'read', 'CaseDocument', {
      id: 'd.id',
      organizationId: 'd.organization_id',
      athleteId: 'd.athlete_id',
      uploadedByUserId: 'd.uploaded_by_user_id',
    });
    const rows = await db
      .getRepository(CaseDocument)
      .createQueryBuilder('d')
      .where('d.organization_id = :org AND d.case_id = :case', { org: actor.organizationId, case: c.id })
      .andWhere(acl.sql, acl.params)
      .orderBy('d.document_date', 'DESC')
      .addOrderBy('d.created_at', 'DESC')
      .getMany();
    return rows.map(toDocumentDto);
  },
});

interface ClipRow {
  id: string;
  organization_id: string;
  athlete_id: string;
  athlete_name: string;
  training_log_id: string;
  session_date: string;
  exercise: string;
  caption: string | null;
  media_type: string;
  size_bytes: string;
  uploaded_by_name: string;
  uploaded_by_user_id: string;
  created_at: Date;
  note_count: number;
}

function toClipDto(r: ClipRow): ClipDto {
  return {
    id: r.id,
    athleteId: r.athlete_id,
    athleteName: r.athlete_name,
    trainingLogId: r.training_log_id,
    sessionDate: r.session_date,
    exercise: r.exercise,
    caption: r.caption,
    mediaType: r.media_type,
    sizeBytes: Number(r.size_bytes),
    uploadedByName: r.uploaded_by_name,
    uploadedByUserId: r.uploaded_by_user_id,
    uploadedAt: new Date(r.created_at).toISOString(),
    videoPath: `/api/orgs/${r.organization_id}/clips/${r.id}/video`,
    noteCount: Number(r.note_count),
  };
}

export function toNoteDto(n: ClipNote): ClipNoteDto {
  return {
    id: n.id,
    clipId: n.clipId,
    atMs: n.atMs,
    body: n.body,
    authorName: n.authorName,
    authorUserId: n.authorUserId,
    authorRole: n.authorRole,
    createdAt: n.createdAt.toISOString(),
  };
}

export interface ClipFilter {
  athleteId?: string;
  trainingLogId?: string;
  id?: string;
}

/** Clips the reader may watch, newest first, with what the list shows (athlete, session date, note count). */
export async function clipsFor(db: Db, ability: AppAbility, organizationId: string, filter: ClipFilter): Promise<ClipDto[]> {
  const acl = accessibleWhere(ability, 'read', 'Clip', {
    id: 'c.id',
    organizationId: 'c.organization_id',
    athleteId: 'c.athlete_id',
    uploadedByUserId: 'c.uploaded_by_user_id',
  });
  const qb = db
    .createQueryBuilder()
    .select([
      'c.id AS id',
      'c.organization_id AS organization_id',
      'c.athlete_id AS athlete_id',
      'u.display_name AS athlete_name',
      'c.training_log_id AS training_log_id',
      'l.date AS session_date',
      'c.exercise AS exercise',
      'c.caption AS caption',
      'c.media_type AS media_type',
      'c.size_bytes AS size_bytes',
      'c.uploaded_by_name AS uploaded_by_name',
      'c.uploaded_by_user_id AS uploaded_by_user_id',
      'c.created_at AS created_at',
      '(SELECT count(*)::int FROM clip_notes n WHERE n.clip_id = c.id) AS note_count',
    ])
    .from(Clip, 'c')
    .innerJoin(TrainingLog, 'l', 'l.id = c.training_log_id')
    .innerJoin('memberships', 'm', 'm.id = c.athlete_id')
    .innerJoin('users', 'u', 'u.id = m.user_id')
    .where('c.organization_id = :org', { org: organizationId })
    .andWhere(acl.sql, acl.params);
  if (filter.athleteId) qb.andWhere('c.athlete_id = :athlete', { athlete: filter.athleteId });
  if (filter.trainingLogId) qb.andWhere('c.training_log_id = :log', { log: filter.trainingLogId });
  if (filter.id) qb.andWhere('c.id = :id', { id: filter.id });
  const rows: ClipRow[] = await qb.orderBy('c.created_at', 'DESC').limit(500).getRawMany();
  return rows.map(toClipDto);
}

export const clips = orgQuery<Omit<ClipFilter, 'id'>, ClipDto[]>({
  name: 'uploads.clips',
  run: ({ db, ability, actor }, filter) => clipsFor(db, ability, actor.organizationId, filter),
});

/** One clip with the notes its reader may see, in time order. */
export const clipWithNotes = orgQuery<{ id: string }, ClipDto>({
  name: 'uploads.clipWithNotes',
  async run({ db, ability, actor }, { id }) {
    await readableClip(db, ability, actor.organizationId, id);
    const [dto] = await clipsFor(db, ability, actor.organizationId, { id });
    if (!dto) throw new AppError('not_found', 'That clip was not found.');
    const acl = accessibleWhere(ability, 'read', 'ClipNote', {
      id: 'n.id',
      organizationId: 'n.organization_id',
      athleteId: 'n.athlete_id',
      authorUserId: 'n.author_user_id',
    });
    const notes = await db
      .getRepository(ClipNote)
      .createQueryBuilder('n')
      .where('n.clip_id = :clip', { clip: id })
      .andWhere(acl.sql, acl.params)
      .orderBy('n.at_ms', 'ASC')
      .addOrderBy('n.created_at', 'ASC')
      .getMany();
    return { ...dto, notes: notes.map(toNoteDto) };
  },
});
