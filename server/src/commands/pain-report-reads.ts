import type { PainReportDetailDto, PainReportDto } from '../../../policies/dto';
import { notFound } from '../core/errors';
import { orgCommand, type OrgCommandCtx } from '../core/command';
import { listPainReports, toldAboutReport } from '../queries/reports';

/** The fields of a pain report that are health narrative: the athlete's own words and the red-flag answers. */
const NARRATIVE_FIELDS = ['note', 'redFlags'] as const;

/**
 * Writes one `painReport.viewed` entry per athlete whose narrative or red-flag answers the reader was
 * given, naming the reports and the fields — never their content. Coaches (who never get those fields)
 * and an athlete reading their own reports write nothing.
 */
async function auditNarrativeReads(ctx: OrgCommandCtx, reports: PainReportDto[]): Promise<void> {
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
}

/**
 * Pain reports the reader may see. A command, not a query: a read that returns the narrative or the
 * red-flag answers is itself written to the audit trail (ASVS 5.0 V16.2.1; 45 CFR 164.312(b)).
 */
export const viewPainReports = orgCommand({
  name: 'viewPainReports',
  async run(ctx, input: { athleteId?: string }): Promise<PainReportDto[]> {
    const reports = await listPainReports(ctx.m, ctx.ability, ctx.actor.organizationId, input);
    await auditNarrativeReads(ctx, reports);
    return reports;
  },
});

/**
 * One pain report with who was told, for its own page. A report the reader may not read (another care
 * team, another organization, an unknown id) is 404, never 403, so its existence is not revealed
 * (ASVS 5.0 V8.2.2); the fields are the reader's role's (a coach gets no narrative and no answers).
 */
export const viewPainReport = orgCommand({
  name: 'viewPainReport',
  async run(ctx, input: { id: string }): Promise<PainReportDetailDto> {
    const [report] = await listPainReports(ctx.m, ctx.ability, ctx.actor.organizationId, { id: input.id });
    if (!report) throw notFound('pain report');
    await auditNarrativeReads(ctx, [report]);
    return { report, told: await toldAboutReport(ctx.m, report.id) };
  },
});
