import type { DataSource, EntityManager } from 'typeorm';
import bcrypt from 'bcryptjs';
import type { Role } from '../../../policies/roles';
import { randomUUID } from 'node:crypto';
import { addDays, orgToday } from '../../../policies/today';
import { DEMO_TIME_ZONE } from './demo-zone';
import {
  AthleteProfile,
  CareTeamAssignment,
  CaseRecord,
  GuardianLink,
  Membership,
  Organization,
  ParticipationStatusChange,
  RestrictionPlan,
  RestrictionPlanVersion,
  User,
} from '../entities';
import { appendAudit } from '../services/audit';
import { seedExerciseLibrary } from '../services/exercise-library';
import type { ObjectStorage } from '../storage';
import { attachDemoDocument } from './demo-document';
import type { Config } from '../config';
import type { CoreDeps } from '../core/command';
import { JobQueue, getNoticeQueue, setNoticeQueue } from '../jobs/queue';
import { createLogger } from '../logger';
import { createStorage } from '../storage';
import { loadSeason } from './demo-season';
import { DemoDirector, jordansClosedCase, mayasCase } from './demo-story';
import { demoPlanTemplates } from './demo-templates';
import { upcomingWeek } from './demo-week';
import { SQUAD, squadBaselines, squadGroup, squadTeamProgram, tessasCase } from './demo-squad';
import { loadInjurySeason } from './demo-injuries';

export interface DemoOptions {
  /** The app's configuration: links in the story's letters and e-mails are built from it. */
  config: Config;
  /** bcrypt cost of the demo passwords (tests use a low one). */
  bcryptCost?: number;
  /** Where the demo's referral note goes (default: the configured storage). */
  storage?: ObjectStorage;
  /** Queue the story's e-mails (letters, notices) for the app to send; only with the local fake mail server. */
  mail?: boolean;
}

/** Each coach's programs for the season (one per group of athletes). */
const DEMO_PROGRAMS = [
  { coach: 'coachTheo', name: 'Softball in-season strength', athletes: ['maya'] },
  { coach: 'coachTheo', name: 'Rowing block 3', athletes: ['jordan'] },
  { coach: 'coachRosa', name: 'Court sports strength', athletes: ['sam', 'ava'] },
  { coach: 'coachRosa', name: 'Weightlifting, meet prep', athletes: ['luis'] },
];

/** Invented people in an invented facility; any likeness to real people is accidental. */
export const DEMO_ORG_NAME = 'Harbor Point Performance';
export const DEMO_PASSWORD = 'harbor-point-demo-2026';

interface DemoPerson {
  key: string;
  email: string;
  name: string;
  roles: Role[];
  athlete?: { dateOfBirth: string; sport: string; position: string | null };
}

export const DEMO_PEOPLE: DemoPerson[] = [
  { key: 'admin', email: 'dana.okafor@harborpoint.example', name: 'Dana Okafor', roles: ['admin'] },
  { key: 'coachTheo', email: 'theo.lindqvist@harborpoint.example', name: 'Theo Lindqvist', roles: ['coach'] },
  { key: 'coachRosa', email: 'rosa.delgado@harborpoint.example', name: 'Rosa Delgado', roles: ['coach'] },
  { key: 'clinicianPriya', email: 'priya.raman@harborpoint.example', name: 'Priya Raman, ATC', roles: ['clinician'] },
  { key: 'clinicianMarcus', email: 'marcus.bell@harborpoint.example', name: 'Marcus Bell, DPT', roles: ['clinician'] },
  {
    key: 'maya',
    email: 'maya.torres@harborpoint.example',
    name: 'Maya Torres',
    roles: ['athlete'],
    athlete: { dateOfBirth: '2010-03-14', sport: 'Softball', position: 'Shortstop' },
  },
  {
    key: 'jordan',
    email: 'jordan.pike@harborpoint.example',
    name: 'Jordan Pike',
    roles: ['athlete'],
    athlete: { dateOfBirth: '2007-01-22', sport: 'Rowing', position: 'Stroke seat' },
  },
  {
    key: 'sam',
    email: 'sam.whitfield@harborpoint.example',
    name: 'Sam Whitfield',
    roles: ['athlete'],
    athlete: { dateOfBirth: '2004-08-30', sport: 'Basketball', position: 'Guard' },
  },
  {
    key: 'ava',
    email: 'ava.chen@harborpoint.example',
    name: 'Ava Chen',
    roles: ['athlete'],
    athlete: { dateOfBirth: '2009-05-05', sport: 'Volleyball', position: 'Libero' },
  },
  {
    key: 'luis',
    email: 'luis.romero@harborpoint.example',
    name: 'Luis Romero',
    roles: ['athlete'],
    athlete: { dateOfBirth: '2002-11-09', sport: 'Weightlifting', position: null },
  },
  { key: 'elena', email: 'elena.torres@harborpoint.example', name: 'Elena Torres', roles: ['guardian'] },
  { key: 'wei', email: 'wei.chen@harborpoint.example', name: 'Wei Chen', roles: ['guardian'] },
];

