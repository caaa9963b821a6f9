import type { DataSource, EntityManager } from 'typeorm';
import type { AppAbility } from '../../../policies/access';
import type { PainReportDto, PainReportToldDto } from '../../../policies/dto';
import { accessibleWhere } from '../core/accessible';
import { pickPermitted } from '../services/fields';

/** Pain reports the reader may see, newest first, each with the fields their role may read. */
export async function listPainReports(
  db: DataSource | EntityManager,
  ability: AppAbility,
  organizationId: string,
  where: { athleteId?: string; id?: string; caseId?: string },
  /** The newest this many; the whole-record export asks for all of them. */
  limit = 200,
): Promise<PainReportDto[]> {
  const acl = accessibleWhere(ability, 'read', 'PainReport', {
    organizationId: 'r.organization_id',
    athleteId: 'r.athlete_id',
    id: 'r.id',
  });
  const qb = db
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
    .limit(limit);
  if (where.athleteId) qb.andWhere('r.athlete_id = :athleteId', { athleteId: where.athleteId });
  if (where.id) qb.andWhere('r.id = :id', { id: where.id });
  if (where.caseId) qb.andWhere('r.case_id = :caseId', { caseId: where.caseId });
  const rows = await qb.getRawMany<PainReportDto & { reportedAt: Date }>();
  return rows.map((r) => pickPermitted(ability, 'PainReport', { ...r, reportedAt: new Date(r.reportedAt).toISOString() }) as PainReportDto);
}

/** The kinds of notice `reportPain` sends with a report (commands/pain-reports.ts). */
export const PAIN_REPORT_NOTICE_KINDS = [
  'red_flag_emergency',
  'red_flag_urgent',
  'status_out',
  'red_flag_emergency_guardian',
  'pain_report',
];

/**
 * Who the app told when the report was filed. The notices are written in the report's own transaction,
 * so their `created_at` (PostgreSQL's now(), the transaction's start) equals the report's `reported_at`.
 */
export async function toldAboutReport(db: DataSource | EntityManager, reportId: string): Promise<PainReportToldDto[]> {
  return db.query(
    `SELECT u.display_name AS name, n.kind
       FROM pain_reports r
       JOIN notifications n ON n.athlete_id = r.athlete_id AND n.organization_id = r.organization_id
                           AND n.created_at = r.reported_at AND n.kind = ANY($2)
       JOIN memberships m ON m.id = n.recipient_id
       JOIN users u ON u.id = m.user_id
      WHERE r.id = $1
      ORDER BY n.kind, u.display_name`,
    [reportId, PAIN_REPORT_NOTICE_KINDS],
  );
}
