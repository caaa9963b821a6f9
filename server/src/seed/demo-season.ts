import { randomUUID } from 'node:crypto';
import type { EntityManager } from 'typeorm';
import type { SessionContent } from '../../../policies/schemas';
import { addDays } from '../../../policies/today';
import { CheckIn, Program, ProgramSession, TrainingLog } from '../entities';

/**
 * Eight weeks of an invented season before the day the demo loads: daily check-ins, three or four
 * training sessions a week per athlete, each published by the coach and logged by the athlete. Rows
 * are written directly (history, not decisions: no audit entries, no notices), with numbers that
 * vary from day to day by a fixed formula, so every load gives the same season relative to its day.
 * The workload charts, monotony and the acute:chronic ratio have something to show from the start.
 */
export const SEASON_DAYS = 56;

export interface SeasonAthlete {
  key: string;
  /** Typical session length and effort (session RPE, CR-10), before the day-to-day variation. */
  minutes: number;
  rpe: number;
  /** Weekdays (0 = the load day's weekday) with a session. */
  days: number[];
  /** The day (negative offset) from which pain rises in the check-ins, for the athlete with a case. */
  painFrom?: number;
  exercises: { name: string; kg: number; reps: number; sets: number }[];
}

export const SEASON: SeasonAthlete[] = [
  {
    key: 'maya',
    minutes: 60,
    rpe: 6,
    days: [1, 3, 5],
    painFrom: -10,
    exercises: [
      { name: 'Romanian deadlift', kg: 50, reps: 6, sets: 3 },
      { name: 'Goblet squat', kg: 20, reps: 8, sets: 3 },
      { name: 'Medicine ball rotational throw', kg: 3, reps: 6, sets: 3 },
    ],
  },
  {
    key: 'jordan',
    minutes: 75,
    rpe: 7,
    days: [0, 2, 4, 6],
    exercises: [
      { name: 'Deadlift', kg: 120, reps: 5, sets: 3 },
      { name: 'Bent-over row', kg: 60, reps: 8, sets: 3 },
    ],
  },
  {
    key: 'sam',
    minutes: 70,
    rpe: 6,
    days: [1, 3, 5],
    painFrom: -9,
    exercises: [
      { name: 'Bench press', kg: 70, reps: 6, sets: 4 },
      { name: 'Pull-up', kg: 0, reps: 8, sets: 3 },
    ],
  },
  {
    key: 'ava',
    minutes: 60,
    rpe: 6,
    days: [1, 3, 5],
    exercises: [
      { name: 'Front squat', kg: 45, reps: 5, sets: 3 },
      { name: 'Dumbbell bench press', kg: 14, reps: 10, sets: 3 },
    ],
  },
  {
    key: 'luis',
    minutes: 90,
    rpe: 7,
    days: [0, 1, 3, 5],
    exercises: [
      { name: 'Back squat', kg: 140, reps: 3, sets: 5 },
      { name: 'Power clean', kg: 95, reps: 2, sets: 5 },
    ],
  },
];

/** A fixed wobble in [-1, 1] for athlete i on day d: the same season on every load. */
function wobble(i: number, d: number, salt: number): number {
  const x = Math.sin((i + 1) * 12.9898 + d * 78.233 + salt * 37.719) * 43758.5453;
  return (x - Math.floor(x)) * 2 - 1;
}

const clamp = (v: number, lo: number, hi: number) => Math.min(hi, Math.max(lo, Math.round(v)));

/**
 * Writes the season for each athlete (ids by demo key) and returns the programs made, by coach key.
 * The last weeks build a little (weeks 7–8 about 15 % above weeks 1–6), as a season does.
 */
export async function loadSeason(
  m: EntityManager,
  organizationId: string,
  today: string,
  ids: Record<string, string>,
  userIds: Record<string, string>,
  programs: { coach: string; name: string; athletes: string[] }[],
): Promise<Map<string, string>> {
  const programIds = new Map<string, string>();
  for (const p of programs) {
    const saved = await m.save(
      m.create(Program, { organizationId, name: p.name, athleteIds: p.athletes.map((a) => ids[a]), createdBy: userIds[p.coach] }),
    );
    for (const a of p.athletes) programIds.set(a, saved.id);
  }
  const exerciseIds = new Map<string, string>(
    ((await m.query(`SELECT id, name FROM exercises WHERE organization_id = $1`, [organizationId])) as { id: string; name: string }[]).map(
      (r) => [r.name, r.id],
    ),
  );
  const checkIns: Partial<CheckIn>[] = [];
  const logs: Partial<TrainingLog>[] = [];
  const sessions: Partial<ProgramSession>[] = [];
  SEASON.forEach((a, i) => {
    const athleteId = ids[a.key];
    for (let d = -SEASON_DAYS; d <= -1; d++) {
      const date = addDays(today, d);
      const hurting = a.painFrom !== undefined && d >= a.painFrom;
      const pain = hurting ? clamp(3 + wobble(i, d, 1), 2, 4) : clamp(0.4 + wobble(i, d, 1), 0, 1);
      if ((i * 7 + d + 100) % 9 !== 0) {
        checkIns.push({
          organizationId,
          athleteId,
          date,
          sleepHours: Math.round((7.75 + wobble(i, d, 2)) * 2) / 2,
          soreness: clamp(3 + 1.5 * wobble(i, d, 3) + (hurting ? 2 : 0), 0, 10),
          readiness: clamp(7 + 1.5 * wobble(i, d, 4) - (hurting ? 2 : 0), 0, 10),
          painNow: pain,
        });
      }
      const weekday = (((d % 7) + 7) % 7) as number;
      if (!a.days.includes(weekday)) continue;
      // A hurt athlete's sessions stop the day the pain starts; their case and plan take over.
      if (hurting) continue;
      const build = d >= -14 ? 1.15 : 1;
      const content: SessionContent = {
        exercises: a.exercises.map((e) => ({
          id: randomUUID(),
          exerciseId: exerciseIds.get(e.name)!,
          notes: null,
          sets: Array.from({ length: e.sets }, () => ({
            id: randomUUID(),
            reps: e.reps,
            load: e.kg === 0 ? { kind: 'bodyweight' as const } : { kind: 'kg' as const, value: e.kg },
            targetRpe: null,
          })),
        })),
      };
      sessions.push({
        organizationId,
        programId: programIds.get(a.key)!,
        date,
        title: a.key === 'jordan' ? 'Erg and strength' : 'Strength',
        content,
        status: 'published',
        publishedAt: new Date(`${addDays(date, -3)}T18:00:00Z`),
      });
      logs.push({
        organizationId,
        athleteId,
        date,
        durationMinutes: clamp(a.minutes * build + 8 * wobble(i, d, 5), 20, 150),
        sessionRpe: clamp(a.rpe + wobble(i, d, 6), 1, 10),
        painBefore: pain,
        painDuring: pain,
        painAfter: pain,
        painNextMorning: pain,
        painCeiling: 5,
        sets: a.exercises.flatMap((e) => Array.from({ length: e.sets }, () => ({ exercise: e.name, loadKg: e.kg, reps: e.reps }))),
        notes: null,
      });
    }
  });
  await m.insert(CheckIn, checkIns);
  await m.insert(ProgramSession, sessions);
  await m.insert(TrainingLog, logs);
  return programIds;
}
