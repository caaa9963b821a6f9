import type { DataSource, EntityManager } from 'typeorm';
import rangeParser from 'range-parser';
import { z } from 'zod';
import type { ClipDto, ClipNoteDto } from '../../../../policies/dto';
import type { AppAbility } from '../../../../policies/access';
import { ClipFieldsSchema, ClipListQuerySchema, ClipNoteCreateSchema, OrgItemParamsSchema, UuidSchema } from '../../../../policies/schemas';
import { Clip, ClipNote, TrainingLog } from '../../entities';
import { accessibleWhere } from '../../core/accessible';
import { authorize } from '../../core/authorize';
import { AppError } from '../../core/errors';
import { orgRoute, type RouteDef } from '../../http/route';
import type { ActorWithOrg } from '../../services/actor';
import { notify } from '../../services/notify';
import { requireMemberWithRole } from '../../services/org-members';
import { clipRules, newStorageKey, removeStored, storeThenRecord, streamStored } from '../../services/uploads';
import { receiveUpload } from '../../storage/receive';

const NoteParamsSchema = z.strictObject({ orgId: UuidSchema, id: UuidSchema, noteId: UuidSchema });

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

function toNoteDto(n: ClipNote): ClipNoteDto {
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

const CLIP_COLUMNS = {
  id: 'c.id',
  organizationId: 'c.organization_id',
  athleteId: 'c.athlete_id',
  uploadedByUserId: 'c.uploaded_by_user_id',
};

/** Clips the caller may watch, newest first, with what the list shows (athlete, session date, note count). */
async function listClips(
  ds: DataSource | EntityManager,
  ability: AppAbility,
  organizationId: string,
  filter: { athleteId?: string; trainingLogId?: string; id?: string },
) {
  const acl = accessibleWhere(ability, 'read', 'Clip', CLIP_COLUMNS);
  const qb = ds
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

async function readableClip(db: DataSource | EntityManager, ability: AppAbility, organizationId: string, id: string): Promise<Clip> {
  const clip = await db.getRepository(Clip).findOne({ where: { id, organizationId } });
  authorize(ability, 'read', 'Clip', clip);
  return clip;
}

/** The logged session must be this athlete's, and the exercise one of its sets (as the athlete spelled it). */
async function loggedExercise(
  m: EntityManager,
  organizationId: string,
  athleteId: string,
  trainingLogId: string,
  exercise: string,
): Promise<string> {
  const log = await m.findOne(TrainingLog, { where: { id: trainingLogId, organizationId, athleteId } });
  if (!log) {
    throw new AppError('validation_failed', "Please check the form: trainingLogId must be one of this athlete's logged sessions.", {
      trainingLogId: ["must be one of this athlete's logged sessions"],
    });
  }
  const wanted = exercise.trim().toLowerCase();
  const match = log.sets.find((s) => s.exercise.trim().toLowerCase() === wanted);
  if (!match) {
    throw new AppError('validation_failed', 'Please check the form: exercise must be one of the exercises logged in that session.', {
      exercise: ['must be one of the exercises logged in that session'],
    });
  }
  return match.exercise;
}

function noteRole(actor: ActorWithOrg, athleteId: string): ClipNoteDto['authorRole'] {
  if (actor.clinicianOf.includes(athleteId)) return 'clinician';
  if (actor.coachOf.includes(athleteId)) return 'coach';
  return 'athlete';
}

export const clipRoutes: RouteDef[] = [
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/clips',
    summary: 'Technique clips I may watch, newest first (guardians only when the organization allows it)',
    access: { kind: 'org', action: 'read', subject: 'Clip' },
    params: z.strictObject({ orgId: UuidSchema }),
    query: ClipListQuerySchema,
    async handler({ ds, ability, actor, query }) {
      return listClips(ds, ability, actor.organizationId, query);
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/clips',
    summary: 'Upload a technique clip (WebM, MP4 or MOV; type checked from its bytes) of a logged session',
    access: { kind: 'org', action: 'create', subject: 'Clip' },
    params: z.strictObject({ orgId: UuidSchema }),
    status: 201,
    async handler({ ds, deps, ability, actor, user, req, tx }) {
      const org = actor.organizationId;
      let exercise = '';
      // Checked from the fields, before a byte of the video is kept.
      const received = await receiveUpload(req, ClipFieldsSchema, clipRules(deps.config), async (fields) => {
        authorize(ability, 'create', 'Clip', { id: '', organizationId: org, athleteId: fields.athleteId, uploadedByUserId: user.id });
        await requireMemberWithRole(ds.manager, org, fields.athleteId, 'athlete', 'athleteId');
        exercise = await loggedExercise(ds.manager, org, fields.athleteId, fields.trainingLogId, fields.exercise);
      });
      const key = newStorageKey(org, 'clips');
      const id = await storeThenRecord(deps.storage, deps.logger, key, received, () =>
        tx(async (m, audit) => {
          const { fields, file } = received;
          const clip = await m.save(
            m.create(Clip, {
              organizationId: org,
              athleteId: fields.athleteId,
              trainingLogId: fields.trainingLogId,
              exercise,
              caption: fields.caption ?? null,
              mediaType: file.mediaType,
              sizeBytes: String(file.size),
              sha256: file.sha256,
              storageKey: key,
              uploadedByUserId: user.id,
              uploadedByName: user.displayName,
            }),
          );
          await audit({
            action: 'clip.uploaded',
            subjectType: 'Clip',
            subjectId: clip.id,
            athleteId: fields.athleteId,
            after: { trainingLogId: fields.trainingLogId, exercise, mediaType: file.mediaType, sizeBytes: file.size, sha256: file.sha256 },
          });
          return clip.id;
        }),
      );
      return (await listClips(ds, ability, org, { id }))[0];
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/clips/:id',
    summary: 'One clip with its notes, in time order',
    access: { kind: 'org', action: 'read', subject: 'Clip' },
    params: OrgItemParamsSchema,
    async handler({ ds, ability, actor, params }) {
      await readableClip(ds, ability, actor.organizationId, params.id);
      const [dto] = await listClips(ds, ability, actor.organizationId, { id: params.id });
      if (!dto) throw new AppError('not_found', 'That clip was not found.');
      const acl = accessibleWhere(ability, 'read', 'ClipNote', {
        id: 'n.id',
        organizationId: 'n.organization_id',
        athleteId: 'n.athlete_id',
        authorUserId: 'n.author_user_id',
      });
      const notes = await ds
        .getRepository(ClipNote)
        .createQueryBuilder('n')
        .where('n.clip_id = :clip', { clip: params.id })
        .andWhere(acl.sql, acl.params)
        .orderBy('n.at_ms', 'ASC')
        .addOrderBy('n.created_at', 'ASC')
        .getMany();
      return { ...dto, notes: notes.map(toNoteDto) } satisfies ClipDto;
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/clips/:id/video',
    summary: 'The video, with HTTP range requests so the player can seek',
    access: { kind: 'org', action: 'read', subject: 'Clip' },
    params: OrgItemParamsSchema,
    async handler({ ds, deps, ability, actor, params, req, res, tx }) {
      const clip = await readableClip(ds, ability, actor.organizationId, params.id);
      const size = Number(clip.sizeBytes);
      const header = req.get('range');
      // A malformed or multi-part Range is ignored (RFC 9110 allows it): the whole file is sent.
      const parsed = header ? rangeParser(size, header, { combine: true }) : undefined;
      if (parsed === -1) {
        res.setHeader('Content-Range', `bytes */${size}`);
        throw new AppError('range_not_satisfiable', `The requested range is outside the video (${size} bytes).`);
      }
      const range = Array.isArray(parsed) && parsed.length === 1 && parsed.type === 'bytes' ? parsed[0] : undefined;
      // One entry per viewing, not one per seek: only a request from the start is audited.
      if (!range || range.start === 0) {
        await tx((_m, audit) => audit({ action: 'clip.viewed', subjectType: 'Clip', subjectId: clip.id, athleteId: clip.athleteId }));
      }
      const headers = () => {
        res.setHeader('Accept-Ranges', 'bytes');
        res.setHeader('Content-Type', clip.mediaType);
        if (range) {
          res.status(206);
          res.setHeader('Content-Range', `bytes ${range.start}-${range.end}/${size}`);
          res.setHeader('Content-Length', String(range.end - range.start + 1));
        } else {
          res.status(200);
          res.setHeader('Content-Length', String(size));
        }
      };
      if (req.method === 'HEAD') {
        headers();
        res.end();
        return undefined;
      }
      await streamStored(deps.storage, res, clip.storageKey, range, headers);
      return undefined;
    },
  }),
  orgRoute({
    method: 'delete',
    path: '/orgs/:orgId/clips/:id',
    summary: 'Remove a clip and its notes (its uploader or the athlete)',
    access: { kind: 'org', action: 'read', subject: 'Clip' },
    params: OrgItemParamsSchema,
    async handler({ ds, deps, ability, actor, params, tx }) {
      const clip = await readableClip(ds, ability, actor.organizationId, params.id);
      authorize(ability, 'delete', 'Clip', clip);
      await tx(async (m, audit) => {
        const notes = await m.count(ClipNote, { where: { clipId: clip.id } });
        await m.delete(Clip, { id: clip.id });
        await audit({
          action: 'clip.deleted',
          subjectType: 'Clip',
          subjectId: clip.id,
          athleteId: clip.athleteId,
          before: {
            trainingLogId: clip.trainingLogId,
            exercise: clip.exercise,
            mediaType: clip.mediaType,
            sizeBytes: Number(clip.sizeBytes),
            sha256: clip.sha256,
            notes,
          },
        });
      });
      await removeStored(deps.storage, deps.logger, clip.storageKey);
      return undefined;
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/clips/:id/notes',
    summary: 'Pin a note to a time in a clip (a coach or clinician on the care team); the athlete is told in the app',
    access: { kind: 'org', action: 'create', subject: 'ClipNote' },
    params: OrgItemParamsSchema,
    body: ClipNoteCreateSchema,
    status: 201,
    async handler({ ds, ability, actor, user, params, body, tx }) {
      const clip = await readableClip(ds, ability, actor.organizationId, params.id);
      authorize(ability, 'create', 'ClipNote', {
        id: '',
        organizationId: clip.organizationId,
        athleteId: clip.athleteId,
        authorUserId: user.id,
      });
      const note = await tx(async (m, audit) => {
        const saved = await m.save(
          m.create(ClipNote, {
            organizationId: clip.organizationId,
            athleteId: clip.athleteId,
            clipId: clip.id,
            atMs: body.atMs,
            body: body.body,
            authorUserId: user.id,
            authorName: user.displayName,
            authorRole: noteRole(actor, clip.athleteId),
          }),
        );
        // The note's text stays out of the trail; its place in the clip and length are enough.
        await audit({
          action: 'clip_note.added',
          subjectType: 'ClipNote',
          subjectId: saved.id,
          athleteId: clip.athleteId,
          after: { clipId: clip.id, atMs: body.atMs, length: body.body.length },
        });
        await notify(m, [clip.athleteId], {
          organizationId: clip.organizationId,
          athleteId: clip.athleteId,
          kind: 'clip_note',
          severity: 'routine',
          title: `${user.displayName} left a note on your clip of ${clip.exercise}`,
          body: body.body.slice(0, 300),
        });
        return saved;
      });
      return toNoteDto(note);
    },
  }),
  orgRoute({
    method: 'delete',
    path: '/orgs/:orgId/clips/:id/notes/:noteId',
    summary: "Remove a note from a clip (the note's author)",
    access: { kind: 'org', action: 'read', subject: 'ClipNote' },
    params: NoteParamsSchema,
    async handler({ ds, ability, actor, params, tx }) {
      await readableClip(ds, ability, actor.organizationId, params.id);
      const note = await ds
        .getRepository(ClipNote)
        .findOne({ where: { id: params.noteId, clipId: params.id, organizationId: actor.organizationId } });
      authorize(ability, 'delete', 'ClipNote', note);
      await tx(async (m, audit) => {
        await m.delete(ClipNote, { id: note.id });
        await audit({
          action: 'clip_note.removed',
          subjectType: 'ClipNote',
          subjectId: note.id,
          athleteId: note.athleteId,
          before: { clipId: note.clipId, atMs: note.atMs, length: note.body.length },
        });
      });
      return undefined;
    },
  }),
];
