import rangeParser from 'range-parser';
import { z } from 'zod';
import {
  ClipFieldsSchema,
  ClipListQuerySchema,
  ClipNoteCreateSchema,
  NothingSchema,
  OrgItemParamsSchema,
  UuidSchema,
} from '../../../../policies/schemas';
import { addClipNote, deleteUpload, recordUpload, recordUploadRead, removeClipNote } from '../../commands/uploads';
import { AppError } from '../../core/errors';
import { streamStored } from '../../http/downloads';
import { orgRoute, type RouteDef } from '../../http/route';
import { clips, clipWithNotes, uploadFile, uploadTarget } from '../../queries/uploads';
import { clipRules, newStorageKey, removeStored, storeThenRecord } from '../../services/uploads';
import { receiveUpload } from '../../storage/receive';

const NoteParamsSchema = z.strictObject({ orgId: UuidSchema, id: UuidSchema, noteId: UuidSchema });

/** Technique clips: the upload-record module (commands/uploads.ts, queries/uploads.ts) with video served in ranges. */
export const clipRoutes: RouteDef[] = [
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/clips',
    summary: 'Technique clips I may watch, newest first (guardians only when the organization allows it)',
    access: { kind: 'org', action: 'read', subject: 'Clip' },
    params: z.strictObject({ orgId: UuidSchema }),
    body: NothingSchema,
    query: ClipListQuerySchema,
    handler: ({ read, query }) => read(clips, query),
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/clips',
    summary: 'Upload a technique clip (WebM, MP4 or MOV; type checked from its bytes) of a logged session',
    access: { kind: 'org', action: 'create', subject: 'Clip' },
    query: NothingSchema,
    body: NothingSchema,
    multipart: true,
    params: z.strictObject({ orgId: UuidSchema }),
    command: recordUpload,
    status: 201,
    async handler({ deps, actor, read, run, req }) {
      // Checked from the fields, before a byte of the video is kept.
      const received = await receiveUpload(req, ClipFieldsSchema, clipRules(deps.config), async (fields) => {
        await read(uploadTarget, { kind: 'clip', fields });
      });
      return storeThenRecord(deps.storage, deps.logger, newStorageKey(actor.organizationId, 'clips'), received, (storageKey) =>
        run(recordUpload, { kind: 'clip', fields: received.fields, file: received.file, storageKey }),
      );
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/clips/:id',
    summary: 'One clip with its notes, in time order',
    access: { kind: 'org', action: 'read', subject: 'Clip' },
    params: OrgItemParamsSchema,
    query: NothingSchema,
    body: NothingSchema,
    handler: ({ read, params }) => read(clipWithNotes, { id: params.id }),
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/clips/:id/video',
    summary: 'The video, with HTTP range requests so the player can seek',
    access: { kind: 'org', action: 'read', subject: 'Clip' },
    params: OrgItemParamsSchema,
    query: NothingSchema,
    body: NothingSchema,
    command: recordUploadRead,
    async handler({ deps, read, run, params, req, res }) {
      const clip = await read(uploadFile, { kind: 'clip', id: params.id });
      const size = clip.sizeBytes;
      const header = req.get('range');
      // A malformed or multi-part Range is ignored (RFC 9110 allows it): the whole file is sent.
      const parsed = header ? rangeParser(size, header, { combine: true }) : undefined;
      if (parsed === -1) {
        res.setHeader('Content-Range', `bytes */${size}`);
        throw new AppError('range_not_satisfiable', `The requested range is outside the video (${size} bytes).`);
      }
      const range = Array.isArray(parsed) && parsed.length === 1 && parsed.type === 'bytes' ? parsed[0] : undefined;
      // One entry per viewing, not one per seek: only a request from the start is audited.
      if (!range || range.start === 0) await run(recordUploadRead, { kind: 'clip', id: clip.id });
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
    query: NothingSchema,
    body: NothingSchema,
    command: deleteUpload,
    async handler({ deps, run, params }) {
      const { storageKey } = await run(deleteUpload, { kind: 'clip', id: params.id });
      await removeStored(deps.storage, deps.logger, storageKey);
      return undefined;
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/clips/:id/notes',
    summary: 'Pin a note to a time in a clip (a coach or clinician on the care team); the athlete is told in the app',
    access: { kind: 'org', action: 'create', subject: 'ClipNote' },
    params: OrgItemParamsSchema,
    query: NothingSchema,
    body: ClipNoteCreateSchema,
    command: addClipNote,
    status: 201,
    handler: ({ run, params, body }) => run(addClipNote, { clipId: params.id, ...body }),
  }),
  orgRoute({
    method: 'delete',
    path: '/orgs/:orgId/clips/:id/notes/:noteId',
    summary: "Remove a note from a clip (the note's author)",
    access: { kind: 'org', action: 'read', subject: 'ClipNote' },
    params: NoteParamsSchema,
    query: NothingSchema,
    body: NothingSchema,
    command: removeClipNote,
    async handler({ run, params }) {
      await run(removeClipNote, { clipId: params.id, noteId: params.noteId });
      return undefined;
    },
  }),
];
