/**
 * The model of the model-based test: what the test has sent and the app has accepted, kept in plain
 * data so that an independent checker (checker.ts) can say what the limits are on any date. Nothing
 * here imports the app's rules: days, weeks and the organization's calendar are worked out again.
 */

/** The movement patterns the generated plans and exercise edits use (a subset of the app's list). */
export const PATTERNS = ['hinge', 'squat', 'jump'] as const;
export type Pattern = (typeof PATTERNS)[number];
export type Status = 'out' | 'limited' | 'full';

export interface Caps {
  maxPercent1RM?: number;
  maxLoadKg?: number;
  maxRpe?: number;
  maxSetsPerSession?: number;
  maxRepsPerSet?: number;
  maxHardSetsPerWeek?: number;
  impactAllowed?: boolean;
}
export type Rule = { mode: 'blocked' } | { mode: 'free' } | { mode: 'capped'; caps: Caps };

export interface Stage {
  id: string;
  startDate: string;
  endDate: string;
  patterns: Partial<Record<Pattern, Rule>>;
}

export interface CaseM {
  id: string;
  label: string;
  athleteId: string;
  onsetDate: string;
  closed: boolean;
  /** In the order they were recorded: the last one in effect on a day is the case's status that day. */
  statuses: { status: Status; from: string }[];
  plan: { id: string; stages: Stage[] } | null;
}

export interface ExerciseM {
  id: string;
  name: string;
  patterns: Pattern[];
  ballistic: boolean;
  referenceId: string | null;
  archived: boolean;
}

export type Load = { kind: 'kg'; value: number } | { kind: 'percent'; value: number };
export interface SetM {
  id: string;
  reps: number;
  load: Load;
  /** Always given: the model does not re-derive an RPE from %1RM and reps (see checker.ts). */
  targetRpe: number;
}
export interface BlockM {
  id: string;
  exerciseId: string;
  sets: SetM[];
}
export interface SessionView {
  id: string;
  date: string;
  blocks: BlockM[];
}
export interface SessionM extends SessionView {
  label: string;
  programId: string;
  published: boolean;
}

export interface ExceptionM {
  id: string;
  label: string;
  sessionId: string;
  athleteId: string;
  setIds: string[];
  status: 'pending' | 'granted' | 'refused';
  grantedSetIds: string[];
  /** Granted set id → the set as it was when granted (checker.ts `setKey`); a granted set no longer in the session has none. */
  granted: Record<string, string>;
}

export interface BaselineM {
  athleteId: string;
  exerciseId: string;
  e1rmKg: number;
  testedOn: string;
  seq: number;
}

export interface Model {
  zone: string;
  /** The pinned clock, ms since the epoch. */
  now: number;
  athletes: string[];
  programs: { id: string; athleteIds: string[] }[];
  exercises: ExerciseM[];
  baselines: BaselineM[];
  cases: CaseM[];
  sessions: SessionM[];
  exceptions: ExceptionM[];
  seq: number;
  /** One line per step, printed with a failure so a shrunk sequence reads as a story. */
  log: string[];
}

const formatters = new Map<string, Intl.DateTimeFormat>();
function wallClock(zone: string, ms: number): { day: string; hour: number; minute: number } {
  let f = formatters.get(zone);
  if (!f) {
    f = new Intl.DateTimeFormat('en-CA', {
      timeZone: zone,
      year: 'numeric',
      month: '2-digit',
      day: '2-digit',
      hour: '2-digit',
      minute: '2-digit',
      hourCycle: 'h23',
    });
    formatters.set(zone, f);
  }
  const parts = Object.fromEntries(f.formatToParts(new Date(ms)).map((p) => [p.type, p.value]));
  return { day: `${parts.year}-${parts.month}-${parts.day}`, hour: Number(parts.hour), minute: Number(parts.minute) };
}

/** The organization's calendar day at the pinned instant. */
export const todayOf = (m: Pick<Model, 'zone' | 'now'>) => wallClock(m.zone, m.now).day;
export const utcDayOf = (m: Pick<Model, 'now'>) => new Date(m.now).toISOString().slice(0, 10);
export const localTime = (m: Pick<Model, 'zone' | 'now'>) => {
  const w = wallClock(m.zone, m.now);
  return `${w.day} ${String(w.hour).padStart(2, '0')}:${String(w.minute).padStart(2, '0')}`;
};

const QUARTER_HOUR = 15 * 60_000;
/** The first instant after `ms` whose wall clock in `zone` reads hh:mm (every zone offset is whole quarter hours). */
export function nextWallClock(zone: string, ms: number, hh: number, mm: number): number {
  let t = Math.ceil((ms + 1) / QUARTER_HOUR) * QUARTER_HOUR;
  for (let i = 0; i < 4 * 24 * 3; i++, t += QUARTER_HOUR) {
    const w = wallClock(zone, t);
    if (w.hour === hh && w.minute === mm) return t;
  }
  throw new Error(`${zone} never reads ${hh}:${mm} after ${new Date(ms).toISOString()}`);
}

/** The instant the zone's clock reads hh:mm on `day` (the first one, on a day the clock goes back). */
export function wallClockOn(zone: string, day: string, hh: number, mm: number): number {
  // 15 hours before midnight UTC is before the day starts in every zone (UTC−12 to UTC+14).
  let t = Date.parse(`${day}T00:00:00Z`) - 15 * 3_600_000;
  do t = nextWallClock(zone, t, hh, mm);
  while (wallClock(zone, t).day !== day);
  return t;
}

export function addDays(day: string, n: number): string {
  const d = new Date(`${day}T00:00:00Z`);
  d.setUTCDate(d.getUTCDate() + n);
  return d.toISOString().slice(0, 10);
}

/** Monday of the ISO week of a day. */
export function mondayOf(day: string): string {
  const dow = (new Date(`${day}T00:00:00Z`).getUTCDay() + 6) % 7;
  return addDays(day, -dow);
}

export const exerciseOf = (m: Model, id: string) => m.exercises.find((e) => e.id === id)!;
export const programOf = (m: Model, id: string) => m.programs.find((p) => p.id === id)!;
export const athleteLabel = (m: Model, id: string) => String.fromCharCode(65 + m.athletes.indexOf(id));
export const pick = <T>(list: readonly T[], i: number): T => list[i % list.length];
