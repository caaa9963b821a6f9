import { NothingSchema, ProgramItemParamsSchema } from '../../../../policies/schemas';
import { downloadFloorSheet } from '../../commands/floor-sheet';
import { sendPdf } from '../../http/downloads';
import { orgRoute, type RouteDef } from '../../http/route';

/**
 * The floor sheet of a team session (the page a coach tapes to the rack): each athlete's own sets, plates per
 * side and the fitted mark, as a PDF to print or a CSV. Read under the team program's rule
 * (services/team-access.ts): admins, the group's coaches, and clinicians of its athletes; anyone else gets
 * 404. Each download is audited (floor_sheet.downloaded) and never cached.
 */
const read = { kind: 'org', action: 'read', subject: 'Program' } as const;

export const floorSheetRoutes: RouteDef[] = [
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/team-sessions/:id/floor-sheet.pdf',
    summary: "The team session's floor sheet as a PDF: one row per athlete with their own loads and plates (audited, never cached)",
    access: read,
    command: downloadFloorSheet,
    params: ProgramItemParamsSchema,
    query: NothingSchema,
    body: NothingSchema,
    async handler({ run, params, res }) {
      const { body, filename } = await run(downloadFloorSheet, { id: params.id, format: 'pdf' });
      sendPdf(res, body as Buffer, filename);
      return body;
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/team-sessions/:id/floor-sheet.csv',
    summary: 'The same floor sheet as CSV, one record per athlete and exercise (audited, never cached)',
    access: read,
    command: downloadFloorSheet,
    params: ProgramItemParamsSchema,
    query: NothingSchema,
    body: NothingSchema,
    async handler({ run, params, res }) {
      const { body, filename } = await run(downloadFloorSheet, { id: params.id, format: 'csv' });
      res.setHeader('Content-Type', 'text/csv; charset=utf-8');
      res.setHeader('Content-Disposition', `attachment; filename="${filename}"`);
      res.setHeader('Cache-Control', 'no-store');
      res.status(200).send(body);
      return body;
    },
  }),
];