const CARE_TEAMS: [athlete: string, member: string, role: 'coach' | 'clinician'][] = [
  ['maya', 'coachTheo', 'coach'],
  ['maya', 'clinicianPriya', 'clinician'],
  ['jordan', 'coachTheo', 'coach'],
  ['jordan', 'clinicianMarcus', 'clinician'],
  ['sam', 'coachRosa', 'coach'],
  ['sam', 'clinicianMarcus', 'clinician'],
  ['ava', 'coachRosa', 'coach'],
  ['ava', 'clinicianPriya', 'clinician'],
  ['luis', 'coachRosa', 'coach'],
  ['luis', 'clinicianPriya', 'clinician'],
  // The infield squad's coach is Theo through their group (demo-squad.ts); Tessa's clinician is Marcus.
  ['tessa', 'clinicianMarcus', 'clinician'],
];

const GUARDIANS: [athlete: string, guardian: string][] = [
  ['maya', 'elena'],
  ['ava', 'wei'],
];

/**
 * Loads the demo scenario once. Idempotent: when the organization exists nothing changes, so a
 * second `npm start` leaves the data (and the audit trail) as it was.
 */
export async function loadDemo(ds: DataSource, opts: DemoOptions): Promise<{ created: boolean; organizationId: string }> {
  const existing = await ds.getRepository(Organization).findOneBy({ name: DEMO_ORG_NAME });
  if (existing) return { created: false, organizationId: existing.id };
  const { bcryptCost = 12, storage } = opts;
  const hash = await bcrypt.hash(DEMO_PASSWORD, bcryptCost);
  const logger = createLogger('warn');
  // The story's e-mails (letters, notices) go through a queue of their own, sent by the app once it runs.
  const jobs = opts.mail ? new JobQueue(opts.config.DATABASE_URL, logger) : null;
  await jobs?.start();
  const before = getNoticeQueue();
  setNoticeQueue(jobs);
  try {
    return { created: true, organizationId: await loadAll() };
  } finally {
    setNoticeQueue(before);
    await jobs?.stop();
  }

  async function loadAll(): Promise<string> {
    return ds.transaction(async (m: EntityManager) => {
      // Re-checked under a lock so two starts at once cannot both load the demo.
      await m.query(`SELECT pg_advisory_xact_lock(hashtextextended('loadline:demo', 0))`);
      const again = await m.findOneBy(Organization, { name: DEMO_ORG_NAME });
      if (again) return again.id;
      const org = await m.save(
        m.create(Organization, { name: DEMO_ORG_NAME, country: 'US', emergencyNumber: '911', timeZone: DEMO_TIME_ZONE }),
      );
      const ids: Record<string, string> = {};
      const userIds: Record<string, string> = {};
      for (const p of [...DEMO_PEOPLE, ...SQUAD]) {
        const user = await m.save(
          m.create(User, { email: p.email, displayName: p.name, passwordHash: hash, unitPref: p.key === 'maya' ? 'lb' : 'kg' }),
        );
        const membership = await m.save(m.create(Membership, { organizationId: org.id, userId: user.id, roles: p.roles, active: true }));
        ids[p.key] = membership.id;
        userIds[p.key] = user.id;
        if (p.athlete) {
          await m.save(m.create(AthleteProfile, { id: membership.id, organizationId: org.id, ...p.athlete }));
        }
      }
      for (const [athlete, member, role] of CARE_TEAMS) {
        await m.save(m.create(CareTeamAssignment, { organizationId: org.id, athleteId: ids[athlete], memberId: ids[member], role }));
      }
      for (const [athlete, guardian] of GUARDIANS) {
        await m.save(m.create(GuardianLink, { organizationId: org.id, athleteId: ids[athlete], guardianId: ids[guardian] }));
      }
      await seedExerciseLibrary(m, org.id);
      const caseId = await loadDemoCase(m, org.id, ids, userIds);
      const today = orgToday(DEMO_TIME_ZONE);
      const programs = await loadSeason(m, org.id, today, ids, userIds, DEMO_PROGRAMS);
      const deps: CoreDeps = { ds, config: opts.config, logger, jobs, storage: storage ?? createStorage(opts.config) };
      const director = new DemoDirector(m, deps, org.id, userIds, day);
      await director.init();
      await jordansClosedCase(director, ids);
      await mayasCase(director, ids, programs.get('maya')!);
      await upcomingWeek(director, programs);
      const squadGroupId = await squadGroup(m, org.id, ids);
      await loadInjurySeason(m, org.id, today, squadGroupId, ids, ['maya', ...SQUAD.map((p) => p.key)]);
      await squadBaselines(director, ids);
      await tessasCase(director, ids);
      await squadTeamProgram(director, squadGroupId);
      await demoPlanTemplates(director);
      if (storage) {
        await attachDemoDocument(m, storage, {
          organizationId: org.id,
          athleteId: ids.sam,
          caseId,
          athleteName: 'Sam Whitfield',
          date: day(-8),
          uploadedByUserId: userIds.clinicianMarcus,
          uploadedByName: 'Marcus Bell, DPT',
        });
      }
      await appendAudit(m, {
        organizationId: org.id,
        actorUserId: null,
        action: 'demo.loaded',
        subjectType: 'Organization',
        subjectId: org.id,
        after: { people: DEMO_PEOPLE.length + SQUAD.length, careTeamAssignments: CARE_TEAMS.length, guardianLinks: GUARDIANS.length },
      });
      return org.id;
    });
  }
}

