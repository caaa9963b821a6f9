import { randomUUID } from 'node:crypto';
import type { EntityManager } from 'typeorm';
import { defineAbilityFor } from '../../../policies/access';
import { noRedFlags } from '../../../policies/red-flags';
import { LetterCreateSchema, PainReportCreateSchema, type SessionContent } from '../../../policies/schemas';
import type { CoreDeps, Command, OrgCommandCtx } from '../core/command';
import { runOrgCommandIn } from '../commands/run';
import { recordBaseline } from '../commands/baselines';
import { changeStatus, closeCase, openCase } from '../commands/cases';
import { acknowledgeLetter, draftLetter, signLetter } from '../commands/letters';
import { viewPainReport } from '../commands/pain-report-reads';
import { reportPain } from '../commands/pain-reports';
import { createPlan, revisePlan } from '../commands/plans';
import { rateReadiness, recordStageAssessment } from '../commands/stage-criteria';
import { addSession, publishSession } from '../commands/programs';
import { loadActor } from '../services/actor';

type Stage = {
  id: string;
  label: string;
  startDate: string;
  endDate: string;
  reviewDate: string;
  painCeiling: number;
  patterns: Record<string, { mode: 'blocked' } | { mode: 'capped'; caps: Record<string, number | boolean> }>;
  criteria?: Record<string, unknown>[];
};

/**
 * The demo's decisions, made the way people make them: each step is a real command run as the person
 * who would take it (the same checks, audit entries, notices, holds and e-mails as in the app), inside
 * the loader's transaction. The dates are relative to the day the demo loads (`day(0)`).
 */
export class DemoDirector {
  private exerciseIds = new Map<string, string>();

  constructor(
    private readonly m: EntityManager,
    private readonly deps: CoreDeps,
    private readonly organizationId: string,
    private readonly userIds: Record<string, string>,
    readonly day: (offset: number) => string,
  ) {}

  async init(): Promise<void> {
    const rows: { id: string; name: string }[] = await this.m.query(`SELECT id, name FROM exercises WHERE organization_id = $1`, [
      this.organizationId,
    ]);
    this.exerciseIds = new Map(rows.map((r) => [r.name, r.id]));
  }

  /** Runs a command as a demo person (by key), as the app would for their request. */
  async as<I, O>(key: string, cmd: Command<I, O, OrgCommandCtx>, input: I): Promise<O> {
    const actor = await loadActor(this.m, this.userIds[key], this.organizationId);
    if (!actor) throw new Error(`demo person ${key} has no membership`);
    return runOrgCommandIn(
      this.m,
      cmd,
      { deps: this.deps, requestId: `demo-${randomUUID()}`, userId: this.userIds[key], actor, ability: defineAbilityFor(actor) },
      input,
    );
  }

  exercise(name: string): string {
    const id = this.exerciseIds.get(name);
    if (!id) throw new Error(`demo exercise ${name} is not in the library`);
    return id;
  }

  session(exercises: { name: string; sets: number; reps: number; kg?: number; percent?: number; rpe?: number }[]): SessionContent {
    return {
      exercises: exercises.map((e) => ({
        id: randomUUID(),
        exerciseId: this.exercise(e.name),
        notes: null,
        sets: Array.from({ length: e.sets }, () => ({
          id: randomUUID(),
          reps: e.reps,
          load:
            e.percent !== undefined
              ? { kind: 'percent' as const, value: e.percent }
              : e.kg
                ? { kind: 'kg' as const, value: e.kg }
                : { kind: 'bodyweight' as const },
          targetRpe: e.rpe ?? null,
        })),
      })),
    };
  }

  /** A coach adds a session to a program and publishes it (checked against every athlete's limits). */
  async publish(coach: string, programId: string, date: string, title: string, content: SessionContent): Promise<string> {
    const s = await this.as(coach, addSession, { programId, date, title, content });
    await this.as(coach, publishSession, { id: s.id, version: s.version, unit: 'kg' });
    return s.id;
  }
}

const PLAN_GUIDANCE =
  'Lift light from the floor, no twisting throws for now, and stop any exercise that brings the back pain above 3 out of 10.';

/**
 * Maya Torres (16, softball) — the product's own story, under way: her lower-back pain report, read by
 * her clinician; a case opened from it with the status Limited; a two-stage plan; a letter signed and
 * acknowledged by her mother; a published session; then a plan change at review that puts that session
 * on hold and leaves the letter out of date, and the updated letter signed and sent (not yet read).
 */
