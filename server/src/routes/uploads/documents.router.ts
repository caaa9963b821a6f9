import { CaseDocumentFieldsSchema, NothingSchema, OrgItemParamsSchema } from '../../../../policies/schemas';
import { deleteUpload, recordUpload, recordUploadRead } from '../../commands/uploads';
import { streamStored } from '../../http/downloads';
import { orgRoute, type RouteDef } from '../../http/route';
import { caseDocuments, uploadFile, uploadTarget } from '../../queries/uploads';
import { documentRules, newStorageKey, removeStored, storeThenRecord } from '../../services/uploads';
import { receiveUpload } from '../../storage/receive';

/**
 * Outside documents on a case: the upload-record module (commands/uploads.ts, queries/uploads.ts).
 * Route-level access is "may read cases"; the object checks then decide, so a coach or guardian (who
 * may read the case but never its documents) gets 404.
 */
export const documentRoutes: RouteDef[] = [
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/cases/:id/documents',
    summary: "A case's outside documents (clinicians on the care team and the athlete only)",
    access: { kind: 'org', action: 'read', subject: 'Case' },
    params: OrgItemParamsSchema,
    query: NothingSchema,
    body: NothingSchema,
    handler: ({ read, params }) => read(caseDocuments, { caseId: params.id }),
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/cases/:id/documents',
    summary: 'Attach an outside document (PDF, JPEG, PNG or HEIC; type checked from its bytes) to a case',
    access: { kind: 'org', action: 'read', subject: 'Case' },
    query: NothingSchema,
    body: NothingSchema,
    multipart: true,
    params: OrgItemParamsSchema,
    command: recordUpload,
    status: 201,
    async handler({ deps, actor, read, run, params, req }) {
      // Checked before the upload is read at all.
      await read(uploadTarget, { kind: 'document', caseId: params.id });
      const received = await receiveUpload(req, CaseDocumentFieldsSchema, documentRules(deps.config));
      return storeThenRecord(deps.storage, deps.logger, newStorageKey(actor.organizationId, 'documents'), received, (storageKey) =>
        run(recordUpload, { kind: 'document', caseId: params.id, fields: received.fields, file: received.file, storageKey }),
      );
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/documents/:id/file',
    summary: 'Download an outside document (attachment, never cached); every download is audited',
    access: { kind: 'org', action: 'read', subject: 'Case' },
    params: OrgItemParamsSchema,
    query: NothingSchema,
    body: NothingSchema,
    command: recordUploadRead,
    async handler({ deps, read, run, params, res }) {
      const d = await read(uploadFile, { kind: 'document', id: params.id });
      await run(recordUploadRead, { kind: 'document', id: d.id });
      await streamStored(deps.storage, res, d.storageKey, undefined, () => {
        res.setHeader('Content-Type', d.mediaType);
        res.setHeader('Content-Length', String(d.sizeBytes));
        res.setHeader('Content-Disposition', `attachment; filename="${d.filename}"`);
        res.setHeader('Cache-Control', 'no-store');
        res.status(200);
      });
      return undefined;
    },
  }),
  orgRoute({
    method: 'delete',
    path: '/orgs/:orgId/documents/:id',
    summary: 'Remove an outside document (its uploader, or a clinician on the care team)',
    access: { kind: 'org', action: 'read', subject: 'Case' },
    params: OrgItemParamsSchema,
    query: NothingSchema,
    body: NothingSchema,
    command: deleteUpload,
    async handler({ deps, run, params }) {
      const { storageKey } = await run(deleteUpload, { kind: 'document', id: params.id });
      await removeStored(deps.storage, deps.logger, storageKey);
      return undefined;
    },
  }),
];
