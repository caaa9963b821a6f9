import { z } from 'zod';
import type { PainReportDto, PainReportOutcomeDto } from '../../../../policies/dto';
import { OrgParamsSchema, PainReportCreateSchema, UuidSchema } from '../../../../policies/schemas';
import { todayIso } from '../../../../policies/roles';
import type { AppAbility } from '../../../../policies/access';
import { Organization } from '../../entities';
import { authorize } from '../../core/authorize';
import { accessibleWhere } from '../../core/accessible';
import { orgRoute, type RouteDef } from '../../http/route';
import { pickPermitted } from '../../services/fields';
import { createPainReport } from '../../services/pain-reports';
import { requireMemberWithRole } from '../../services/org-members';
import type { DataSource } from 'typeorm';

const MESSAGES = {
  emergency: (num: string) =>
    `Stop training now and get urgent medical care: call ${num} or go to an emergency department. Your answers can be a sign of a serious problem that needs a doctor today. Your clinician has been alerted and you are set to Out.`,
  urgent: () =>
    'Please contact your clinician today. One of your answers needs a clinician to look at it soon. Do not train the painful area until they have.',
  routine: () =>
    'Thanks — your care team has been told. Your clinician will review your report and may adjust what you can do. If anything gets worse, or a warning sign appears, stop and get care.',
};

async function listReports(
  ds: DataSource,
  ability: AppAbility,
  organizationId: string,
  where: { athleteId?: string; id?: string },
): Promise<PainReportDto[]> {
  const acl = accessibleWhere(ability, 'read', 'PainReport', {
    organizationId: 'r.organization_id',
    athleteId: 'r.athlete_id',
    id: 'r.id',
  });
  const qb = ds
    .createQueryBuilder()
    .select([
      'r.id AS id',
      'r.organization_id AS "organizationId"',
      'r.athlete_id AS "athleteId"',
      'u.display_name AS "athleteName"',
      'r.reported_at AS "reportedAt"',
      'r.body_regions AS "bodyRegions"',
      'r.pain_now AS "painNow"',
      'r.pain_worst_24h AS "painWorst24h"',
      'r.onset_date AS "onsetDate"',
      'r.aggravating_patterns AS "aggravatingPatterns"',
      'r.started_in_training AS "startedInTraining"',
      'r.note AS note',
      'r.red_flags AS "redFlags"',
      'r.route AS route',
      'r.case_id AS "caseId"',
    ])
    .from('pain_reports', 'r')
    .innerJoin('memberships', 'm', 'm.id = r.athlete_id')
    .innerJoin('users', 'u', 'u.id = m.user_id')
    .where('r.organization_id = :org', { org: organizationId })
    .andWhere(acl.sql, acl.params)
    .orderBy('r.reported_at', 'DESC')
    .limit(200);
  if (where.athleteId) qb.andWhere('r.athlete_id = :athleteId', { athleteId: where.athleteId });
  if (where.id) qb.andWhere('r.id = :id', { id: where.id });
  const rows = await qb.getRawMany<PainReportDto & { reportedAt: Date }>();
  return rows.map((r) => pickPermitted(ability, 'PainReport', { ...r, reportedAt: new Date(r.reportedAt).toISOString() }) as PainReportDto);
}

export const painReportRoutes: RouteDef[] = [
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/pain-reports',
    summary: 'Report pain with the red-flag screen; emergencies set Out and alert the care team at once',
    access: { kind: 'org', action: 'create', subject: 'PainReport' },
    params: OrgParamsSchema,
    body: PainReportCreateSchema,
    status: 201,
    async handler({ ds, ability, actor, user, body, tx }) {
      authorize(ability, 'create', 'PainReport', { id: '', organizationId: actor.organizationId, athleteId: body.athleteId });
      const today = todayIso();
      const outcome = await tx(async (m, audit) => {
        await requireMemberWithRole(m, actor.organizationId, body.athleteId, 'athlete', 'athleteId');
        return createPainReport(
          m,
          body,
          { organizationId: actor.organizationId, userId: user.id, athleteName: user.displayName, today },
          audit,
        );
      });
      const org = await ds.getRepository(Organization).findOneByOrFail({ id: actor.organizationId });
      const [report] = await listReports(ds, ability, actor.organizationId, { id: outcome.report.id });
      const dto: PainReportOutcomeDto = {
        report,
        route: outcome.route,
        statusSetToOut: outcome.statusSetToOut,
        message: MESSAGES[outcome.route](org.emergencyNumber),
        emergencyNumber: org.emergencyNumber,
      };
      return dto;
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/pain-reports',
    summary: 'Pain reports I may see, newest first (coaches without the narrative or answers)',
    access: { kind: 'org', action: 'read', subject: 'PainReport' },
    params: OrgParamsSchema,
    query: z.strictObject({ athleteId: UuidSchema.optional() }),
    async handler({ ds, ability, actor, query }) {
      return listReports(ds, ability, actor.organizationId, { athleteId: query.athleteId });
    },
  }),
];
