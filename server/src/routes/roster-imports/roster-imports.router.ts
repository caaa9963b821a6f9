import { NothingSchema, OrgItemParamsSchema, OrgParamsSchema } from '../../../../policies/schemas';
import { ROSTER_MAX_BYTES, rosterTemplateCsv } from '../../../../policies/roster';
import { previewRosterImport, startRosterImport } from '../../commands/roster';
import { orgRoute, type RouteDef } from '../../http/route';
import { getLastRosterCheck, getRosterImport } from '../../queries/roster-imports';
import { runRosterImport } from '../../services/roster-import-job';
import { receiveTextFile } from '../../storage/receive-text';

/**
 * Bringing a roster from a CSV: the template, the upload that answers with a preview (writing only
 * the import's own row), the start of the background import, and its progress. Admins only: the
 * route needs the right to invite, which only admins hold (policies/access/invitation.ts).
 */
const access = { kind: 'org', action: 'create', subject: 'Invitation' } as const;

export const rosterImportRoutes: RouteDef[] = [
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/roster-imports/template.csv',
    summary: 'The roster template: the columns an upload takes, with one example row',
    access,
    params: OrgParamsSchema,
    query: NothingSchema,
    body: NothingSchema,
    async handler({ res }) {
      const body = rosterTemplateCsv();
      res.setHeader('Content-Type', 'text/csv; charset=utf-8');
      res.setHeader('Content-Disposition', 'attachment; filename="loadline-roster-template.csv"');
      res.status(200).send(body);
      return body;
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/roster-imports',
    summary:
      'Upload a roster CSV (at most 2 MB, 5,000 rows): answers each row with its problems and what importing it would do; writes no people',
    access,
    command: previewRosterImport,
    multipart: true,
    params: OrgParamsSchema,
    query: NothingSchema,
    body: NothingSchema,
    status: 201,
    async handler({ run, req }) {
      const file = await receiveTextFile(req, ROSTER_MAX_BYTES, 'roster files');
      return run(previewRosterImport, file);
    },
  }),
  // Before `/:id`, which would read "last-check" as an id.
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/roster-imports/last-check',
    summary: "The admin's last checked roster file not yet imported, planned again against the people here now (or none)",
    access,
    params: OrgParamsSchema,
    query: NothingSchema,
    body: NothingSchema,
    async handler({ read }) {
      return read(getLastRosterCheck, undefined);
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/roster-imports/:id',
    summary: "A roster import's progress and counts",
    access,
    params: OrgItemParamsSchema,
    query: NothingSchema,
    body: NothingSchema,
    async handler({ read, params }) {
      return read(getRosterImport, { id: params.id });
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/roster-imports/:id/start',
    summary: 'Import a previewed roster in the background (or resume one that stopped); poll the import for progress',
    access,
    command: startRosterImport,
    params: OrgItemParamsSchema,
    query: NothingSchema,
    body: NothingSchema,
    status: 202,
    async handler({ run, params, deps }) {
      const started = await run(startRosterImport, { id: params.id });
      // Without a job queue (no e-mail configured) the import runs in this process, after the answer.
      if (!deps.jobs) setImmediate(() => void runRosterImport(deps, params.id).catch((err) => deps.logger.warn({ err }, 'roster import')));
      return started;
    },
  }),
];