export async function mayasCase(d: DemoDirector, ids: Record<string, string>, programId: string): Promise<void> {
  const day = d.day;
  const maya = ids.maya;
  await d.as('coachTheo', recordBaseline, {
    athleteId: maya,
    exerciseId: d.exercise('Deadlift'),
    kind: 'tested',
    loadKg: 85,
    reps: 1,
    rpe: null,
    testedOn: day(-40),
  });
  const report = await d.as(
    'maya',
    reportPain,
    PainReportCreateSchema.parse({
      athleteId: maya,
      bodyRegions: ['lower_back'],
      painNow: 5,
      painWorst24h: 6,
      onsetDate: day(-10),
      aggravatingPatterns: ['hinge', 'rotation'],
      startedInTraining: true,
      note: 'My lower back got sore after deadlifts and batting practice. Bending forward to field grounders hurts.',
      redFlags: noRedFlags(['lower_back']),
    }),
  );
  await d.as('clinicianPriya', viewPainReport, { id: report.report.id });
  const c = await d.as('clinicianPriya', openCase, {
    athleteId: maya,
    bodyRegions: ['lower_back'],
    onsetDate: day(-10),
    diagnosis: 'Non-specific low back pain (demo)',
    clinicalNotes: 'Invented demo note: tender over the right lumbar muscles, no warning signs, full strength and feeling in both legs.',
    status: 'limited',
    statusEffectiveFrom: day(-9),
    statusNote: 'Keep training, but go easy on bending and twisting until your back settles.',
    reviewDate: day(1),
    painReportId: report.report.id,
  });
  // What unlocks Build back: settled pain over three sessions, no warning signs, Priya's check of
  // bending, and Maya feeling ready (our own wording; criteria agreed with the athlete, Ardern et al. 2016).
  const bendCheck = randomUUID();
  const settleCriteria = [
    { id: randomUUID(), kind: 'record', rule: 'pain_settled_sessions', count: 3, maxPain: 3 },
    { id: randomUUID(), kind: 'record', rule: 'no_red_flags' },
    { id: bendCheck, kind: 'clinician', label: 'Bends forward to touch the shins without pain', measure: 'yes_no' },
    { id: randomUUID(), kind: 'athlete', threshold: 7 },
  ];
  const settle = (hingePercent: number): Stage => ({
    id: settleId,
    criteria: settleCriteria,
    label: 'Settle',
    startDate: day(-9),
    endDate: day(4),
    reviewDate: day(1),
    painCeiling: 3,
    patterns: {
      hinge: { mode: 'capped', caps: { maxPercent1RM: hingePercent, maxRpe: 6 } },
      swing: { mode: 'blocked' },
      rotation: { mode: 'capped', caps: { maxRpe: 5, impactAllowed: false } },
      throw: { mode: 'blocked' },
      squat: { mode: 'capped', caps: { maxRpe: 7 } },
    },
  });
  const settleId = randomUUID();
  const build: Stage = {
    id: randomUUID(),
    label: 'Build back',
    startDate: day(5),
    endDate: day(25),
    reviewDate: day(25),
    painCeiling: 4,
    patterns: {
      hinge: { mode: 'capped', caps: { maxPercent1RM: 75, maxRpe: 7 } },
      swing: { mode: 'capped', caps: { maxSetsPerSession: 3 } },
      rotation: { mode: 'capped', caps: { maxRpe: 7 } },
      throw: { mode: 'capped', caps: { maxRpe: 6, maxSetsPerSession: 3 } },
    },
  };
  const plan = await d.as('clinicianPriya', createPlan, {
    caseId: c.id,
    stages: [settle(60), build] as never,
    guidance: PLAN_GUIDANCE,
    changeNote: 'First plan after the pain report.',
  });
  const first = await d.as(
    'clinicianPriya',
    draftLetter,
    LetterCreateSchema.parse({
      athleteId: maya,
      decision: 'limited',
      effectiveFrom: day(-8),
      validUntil: day(4),
      credential: 'ATC',
      licenceNumber: 'AT-204117 (demo)',
      familyNote: 'Maya can keep training with her team with the limits below. Please tell us if the pain gets worse.',
    }),
  );
  await d.as('clinicianPriya', signLetter, { id: first.id, signature: 'Priya Raman', version: first.version });
  await d.as('elena', acknowledgeLetter, { id: first.id });

  // Theo programs the coming sessions within the plan: 50 kg Romanian deadlifts are 59 % of her 85 kg deadlift.
  await d.publish(
    'coachTheo',
    programId,
    day(2),
    'Lower body (light hinge)',
    d.session([
      { name: 'Romanian deadlift', sets: 3, reps: 6, kg: 50, rpe: 6 },
      { name: 'Goblet squat', sets: 3, reps: 8, kg: 16, rpe: 6 },
      { name: 'Dead bug', sets: 3, reps: 10, rpe: 4 },
    ]),
  );
  await d.publish(
    'coachTheo',
    programId,
    day(3),
    'Upper body',
    d.session([
      { name: 'Dumbbell bench press', sets: 3, reps: 10, kg: 12 },
      { name: 'Single-arm dumbbell row', sets: 3, reps: 10, kg: 14 },
      { name: 'Farmer carry', sets: 3, reps: 1, kg: 16 },
    ]),
  );

  // At the review her back is still sore when she bends: the hinge cap comes down to 50 %, which puts
  // the lower-body session on hold and leaves the signed letter out of date.
  await d.as('clinicianPriya', revisePlan, {
    planId: plan.id,
    version: plan.version,
    stages: [settle(50), build] as never,
    guidance: PLAN_GUIDANCE,
    changeNote: 'Bending is still sore at the review: lighter hinge work until the Build back stage.',
  });
  // Part met: Priya's bending check passes at the review, but Maya does not feel ready yet (5 of the 7 asked).
  await d.as('clinicianPriya', recordStageAssessment, {
    planId: plan.id,
    stageId: settleId,
    criterionId: bendCheck,
    date: day(0),
    met: true,
    note: 'Touches the shins; slight guarding on the way up.',
  });
  await d.as('maya', rateReadiness, { planId: plan.id, stageId: settleId, value: 5 });
  const updated = await d.as(
    'clinicianPriya',
    draftLetter,
    LetterCreateSchema.parse({
      athleteId: maya,
      decision: 'limited',
      effectiveFrom: day(0),
      validUntil: day(25),
      credential: 'ATC',
      licenceNumber: 'AT-204117 (demo)',
      familyNote: 'We lowered the weight Maya lifts from the floor for a few more days. Everything else stays the same.',
    }),
  );
  await d.as('clinicianPriya', signLetter, { id: updated.id, signature: 'Priya Raman', version: updated.version });
}

