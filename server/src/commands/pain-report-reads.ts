import type { PainReportDto } from '../../../policies/dto';
import { orgCommand } from '../core/command';
import { listPainReports } from '../queries/reports';

/** The fields of a pain report that are health narrative: the athlete's own words and the red-flag answers. */
const NARRATIVE_FIELDS = ['note', 'redFlags'] as const;

/**
 * Pain reports the reader may see. A command, not a query: a read that returns the narrative or the
 * red-flag answers is itself written to the audit trail (ASVS 5.0 V16.2.1; 45 CFR 164.312(b)), one
 * entry per athlete read, naming the reports. Coaches (who never get those fields) and an athlete
 * reading their own reports write nothing.
 */
export const viewPainReports = orgCommand({
  name: 'viewPainReports',
  async run(ctx, input: { athleteId?: string }): Promise<PainReportDto[]> {
    const reports = await listPainReports(ctx.m, ctx.ability, ctx.actor.organizationId, input);
    const byAthlete = new Map<string, { ids: string[]; fields: Set<string> }>();
    for (const r of reports) {
      const shown = NARRATIVE_FIELDS.filter((f) => f in r);
      if (!shown.length || r.athleteId === ctx.actor.membershipId) continue;
      const seen = byAthlete.get(r.athleteId) ?? { ids: [], fields: new Set<string>() };
      seen.ids.push(r.id);
      for (const f of shown) seen.fields.add(f);
      byAthlete.set(r.athleteId, seen);
    }
    for (const [athleteId, seen] of byAthlete) {
      await ctx.audit({
        action: 'painReport.viewed',
        subjectType: 'PainReport',
        subjectId: seen.ids.length === 1 ? seen.ids[0] : null,
        athleteId,
        after: { reportIds: seen.ids, fields: [...seen.fields].sort() },
      });
    }
    return reports;
  },
});
