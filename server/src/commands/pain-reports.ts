import { BODY_REGION_LABELS } from '../../../policies/body-regions';
import type { PainReportOutcomeDto } from '../../../policies/dto';
import type { PainReportCreateInput } from '../../../policies/schemas';
import { checkRedFlagAnswers, flaggedItems, routeReport } from '../../../policies/red-flags';
import { CaseRecord, Flag, Organization, PainReport } from '../entities';
import { authorize } from '../core/authorize';
import { AppError } from '../core/errors';
import { orgCommand, type OrgCommandCtx } from '../core/command';
import { memberName } from '../queries/members';
import { listPainReports } from '../queries/reports';
import { athleteCircle, notify } from '../services/notify';
import { requireMemberWithRole } from '../services/org-members';
import { setStatus } from './cases';
import { callWithin } from './run';
import { coachFlagLine } from '../../../policies/words/flag-lines';

/** What the athlete reads first, by the report's route (NICE NG59 2016, updated 2020). */
const MESSAGES = {
  emergency: (num: string) =>
    `Stop training now and get urgent medical care: call ${num} or go to an emergency department. Your answers can be a sign of a serious problem that needs a doctor today. Your clinician has been alerted and you are set to Out.`,
  urgent: () =>
    'Please contact your clinician today. One of your answers needs a clinician to look at it soon. Do not train the painful area until they have.',
  routine: () =>
    'Thanks — your care team has been told. Your clinician will review your report and may adjust what you can do. If anything gets worse, or a warning sign appears, stop and get care.',
};

/**
 * The case an emergency answer sets Out: the athlete's most recent open case, or a new case opened
 * by the system from the report (a clinician reviews it).
 */
async function caseForEmergency(ctx: OrgCommandCtx, report: PainReport): Promise<string> {
  const { m } = ctx;
  const open: { id: string }[] = await m.query(
    `SELECT id FROM cases WHERE athlete_id = $1 AND organization_id = $2 AND closed_on IS NULL ORDER BY opened_at DESC LIMIT 1`,
    [report.athleteId, report.organizationId],
  );
  if (open[0]) return open[0].id;
  const c = await m.save(
    m.create(CaseRecord, {
      organizationId: report.organizationId,
      athleteId: report.athleteId,
      bodyRegions: report.bodyRegions,
      onsetDate: report.onsetDate,
      diagnosis: null,
      clinicalNotes: null,
      reviewDate: ctx.today,
      openedBy: null,
    }),
  );
  await ctx.audit({
    action: 'case.opened',
    subjectType: 'Case',
    subjectId: c.id,
    athleteId: report.athleteId,
    after: { reason: 'emergency red-flag answer', painReportId: report.id },
  });
  return c.id;
}

/**
 * The answers must be to exactly the questions the places ask (`redFlagQuestionsFor`). The route's
 * schema already refuses a mismatch; this keeps the rule for a script or job that calls the command.
 */
function requireScreenFor(input: PainReportCreateInput): void {
  const { missing, unknown } = checkRedFlagAnswers(input.bodyRegions, input.redFlags);
  if (missing.length === 0 && unknown.length === 0) return;
  const fields: Record<string, string[]> = {};
  for (const id of missing) fields[`redFlags.${id}`] = ['must be answered yes or no'];
  for (const id of unknown) fields[`redFlags.${id}`] = ['is not asked for the places chosen'];
  throw new AppError('validation_failed', `Please check the form: ${Object.keys(fields).join(', ')}.`, fields);
}

/**
 * An athlete reports pain with the red-flag screen (NICE NG59; Finucane et al. 2020, JOSPT 50:350–372).
 * An emergency answer sets them Out from the organization's today, through the one status command,
 * so that evening's published sessions are held; any other report changes no limit.
 */
