import type { EntityManager } from 'typeorm';
import { BODY_REGION_LABELS } from '../../../policies/body-regions';
import type { PainReportCreateInput } from '../../../policies/schemas';
import { flaggedItems, routeReport, type ReportRoute } from '../../../policies/red-flags';
import { CaseRecord, Flag, PainReport, ParticipationStatusChange } from '../entities';
import type { AuditFn } from '../core/tx';
import { athleteCircle, notify } from './notify';
import { recheckAthlete } from '../commands/limits';

export interface PainReportOutcome {
  report: PainReport;
  route: ReportRoute;
  /** Set when an emergency answer put the athlete on Out. */
  statusSetToOut: boolean;
}

/**
 * Sets the athlete to Out after an emergency answer: on their most recent open case, or on a new
 * case opened by the system from the report (a clinician reviews it). Returns the case id.
 */
async function setOut(m: EntityManager, report: PainReport, userId: string, today: string, audit: AuditFn): Promise<string> {
  const open: { id: string }[] = await m.query(
    `SELECT id FROM cases WHERE athlete_id = $1 AND organization_id = $2 AND closed_on IS NULL ORDER BY opened_at DESC LIMIT 1`,
    [report.athleteId, report.organizationId],
  );
  let c = open[0] ? await m.findOneByOrFail(CaseRecord, { id: open[0].id }) : null;
  if (!c) {
    c = await m.save(
      m.create(CaseRecord, {
        organizationId: report.organizationId,
        athleteId: report.athleteId,
        bodyRegions: report.bodyRegions,
        onsetDate: report.onsetDate,
        diagnosis: null,
        clinicalNotes: null,
        reviewDate: today,
        openedBy: null,
      }),
    );
    await audit({
      action: 'case.opened',
      subjectType: 'Case',
      subjectId: c.id,
      athleteId: report.athleteId,
      after: { reason: 'emergency red-flag answer', painReportId: report.id },
    });
  } else {
    await m
      .createQueryBuilder()
      .update(CaseRecord)
      .set({ version: () => 'version + 1', updatedAt: () => 'now()' } as never)
      .where('id = :id', { id: c.id })
      .execute();
  }
  const change = await m.save(
    m.create(ParticipationStatusChange, {
      organizationId: report.organizationId,
      athleteId: report.athleteId,
      caseId: c.id,
      status: 'out',
      effectiveFrom: today,
      note: 'Set automatically after an emergency answer in a pain report. Stop training and get urgent medical care.',
      setBy: userId,
    }),
  );
  await audit({
    action: 'status.changed',
    subjectType: 'ParticipationStatus',
    subjectId: change.id,
    athleteId: report.athleteId,
    after: { caseId: c.id, status: 'out', effectiveFrom: today, reason: 'emergency red-flag answer' },
  });
  return c.id;
}

