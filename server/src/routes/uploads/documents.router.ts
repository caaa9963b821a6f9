import type { DataSource } from 'typeorm';
import type { CaseDocumentDto } from '../../../../policies/dto';
import { CaseDocumentFieldsSchema, OrgItemParamsSchema } from '../../../../policies/schemas';
import type { AppAbility } from '../../../../policies/access';
import { CaseDocument, CaseRecord } from '../../entities';
import { accessibleWhere } from '../../core/accessible';
import { authorize } from '../../core/authorize';
import { orgRoute, type RouteDef } from '../../http/route';
import { receiveUpload } from '../../storage/receive';
import { documentRules, EXTENSIONS, newStorageKey, removeStored, slug, storeThenRecord, streamStored } from '../../services/uploads';

function toDto(d: CaseDocument): CaseDocumentDto {
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

/** The case, if the caller may read it at all (404 otherwise, as for any record). */
async function readableCase(ds: DataSource, ability: AppAbility, organizationId: string, id: string): Promise<CaseRecord> {
  const c = await ds.getRepository(CaseRecord).findOne({ where: { id, organizationId } });
  authorize(ability, 'read', 'Case', c);
  return c;
}

async function readableDocument(ds: DataSource, ability: AppAbility, organizationId: string, id: string): Promise<CaseDocument> {
  const d = await ds.getRepository(CaseDocument).findOne({ where: { id, organizationId } });
  authorize(ability, 'read', 'CaseDocument', d);
  return d;
}

/**
 * Outside documents on a case. Route-level access is "may read cases"; the object checks then
 * decide, so a coach or guardian (who may read the case but never its documents) gets 404.
 */
export const documentRoutes: RouteDef[] = [
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/cases/:id/documents',
    summary: "A case's outside documents (clinicians on the care team and the athlete only)",
    access: { kind: 'org', action: 'read', subject: 'Case' },
    params: OrgItemParamsSchema,
    async handler({ ds, ability, actor, params }) {
      const c = await readableCase(ds, ability, actor.organizationId, params.id);
      // A probe record: may this caller read documents of this athlete at all?
      authorize(ability, 'read', 'CaseDocument', {
        id: '',
        organizationId: c.organizationId,
        athleteId: c.athleteId,
        uploadedByUserId: '',
      });
      const acl = accessibleWhere(ability, 'read', 'CaseDocument', {
        id: 'd.id',
        organizationId: 'd.organization_id',
        athleteId: 'd.athlete_id',
        uploadedByUserId: 'd.uploaded_by_user_id',
      });
      const rows = await ds
        .getRepository(CaseDocument)
        .createQueryBuilder('d')
        .where('d.organization_id = :org AND d.case_id = :case', { org: actor.organizationId, case: c.id })
        .andWhere(acl.sql, acl.params)
        .orderBy('d.document_date', 'DESC')
        .addOrderBy('d.created_at', 'DESC')
        .getMany();
      return rows.map(toDto);
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/cases/:id/documents',
    summary: 'Attach an outside document (PDF, JPEG, PNG or HEIC; type checked from its bytes) to a case',
    access: { kind: 'org', action: 'read', subject: 'Case' },
    params: OrgItemParamsSchema,
    status: 201,
    async handler({ ds, deps, ability, actor, user, params, req, tx }) {
      const c = await readableCase(ds, ability, actor.organizationId, params.id);
      authorize(ability, 'create', 'CaseDocument', {
        id: '',
        organizationId: c.organizationId,
        athleteId: c.athleteId,
        uploadedByUserId: user.id,
      });
      const received = await receiveUpload(req, CaseDocumentFieldsSchema, documentRules(deps.config));
      const key = newStorageKey(actor.organizationId, 'documents');
      const saved = await storeThenRecord(deps.storage, deps.logger, key, received, () =>
        tx(async (m, audit) => {
          const { fields, file } = received;
          const doc = await m.save(
            m.create(CaseDocument, {
              organizationId: c.organizationId,
              athleteId: c.athleteId,
              caseId: c.id,
              title: fields.title,
              documentDate: fields.documentDate,
              issuedBy: fields.issuedBy,
              mediaType: file.mediaType,
              sizeBytes: String(file.size),
              sha256: file.sha256,
              storageKey: key,
              uploadedByUserId: user.id,
              uploadedByName: user.displayName,
            }),
          );
          await audit({
            action: 'case_document.uploaded',
            subjectType: 'CaseDocument',
            subjectId: doc.id,
            athleteId: c.athleteId,
            after: {
              caseId: c.id,
              title: fields.title,
              documentDate: fields.documentDate,
              issuedBy: fields.issuedBy,
              mediaType: file.mediaType,
              sizeBytes: file.size,
              sha256: file.sha256,
            },
          });
          return doc;
        }),
      );
      return toDto(saved);
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/documents/:id/file',
    summary: 'Download an outside document (attachment, never cached); every download is audited',
    access: { kind: 'org', action: 'read', subject: 'Case' },
    params: OrgItemParamsSchema,
    async handler({ ds, deps, ability, actor, params, res, tx }) {
      const d = await readableDocument(ds, ability, actor.organizationId, params.id);
      await tx((_m, audit) =>
        audit({ action: 'case_document.downloaded', subjectType: 'CaseDocument', subjectId: d.id, athleteId: d.athleteId }),
      );
      const filename = `${slug(d.title)}-${d.documentDate}.${EXTENSIONS[d.mediaType] ?? 'bin'}`;
      await streamStored(deps.storage, res, d.storageKey, undefined, () => {
        res.setHeader('Content-Type', d.mediaType);
        res.setHeader('Content-Length', String(d.sizeBytes));
        res.setHeader('Content-Disposition', `attachment; filename="${filename}"`);
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
    async handler({ ds, deps, ability, actor, params, tx }) {
      const d = await readableDocument(ds, ability, actor.organizationId, params.id);
      authorize(ability, 'delete', 'CaseDocument', d);
      await tx(async (m, audit) => {
        await m.delete(CaseDocument, { id: d.id });
        await audit({
          action: 'case_document.deleted',
          subjectType: 'CaseDocument',
          subjectId: d.id,
          athleteId: d.athleteId,
          before: {
            caseId: d.caseId,
            title: d.title,
            documentDate: d.documentDate,
            issuedBy: d.issuedBy,
            mediaType: d.mediaType,
            sizeBytes: Number(d.sizeBytes),
            sha256: d.sha256,
          },
        });
      });
      await removeStored(deps.storage, deps.logger, d.storageKey);
      return undefined;
    },
  }),
];