/** Jordan Pike (rower): a right-shoulder case from earlier in the season, cleared with a Full letter and closed. */
export async function jordansClosedCase(d: DemoDirector, ids: Record<string, string>): Promise<void> {
  const day = d.day;
  const c = await d.as('clinicianMarcus', openCase, {
    athleteId: ids.jordan,
    bodyRegions: ['shoulder_right'],
    onsetDate: day(-42),
    diagnosis: 'Rotator cuff tendon irritation (demo)',
    clinicalNotes: 'Invented demo note: pain lifting overhead after a heavy erg block; settled with load management.',
    status: 'limited',
    statusEffectiveFrom: day(-41),
    statusNote: 'Rowing and pulling as usual; nothing overhead for now.',
    reviewDate: day(-22),
  });
  await d.as('clinicianMarcus', createPlan, {
    caseId: c.id,
    stages: [
      {
        id: randomUUID(),
        label: 'Calm it down',
        startDate: day(-41),
        endDate: day(-22),
        reviewDate: day(-22),
        painCeiling: 3,
        patterns: {
          vertical_push: { mode: 'blocked' },
          horizontal_push: { mode: 'capped', caps: { maxPercent1RM: 60, maxRpe: 6 } },
          throw: { mode: 'blocked' },
        },
      },
    ] as never,
    guidance: 'Nothing overhead; keep pressing light.',
    changeNote: 'Plan at the first visit.',
  });
  const afterStatus = await d.as('clinicianMarcus', changeStatus, {
    caseId: c.id,
    status: 'full',
    effectiveFrom: day(-21),
    note: 'Back to full training.',
    version: c.version,
  });
  const letter = await d.as(
    'clinicianMarcus',
    draftLetter,
    LetterCreateSchema.parse({
      athleteId: ids.jordan,
      decision: 'full',
      effectiveFrom: day(-21),
      validUntil: null,
      credential: 'DPT',
      licenceNumber: 'PT-118842 (demo)',
      familyNote: 'Jordan is cleared to return to full training and racing.',
    }),
  );
  await d.as('clinicianMarcus', signLetter, { id: letter.id, signature: 'Marcus Bell', version: letter.version });
  await d.as('clinicianMarcus', closeCase, {
    caseId: c.id,
    closedOn: day(-20),
    closingNote: 'Shoulder settled; cleared for full training.',
    version: afterStatus.version,
  });
}