export async function createPainReport(
  m: EntityManager,
  input: PainReportCreateInput,
  ctx: { organizationId: string; userId: string; athleteName: string; today: string },
  audit: AuditFn,
): Promise<PainReportOutcome> {
  const route = routeReport(input.redFlags);
  let report = await m.save(
    m.create(PainReport, {
      organizationId: ctx.organizationId,
      athleteId: input.athleteId,
      reportedBy: ctx.userId,
      bodyRegions: input.bodyRegions,
      painNow: input.painNow,
      painWorst24h: input.painWorst24h,
      onsetDate: input.onsetDate,
      aggravatingPatterns: input.aggravatingPatterns,
      startedInTraining: input.startedInTraining,
      note: input.note ?? null,
      redFlags: input.redFlags,
      route,
      caseId: null,
    }),
  );
  // The narrative stays out of the trail; the scores, places and route are what happened.
  await audit({
    action: 'pain_report.created',
    subjectType: 'PainReport',
    subjectId: report.id,
    athleteId: input.athleteId,
    after: {
      route,
      painNow: input.painNow,
      painWorst24h: input.painWorst24h,
      bodyRegions: input.bodyRegions,
      redFlags: flaggedItems(input.redFlags).map((i) => i.id),
    },
  });
  const circle = await athleteCircle(m, input.athleteId);
  const where = input.bodyRegions.map((r) => BODY_REGION_LABELS[r].toLowerCase()).join(', ');
  let statusSetToOut = false;
  if (route === 'emergency') {
    report.caseId = await setOut(m, report, ctx.userId, ctx.today, audit);
    report = await m.save(report);
    statusSetToOut = true;
    await recheckAthlete(m, ctx.organizationId, input.athleteId, 'The athlete reported an emergency warning sign and is Out.', ctx.today);
    const items = flaggedItems(input.redFlags)
      .filter((i) => i.tier === 'emergency')
      .map((i) => i.question);
    const message = `${ctx.athleteName} answered yes to an emergency warning sign (${where}). They were told to stop and get urgent medical care now, and are set to Out.`;
    // Coaches read flags but never the red-flag answers (PAIN_REPORT_FIELDS): the answers go only in the clinicians' notice.
    await m.insert(Flag, {
      organizationId: ctx.organizationId,
      athleteId: input.athleteId,
      kind: 'red_flag_emergency',
      severity: 'emergency',
      message,
      suggestedAction: null,
      sourceType: 'PainReport',
      sourceId: report.id,
    });
    await notify(m, circle.clinicians, {
      organizationId: ctx.organizationId,
      athleteId: input.athleteId,
      kind: 'red_flag_emergency',
      severity: 'emergency',
      title: `Emergency warning sign: ${ctx.athleteName}`,
      body: `${message} Answers: ${items.join(' / ')}`,
    });
    await notify(m, circle.coaches, {
      organizationId: ctx.organizationId,
      athleteId: input.athleteId,
      kind: 'status_out',
      severity: 'emergency',
      title: `${ctx.athleteName} is Out`,
      body: `${ctx.athleteName} has been set to Out after a pain report and must not train until a clinician clears it.`,
    });
    // Guardians of a minor are told; they never see the answers or the narrative.
    await notify(m, circle.guardians, {
      organizationId: ctx.organizationId,
      athleteId: input.athleteId,
      kind: 'red_flag_emergency_guardian',
      severity: 'emergency',
      title: `${ctx.athleteName} has been told to get urgent medical care`,
      body: `${ctx.athleteName} reported a warning sign with their pain and was told to stop training and get urgent medical care now. Please make sure they are seen today. Their clinician has been alerted.`,
    });
  } else if (route === 'urgent') {
    const items = flaggedItems(input.redFlags).map((i) => i.question);
    const message = `${ctx.athleteName} reported pain (${where}, ${input.painNow}/10 now) with a warning sign that needs review today.`;
    await m.insert(Flag, {
      organizationId: ctx.organizationId,
      athleteId: input.athleteId,
      kind: 'red_flag_urgent',
      severity: 'urgent',
      message,
      suggestedAction: null,
      sourceType: 'PainReport',
      sourceId: report.id,
    });
    await notify(m, circle.clinicians, {
      organizationId: ctx.organizationId,
      athleteId: input.athleteId,
      kind: 'red_flag_urgent',
      severity: 'urgent',
      title: `Review today: ${ctx.athleteName}`,
      body: `${message} Answers: ${items.join(' / ')}`,
    });
  } else {
    const message = `${ctx.athleteName} reported pain: ${where}, ${input.painNow}/10 now, ${input.painWorst24h}/10 at worst in the last 24 hours. No warning signs.`;
    await m.insert(Flag, {
      organizationId: ctx.organizationId,
      athleteId: input.athleteId,
      kind: 'pain_report',
      severity: 'routine',
      message,
      suggestedAction: null,
      sourceType: 'PainReport',
      sourceId: report.id,
    });
    await notify(m, [...circle.clinicians, ...circle.coaches], {
      organizationId: ctx.organizationId,
      athleteId: input.athleteId,
      kind: 'pain_report',
      severity: 'routine',
      title: `New pain report: ${ctx.athleteName}`,
      body: message,
    });
  }
  return { report, route, statusSetToOut };
}
