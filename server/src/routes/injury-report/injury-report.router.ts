import { stringify } from 'csv-stringify/sync';
import { injuryReportCsvRecords } from '../../../../policies/load/injury-report';
import { NothingSchema, OrgItemParamsSchema, OrgParamsSchema } from '../../../../policies/schemas';
import { InjuryReportQuerySchema, TeamSessionHoursCreateSchema } from '../../../../policies/schemas/injury-report';
import { recordTeamSessionHours } from '../../commands/team-session-hours';
import { orgRoute, type RouteDef } from '../../http/route';
import { injuryReport, listTeamSessionHours } from '../../queries/injury-report';

/**
 * The injury report (IOC consensus, Bahr et al. 2020; policies/load/injury-report.ts) for admins and
 * clinicians — aggregates only, small cells suppressed — as JSON for the page and as CSV, and the team
 * session hours a group's coaches record as exposure.
 */
const readReport = { kind: 'org', action: 'read', subject: 'InjuryReport' } as const;

export const injuryReportRoutes: RouteDef[] = [
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/injury-report',
    summary: 'Time-loss injuries, days lost, exposure hours, incidence and burden per 1,000 h, small cells suppressed',
    access: readReport,
    params: OrgParamsSchema,
    query: InjuryReportQuerySchema,
    body: NothingSchema,
    async handler({ read, query }) {
      return read(injuryReport, query);
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/injury-report.csv',
    summary: 'The same injury report as CSV (the same cells, withheld numbers left empty)',
    access: readReport,
    params: OrgParamsSchema,
    query: InjuryReportQuerySchema,
    body: NothingSchema,
    async handler({ read, query, res }) {
      const report = await read(injuryReport, query);
      // Group names are typed by people: escape_formulas keeps a spreadsheet from running them (OWASP "CSV Injection").
      const csv = stringify(injuryReportCsvRecords(report), { escape_formulas: true, bom: true });
      res.setHeader('Content-Type', 'text/csv; charset=utf-8');
      res.setHeader('Content-Disposition', `attachment; filename="loadline-injury-report-${query.from}-to-${query.to}.csv"`);
      res.status(200).send(csv);
      return csv;
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/groups/:id/session-hours',
    summary: "A group's recorded practice and competition hours, newest first",
    access: { kind: 'org', action: 'read', subject: 'Group' },
    params: OrgItemParamsSchema,
    query: NothingSchema,
    body: NothingSchema,
    async handler({ read, params }) {
      return read(listTeamSessionHours, { groupId: params.id });
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/groups/:id/session-hours',
    summary: 'Record a practice or competition for a group in one step: date, minutes, kind, who was there',
    access: { kind: 'org', action: 'update', subject: 'Group' },
    command: recordTeamSessionHours,
    params: OrgItemParamsSchema,
    query: NothingSchema,
    body: TeamSessionHoursCreateSchema,
    status: 201,
    async handler({ run, params, body }) {
      return run(recordTeamSessionHours, { ...body, groupId: params.id });
    },
  }),
];
