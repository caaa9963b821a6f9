import type { FlagDto } from '../../../policies/dto';
import type { z } from 'zod';
import type { FlagListQuerySchema } from '../../../policies/schemas';
import { accessibleWhere } from '../core/accessible';
import { orgQuery } from '../core/command';
import { humanizeIsoDates } from '../../../policies/words/dates';
import { coachFlagLine } from '../../../policies/words/flag-lines';

/**
 * Red-flag reports, pain reports and pain-rule flags of the reader's athletes, newest first. A clinician
 * of the athlete reads the flag's own message; anyone else on the care team (a coach) reads a line
 * about training only, without scores, places or warning-sign answers (ASVS 5.0 V8.2.3).
 */
export const flagsQuery = orgQuery({
  name: 'flags',
  async run(ctx, input: z.infer<typeof FlagListQuerySchema>): Promise<FlagDto[]> {
    const acl = accessibleWhere(ctx.ability, 'read', 'Flag', {
      organizationId: 'f.organization_id',
      athleteId: 'f.athlete_id',
      id: 'f.id',
    });
    const qb = ctx.db
      .createQueryBuilder()
      .select([
        'f.id AS id',
        'f.athlete_id AS "athleteId"',
        'au.display_name AS "athleteName"',
        'f.kind AS kind',
        'f.severity AS severity',
        'f.message AS message',
        'f.suggested_action AS "suggestedAction"',
        'f.created_at AS "createdAt"',
        'f.acknowledged_at AS "acknowledgedAt"',
        'ku.display_name AS "acknowledgedByName"',
        `CASE WHEN f.source_type = 'PainReport' THEN f.source_id END AS "painReportId"`,
        `to_char(tl.date, 'YYYY-MM-DD') AS "sessionDate"`,
      ])
      .from('flags', 'f')
      .innerJoin('memberships', 'am', 'am.id = f.athlete_id')
      .innerJoin('users', 'au', 'au.id = am.user_id')
      .leftJoin('users', 'ku', 'ku.id = f.acknowledged_by')
      .leftJoin('training_logs', 'tl', `f.source_type = 'TrainingLog' AND tl.id = f.source_id`)
      .where('f.organization_id = :org', { org: ctx.actor.organizationId })
      .andWhere(acl.sql, acl.params)
      .orderBy('f.created_at', 'DESC')
      .limit(300);
    if (input.athleteId) qb.andWhere('f.athlete_id = :a', { a: input.athleteId });
    if (input.state === 'open') qb.andWhere('f.acknowledged_at IS NULL');
    if (input.state === 'acknowledged') qb.andWhere('f.acknowledged_at IS NOT NULL');
    const rows = await qb.getRawMany();
    const clinicianOf = new Set(ctx.actor.clinicianOf);
    return rows.map(({ sessionDate, ...r }): FlagDto => ({
      ...r,
      message: clinicianOf.has(r.athleteId)
        ? humanizeIsoDates(r.message)
        : coachFlagLine(r.kind, r.athleteName, sessionDate, humanizeIsoDates(r.message)),
      createdAt: new Date(r.createdAt).toISOString(),
      acknowledgedAt: r.acknowledgedAt ? new Date(r.acknowledgedAt).toISOString() : null,
    }));
  },
});
