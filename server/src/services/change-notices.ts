import type { EntityManager } from 'typeorm';
import { describeDate, describeRule } from '../../../policies/load/describe';
import { inForceOn, readPainCeiling, type PlanStage } from '../../../policies/load/in-force';
import { MOVEMENT_PATTERNS, STATUS_LABELS, type ParticipationStatus } from '../../../policies/load/patterns';
import { plainLimitLines, plainStatus } from '../../../policies/plain-words';
import type { Unit } from '../../../policies/schemas/common';
import { activePlans } from './cases';
import { athleteCircle, notify } from './notify';

/**
 * Everyone around an athlete hears of a change of status or plan, each in their own words: coaches
 * in the trade's words (pattern names, caps, RPE), the athlete in plain words addressed to them, and
 * a minor's guardians in plain everyday words (policies/plain-words.ts) — in the app and, unless
 * they switched it off, by e-mail (notify()). Loads are in each reader's own unit.
 */

/** What the change notices need of the command's context. */
export interface NoticeCtx {
  m: EntityManager;
  actor: { organizationId: string };
  today: string;
}

type Audience = 'coach' | 'athlete' | 'guardian';

interface Person {
  id: string;
  name: string;
  unit: Unit;
}

interface Words {
  title: string;
  lines: string[];
}

async function people(m: EntityManager, ids: string[]): Promise<Map<string, Person>> {
  const rows: { id: string; name: string; unit: Unit }[] = await m.query(
    `SELECT m.id, u.display_name AS name, u.unit_pref AS unit FROM memberships m JOIN users u ON u.id = m.user_id WHERE m.id = ANY($1)`,
    [ids],
  );
  return new Map(rows.map((r) => [r.id, r]));
}

/** Sends each audience its own words; one notice per person, since units differ from person to person. */
async function tell(
  ctx: NoticeCtx,
  athleteId: string,
  kind: 'status_changed' | 'plan_changed',
  severity: 'urgent' | 'routine',
  write: (audience: Audience, unit: Unit, athleteName: string) => Words,
): Promise<void> {
  const circle = await athleteCircle(ctx.m, athleteId);
  const audiences: [Audience, string[]][] = [
    ['athlete', [athleteId]],
    ['coach', circle.coaches],
    ['guardian', circle.guardians],
  ];
  const who = await people(ctx.m, [athleteId, ...circle.coaches, ...circle.guardians]);
  const athleteName = who.get(athleteId)?.name ?? 'The athlete';
  for (const [audience, ids] of audiences) {
    for (const id of ids) {
      const person = who.get(id);
      if (!person) continue;
      const words = write(audience, person.unit, athleteName);
      await notify(ctx.m, [id], {
        organizationId: ctx.actor.organizationId,
        athleteId,
        kind,
        severity,
        title: words.title,
        body: words.lines.join('\n'),
      });
    }
  }
}

/** A stage's limits in the trade's words, for coaches: "Hinge: not allowed for now", "Pain ceiling 5/10". */
function staffLines(stage: Pick<PlanStage, 'patterns' | 'painCeiling'>, unit: Unit): string[] {
  const lines = MOVEMENT_PATTERNS.filter((p) => stage.patterns[p] && stage.patterns[p]!.mode !== 'free').map((p) =>
    describeRule(p, stage.patterns[p]!, unit, 'staff'),
  );
  if (lines.length === 0) lines.push('No pattern limited.');
  lines.push(`Pain ceiling ${readPainCeiling(stage.painCeiling)}/10.`);
  return lines;
}

/** What setStatus was given (its own input type has these fields). */
export interface StatusNoticeInput {
  status: ParticipationStatus;
  effectiveFrom: string;
  note: string | null;
  cause: { kind: 'clinician' | 'case_opened' | 'emergency_report' };
}

/**
 * A participation status change, told to the athlete, their coaches and guardians. An emergency Out
 * is not told here: the emergency report already tells everyone at once, in words made for it.
 */
