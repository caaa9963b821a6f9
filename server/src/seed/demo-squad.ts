import { randomUUID } from 'node:crypto';
import type { EntityManager } from 'typeorm';
import type { Role } from '../../../policies/roles';
import { recordBaseline } from '../commands/baselines';
import { openCase } from '../commands/cases';
import { createPlan } from '../commands/plans';
import { addTeamSession, createTeamProgram } from '../commands/team-programs';
import { publishTeamSessions } from '../commands/team-versions';
import { Group, GroupMember } from '../entities';
import type { DemoDirector } from './demo-story';

/**
 * The softball infield squad: Maya and eight team-mates, coached together by Theo. Invented people;
 * any likeness to real people is accidental. Tessa Grant is the squad's second restricted athlete
 * (a right-thigh strain: no sprinting or jumping, lighter hinge work), so the team program shows two
 * athletes whose versions are fitted to their own limits beside seven who train as written.
 */
export interface SquadPerson {
  key: string;
  email: string;
  name: string;
  roles: Role[];
  athlete: { dateOfBirth: string; sport: string; position: string | null };
  /** Tested 1RMs in kg (back squat, deadlift), so % of 1RM loads resolve to real loads. */
  squatKg: number;
  deadliftKg: number;
}

const infielder = (key: string, name: string, dateOfBirth: string, position: string, squatKg: number, deadliftKg: number): SquadPerson => ({
  key,
  email: `${name.toLowerCase().replace(' ', '.')}@harborpoint.example`,
  name,
  roles: ['athlete'],
  athlete: { dateOfBirth, sport: 'Softball', position },
  squatKg,
  deadliftKg,
});

export const SQUAD: SquadPerson[] = [
  infielder('tessa', 'Tessa Grant', '2008-07-19', 'Third base', 80, 100),
  infielder('riley', 'Riley Brooks', '2009-02-11', 'First base', 85, 105),
  infielder('hana', 'Hana Sato', '2010-09-03', 'Second base', 60, 75),
  infielder('nia', 'Nia Adeyemi', '2009-11-27', 'Catcher', 90, 110),
  infielder('jade', 'Jade Moreau', '2008-04-08', 'Shortstop', 75, 95),
  infielder('lena', 'Lena Park', '2010-01-30', 'Second base', 62.5, 80),
  infielder('zoe', 'Zoe Alvarez', '2009-06-16', 'Third base', 77.5, 92.5),
  infielder('isla', 'Isla Brennan', '2010-12-02', 'First base', 65, 85),
];

/** Maya's own 1RMs for the squad's lifts (her deadlift baseline is part of her story). */
export const MAYA_SQUAT_KG = 70;

/** Every infielder's tested squat and deadlift, recorded by their coach a few weeks ago. */
export async function squadBaselines(d: DemoDirector, ids: Record<string, string>): Promise<void> {
  const tested = (athleteId: string, exercise: string, loadKg: number) =>
    d.as('coachTheo', recordBaseline, {
      athleteId,
      exerciseId: d.exercise(exercise),
      kind: 'tested',
      loadKg,
      reps: 1,
      rpe: null,
      testedOn: d.day(-30),
    });
  await tested(ids.maya, 'Back squat', MAYA_SQUAT_KG);
  for (const p of SQUAD) {
    await tested(ids[p.key], 'Back squat', p.squatKg);
    await tested(ids[p.key], 'Deadlift', p.deadliftKg);
  }
}

/** Tessa Grant: a right-thigh strain from a sprint to first base, Limited, with a one-stage plan. */
export async function tessasCase(d: DemoDirector, ids: Record<string, string>): Promise<void> {
  const day = d.day;
  const c = await d.as('clinicianMarcus', openCase, {
    athleteId: ids.tessa,
    bodyRegions: ['thigh_right'],
    onsetDate: day(-6),
    diagnosis: 'Hamstring strain, grade I (demo)',
    clinicalNotes: 'Invented demo note: felt a pull at the back of the right thigh running to first; walking comfortably.',
    status: 'limited',
    statusEffectiveFrom: day(-5),
    statusNote: 'Train with the team, but no sprinting or jumping and lighter work bending from the hips.',
    reviewDate: day(8),
  });
  await d.as('clinicianMarcus', createPlan, {
    caseId: c.id,
    stages: [
      {
        id: randomUUID(),
        label: 'Protect the hamstring',
        startDate: day(-5),
        endDate: day(13),
        reviewDate: day(8),
        painCeiling: 2,
        patterns: {
          sprint: { mode: 'blocked' },
          jump: { mode: 'blocked' },
          hinge: { mode: 'capped', caps: { maxPercent1RM: 60, maxRpe: 6 } },
          lunge: { mode: 'capped', caps: { maxRpe: 6, impactAllowed: false } },
        },
      },
    ] as never,
    guidance: 'No sprinting or jumping yet. Hip hinges light and slow; stop if the back of the thigh hurts above 2 out of 10.',
    changeNote: 'Plan at the first visit.',
  });
}

/**
 * The softball infield group, loaded like the rest of the roster (the demo's care teams are rows too):
 * Theo coaches it; Maya and the eight infielders train in it.
 */
export async function squadGroup(m: EntityManager, organizationId: string, ids: Record<string, string>): Promise<string> {
  const group = await m.save(m.create(Group, { organizationId, name: 'Softball infield', kind: 'team', createdBy: null }));
  const members = [
    { memberId: ids.coachTheo, role: 'coach' as const },
    ...[ids.maya, ...SQUAD.map((p) => ids[p.key])].map((memberId) => ({ memberId, role: 'athlete' as const })),
  ];
  for (const member of members) await m.save(m.create(GroupMember, { groupId: group.id, organizationId, ...member }));
  return group.id;
}

/**
 * The infield group and its team program, written once by Theo: a squad session four days out,
 * fitted to each athlete and published to the whole group (Maya's hinge cap and blocked swings and
 * throws, Tessa's blocked sprints and lighter hinge), and a draft for two days later that Theo has not
 * published yet — after Maya's Settle stage ends, so her version of it is as written.
 */
export async function squadTeamProgram(d: DemoDirector, groupId: string): Promise<void> {
  const day = d.day;
  const program = await d.as('coachTheo', createTeamProgram, { groupId, name: 'Softball infield strength' });
  const strength = await d.as('coachTheo', addTeamSession, {
    programId: program.id,
    date: day(4),
    title: 'Lower body and speed',
    unit: 'kg',
    content: d.session([
      { name: 'Back squat', sets: 3, reps: 5, percent: 75, rpe: 7 },
      { name: 'Romanian deadlift', sets: 3, reps: 6, percent: 65, rpe: 6 },
      { name: 'Sprint 20 m', sets: 4, reps: 1, rpe: 8 },
      { name: 'Medicine ball rotational throw', sets: 3, reps: 5, kg: 3, rpe: 6 },
    ]),
  });
  await d.as('coachTheo', publishTeamSessions, { programId: program.id, teamSessionIds: [strength.id], unit: 'kg' });
  await d.as('coachTheo', addTeamSession, {
    programId: program.id,
    date: day(6),
    title: 'Hinge and trunk',
    unit: 'kg',
    content: d.session([
      { name: 'Deadlift', sets: 3, reps: 5, percent: 70, rpe: 7 },
      { name: 'Split squat', sets: 3, reps: 8, kg: 12, rpe: 7 },
      { name: 'Pallof press', sets: 3, reps: 10, kg: 10, rpe: 5 },
    ]),
  });
}