/** A day of the demo counted from the organization's today (policies/today.ts). */
const day = (offset: number) => addDays(orgToday(DEMO_TIME_ZONE), offset);

/**
 * One case already under way, so coaches and the admin see a limited athlete from the first start:
 * Sam's right ankle, a two-stage plan dated around the day the demo was loaded.
 */
async function loadDemoCase(
  m: EntityManager,
  organizationId: string,
  ids: Record<string, string>,
  userIds: Record<string, string>,
): Promise<string> {
  const c = await m.save(
    m.create(CaseRecord, {
      organizationId,
      athleteId: ids.sam,
      bodyRegions: ['ankle_foot_right'],
      onsetDate: day(-9),
      diagnosis: 'Lateral ankle sprain, grade I (demo)',
      clinicalNotes: 'Invented demo note: rolled ankle on landing in practice; swelling settling.',
      reviewDate: day(6),
      openedBy: userIds.clinicianMarcus,
    }),
  );
  await m.save(
    m.create(ParticipationStatusChange, {
      organizationId,
      athleteId: ids.sam,
      caseId: c.id,
      status: 'out',
      effectiveFrom: day(-9),
      note: 'Rest the ankle for a few days.',
      setBy: userIds.clinicianMarcus,
    }),
  );
  await m.save(
    m.create(ParticipationStatusChange, {
      organizationId,
      athleteId: ids.sam,
      caseId: c.id,
      status: 'limited',
      effectiveFrom: day(-5),
      note: 'Upper body and careful lower body work only.',
      setBy: userIds.clinicianMarcus,
    }),
  );
  const plan = await m.save(m.create(RestrictionPlan, { organizationId, athleteId: ids.sam, caseId: c.id, version: 1 }));
  const stages = [
    {
      id: randomUUID(),
      label: 'Protect',
      startDate: day(-5),
      endDate: day(6),
      reviewDate: day(6),
      painCeiling: 3,
      patterns: {
        jump: { mode: 'blocked' as const },
        sprint: { mode: 'blocked' as const },
        squat: { mode: 'capped' as const, caps: { maxPercent1RM: 50, maxRpe: 6, maxSetsPerSession: 3, impactAllowed: false } },
        lunge: { mode: 'blocked' as const },
        hinge: { mode: 'capped' as const, caps: { maxPercent1RM: 60, maxRpe: 7 } },
      },
    },
    {
      id: randomUUID(),
      label: 'Rebuild',
      startDate: day(7),
      endDate: day(27),
      reviewDate: day(27),
      painCeiling: 4,
      patterns: {
        jump: { mode: 'capped' as const, caps: { maxSetsPerSession: 3, maxRepsPerSet: 5 } },
        sprint: { mode: 'capped' as const, caps: { maxRpe: 6 } },
        squat: { mode: 'capped' as const, caps: { maxPercent1RM: 75, maxRpe: 8 } },
        lunge: { mode: 'capped' as const, caps: { maxLoadKg: 20, impactAllowed: false } },
      },
    },
  ];
  await m.save(
    m.create(RestrictionPlanVersion, {
      planId: plan.id,
      version: 1,
      stages,
      guidance: 'Keep the ankle quiet this week: no jumping or sprinting. Upper body as normal.',
      changeNote: 'Demo plan',
      createdBy: userIds.clinicianMarcus,
    }),
  );
  return c.id;
}