export async function tellStatusChange(ctx: NoticeCtx, athleteId: string, input: StatusNoticeInput): Promise<void> {
  if (input.cause.kind === 'emergency_report') return;
  const label = STATUS_LABELS[input.status];
  const date = describeDate(input.effectiveFrom);
  const day = input.effectiveFrom > ctx.today ? input.effectiveFrom : ctx.today;
  const plans = (await activePlans(ctx.m, [athleteId], day)).get(athleteId) ?? [];
  const inForce = inForceOn(plans, day);
  const limited = input.status === 'limited' && inForce.stages.length > 0;
  const severity = input.status === 'out' ? 'urgent' : 'routine';
  await tell(ctx, athleteId, 'status_changed', severity, (audience, unit, name) => {
    if (audience === 'coach') {
      const lines = [`The clinician set ${name}'s participation status to ${label} from ${date}.`];
      if (input.note) lines.push(`Note: ${input.note}`);
      if (input.status === 'out') lines.push('Program no training for them until a clinician changes the status.');
      if (input.status === 'full') lines.push('No limits apply from that day.');
      if (input.status === 'limited')
        lines.push(
          ...(limited
            ? [`What is allowed on ${describeDate(day)}:`, ...staffLines(inForce, unit)]
            : ['No restriction plan is in force yet.']),
        );
      return { title: `${name}: ${label} from ${date}`, lines };
    }
    const you = audience === 'athlete';
    const lines = [you ? `From ${date} you are ${plainStatus(input.status)}.` : `From ${date}, ${name} is ${plainStatus(input.status)}.`];
    if (input.note) lines.push(`${you ? "Your clinician's" : "The clinician's"} note: ${input.note}`);
    if (input.status === 'limited') {
      if (limited) lines.push(you ? 'What you may do:' : `What ${name} may do:`, ...plainLimitLines(inForce, unit));
      else lines.push(`The clinician will set out what ${you ? 'you' : name} may do; you will hear as soon as they do.`);
    }
    return { title: you ? `Your training status: ${label} from ${date}` : `${name}'s training status: ${label} from ${date}`, lines };
  });
}

/** What createPlan and revisePlan were given (their input types have these fields). */
export interface PlanNoticeInput {
  stages: PlanStage[];
  guidance: string;
  changeNote?: string | null;
}

/** A new plan version (the first, or a revision), told to the athlete, their coaches and guardians; stages already over are left out. */
export async function tellPlanVersion(ctx: NoticeCtx, athleteId: string, version: number, input: PlanNoticeInput): Promise<void> {
  // Stages keep their number in the plan (in date order) even when earlier ones are over and left out.
  const numbered = [...input.stages].sort((a, b) => (a.startDate < b.startDate ? -1 : 1)).map((s, i) => ({ ...s, n: i + 1 }));
  const stages = numbered.filter((s) => s.endDate >= ctx.today);
  const first = version === 1;
  const dates = (s: PlanStage) => `${describeDate(s.startDate)} to ${describeDate(s.endDate)}`;
  await tell(ctx, athleteId, 'plan_changed', 'routine', (audience, unit, name) => {
    if (audience === 'coach') {
      const lines = [`The clinician ${first ? 'wrote' : 'changed'} ${name}'s restriction plan (version ${version}).`];
      if (input.changeNote) lines.push(`Change note: ${input.changeNote}`);
      for (const s of stages) lines.push(`Stage ${s.n}${s.label ? ` (${s.label})` : ''}, ${dates(s)}:`, ...staffLines(s, unit));
      if (stages.length === 0) lines.push('Every stage of this version is already over.');
      return { title: `${name}: restriction plan version ${version}`, lines };
    }
    const you = audience === 'athlete';
    const lines = [
      you
        ? `Your clinician ${first ? 'set out' : 'changed'} what you may do in training.`
        : `${name}'s clinician ${first ? 'set out' : 'changed'} what ${name} may do in training.`,
    ];
    for (const s of stages) lines.push(`From ${dates(s)}:`, ...plainLimitLines(s, unit));
    if (stages.length === 0) lines.push('These limits are for days already past; nothing changes from today.');
    if (input.guidance.trim()) lines.push(`${you ? "Your clinician's" : "The clinician's"} advice: ${input.guidance.trim()}`);
    return {
      title: you
        ? `Your training limits have ${first ? 'been set' : 'changed'}`
        : `${name}'s training limits have ${first ? 'been set' : 'changed'}`,
      lines,
    };
  });
}
