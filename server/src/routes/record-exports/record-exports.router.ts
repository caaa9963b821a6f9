import { NothingSchema, OrgParamsSchema, RecordExportRequestSchema, RecordExportTokenSchema } from '../../../../policies/schemas';
import { downloadRecordExport, requestRecordExport } from '../../commands/record-exports';
import { streamStored } from '../../http/downloads';
import { orgRoute, type RouteDef } from '../../http/route';
import { recordExportLink, recordExports } from '../../queries/record-export';

/**
 * A person's whole record (the right of access): ask for it, follow its state, and download it from
 * the e-mailed link. The link's code travels in a POST body (never in a URL the server logs), and
 * only the person who asked may use it, signed in.
 */
export const recordExportRoutes: RouteDef[] = [
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/record-exports',
    summary: 'Whose whole record I may ask for (my own; a guardian’s minors) and the copies I asked for',
    access: { kind: 'org', action: 'read', subject: 'RecordExport' },
    params: OrgParamsSchema,
    query: NothingSchema,
    body: NothingSchema,
    async handler({ read }) {
      return read(recordExports, undefined);
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/record-exports',
    summary: 'Ask for a copy of a whole record: prepared in the background and e-mailed as a link (a few a day)',
    access: { kind: 'org', action: 'create', subject: 'RecordExport' },
    params: OrgParamsSchema,
    query: NothingSchema,
    body: RecordExportRequestSchema,
    status: 202,
    command: requestRecordExport,
    async handler({ run, body }) {
      return run(requestRecordExport, body);
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/record-exports/link',
    summary: 'What an e-mailed record link opens to (ready, expired or unknown), for the person who asked',
    access: { kind: 'org', action: 'read', subject: 'RecordExport' },
    params: OrgParamsSchema,
    query: NothingSchema,
    body: RecordExportTokenSchema,
    writesNothing: 'a lookup: the code travels in the body so that it never appears in a URL',
    async handler({ read, body }) {
      return read(recordExportLink, body);
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/record-exports/download',
    summary: 'Download a whole record (ZIP) with the e-mailed link’s code, as the person who asked (audited)',
    access: { kind: 'org', action: 'read', subject: 'RecordExport' },
    params: OrgParamsSchema,
    query: NothingSchema,
    body: RecordExportTokenSchema,
    command: downloadRecordExport,
    async handler({ deps, run, body, res }) {
      const file = await run(downloadRecordExport, body);
      await streamStored(deps.storage, res, file.storageKey, undefined, () => {
        res.setHeader('Content-Type', 'application/zip');
        res.setHeader('Content-Length', String(file.sizeBytes));
        res.setHeader('Content-Disposition', `attachment; filename="${file.filename}"`);
        res.setHeader('Cache-Control', 'no-store');
        res.status(200);
      });
      return undefined;
    },
  }),
];