export const reportPain = orgCommand({
  name: 'reportPain',
  changesLimits: true,
  async run(ctx, input: PainReportCreateInput): Promise<PainReportOutcomeDto> {
    const { m } = ctx;
    const org = ctx.actor.organizationId;
    authorize(ctx.ability, 'create', 'PainReport', { id: '', organizationId: org, athleteId: input.athleteId });
    await requireMemberWithRole(m, org, input.athleteId, 'athlete', 'athleteId');
    requireScreenFor(input);
    const athleteName = await memberName(m, input.athleteId);
    const route = routeReport(input.redFlags);
    let report = await m.save(
      m.create(PainReport, {
        organizationId: org,
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
    await ctx.audit({
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
      const caseId = await caseForEmergency(ctx, report);
      await callWithin(ctx, setStatus, {
        caseId,
        status: 'out',
        effectiveFrom: ctx.today,
        note: 'Set automatically after an emergency answer in a pain report. Stop training and get urgent medical care.',
        cause: { kind: 'emergency_report', painReportId: report.id },
      });
      report.caseId = caseId;
      report = await m.save(report);
      statusSetToOut = true;
      const items = flaggedItems(input.redFlags)
        .filter((i) => i.tier === 'emergency')
        .map((i) => i.question);
      const message = `${athleteName} answered yes to an emergency warning sign (${where}). They were told to stop and get urgent medical care now, and are set to Out.`;
      // Coaches read flags but never the red-flag answers (PAIN_REPORT_FIELDS): the answers go only in the clinicians' notice.
      await m.insert(Flag, {
        organizationId: org,
        athleteId: input.athleteId,
        kind: 'red_flag_emergency',
        severity: 'emergency',
        message,
        suggestedAction: null,
        sourceType: 'PainReport',
        sourceId: report.id,
      });
      await notify(m, circle.clinicians, {
        organizationId: org,
        athleteId: input.athleteId,
        kind: 'red_flag_emergency',
        severity: 'emergency',
        title: `Emergency warning sign: ${athleteName}`,
        body: `${message} Answers: ${items.join(' / ')}`,
      });
      await notify(m, circle.coaches, {
        organizationId: org,
        athleteId: input.athleteId,
        kind: 'status_out',
        severity: 'emergency',
        title: `${athleteName} is Out`,
        body: `${athleteName} has been set to Out after a pain report and must not train until a clinician clears it.`,
      });
      // Guardians of a minor are told; they never see the answers or the narrative.
      await notify(m, circle.guardians, {
        organizationId: org,
        athleteId: input.athleteId,
        kind: 'red_flag_emergency_guardian',
        severity: 'emergency',
        title: `${athleteName} has been told to get urgent medical care`,
        body: `${athleteName} reported a warning sign with their pain and was told to stop training and get urgent medical care now. Please make sure they are seen today. Their clinician has been alerted.`,
      });
    } else if (route === 'urgent') {
      const items = flaggedItems(input.redFlags).map((i) => i.question);
      const message = `${athleteName} reported pain (${where}, ${input.painNow}/10 now) with a warning sign that needs review today.`;
      await m.insert(Flag, {
        organizationId: org,
        athleteId: input.athleteId,
        kind: 'red_flag_urgent',
        severity: 'urgent',
        message,
        suggestedAction: null,
        sourceType: 'PainReport',
        sourceId: report.id,
      });
      await notify(m, circle.clinicians, {
        organizationId: org,
        athleteId: input.athleteId,
        kind: 'red_flag_urgent',
        severity: 'urgent',
        title: `Review today: ${athleteName}`,
        body: `${message} Answers: ${items.join(' / ')}`,
      });
    } else {
      const message = `${athleteName} reported pain: ${where}, ${input.painNow}/10 now, ${input.painWorst24h}/10 at worst in the last 24 hours. No warning signs.`;
      await m.insert(Flag, {
        organizationId: org,
        athleteId: input.athleteId,
        kind: 'pain_report',
        severity: 'routine',
        message,
        suggestedAction: null,
        sourceType: 'PainReport',
        sourceId: report.id,
      });
      const notice = {
        organizationId: org,
        athleteId: input.athleteId,
        kind: 'pain_report',
        severity: 'routine' as const,
        title: `New pain report: ${athleteName}`,
      };
      await notify(m, circle.clinicians, { ...notice, body: message });
      // Coaches read what it means for training, not the scores or places (minimum necessary).
      const coachesOnly = circle.coaches.filter((c) => !circle.clinicians.includes(c));
      await notify(m, coachesOnly, { ...notice, body: coachFlagLine('pain_report', athleteName) });
    }
    if (!statusSetToOut) ctx.limitsUnchanged();
    const { emergencyNumber } = await m.findOneByOrFail(Organization, { id: org });
    const [dto] = await listPainReports(m, ctx.ability, org, { id: report.id });
    return { report: dto, route, statusSetToOut, message: MESSAGES[route](emergencyNumber), emergencyNumber };
  },
});
