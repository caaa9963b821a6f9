/** Programming: exercises, baselines, programs, sessions, exceptions, roster and today. Response shapes shared by server and client; types only. */
import type { Breach } from '../load/compliance';
import type { DayInWords } from '../load/day-words';
import type { MovementPattern, ParticipationStatus } from '../load/patterns';
import type { LoadSteps } from '../load/steps';
import type { Unit } from '../schemas/common';
import type { SessionContent } from '../schemas/programs';

export interface ExerciseDto {
  id: string;
  name: string;
  patterns: MovementPattern[];
  equipment: string;
  ballistic: boolean;
  steps: LoadSteps;
  referenceId: string | null;
  /** Exercises to use instead when this one is not allowed, in order of preference (ids in this library). */
  useInstead: string[];
  archived: boolean;
  version: number;
}
export interface BaselineDto {
  id: string;
  athleteId: string;
  exerciseId: string;
  exerciseName: string;
  kind: 'tested' | 'estimated' | 'logged';
  loadKg: number;
  reps: number;
  rpe: number | null;
  e1rmKg: number;
  formula: string;
  lowReliability: boolean;
  testedOn: string;
}
export interface ProgramSessionDto {
  id: string;
  programId: string;
  programName: string;
  date: string;
  title: string;
  content: SessionContent;
  status: 'draft' | 'published';
  publishedAt: string | null;
  version: number;
  /** Athletes for whom this published session is on hold after a plan change, with why. */
  holds: { athleteId: string; breaches: Breach[] }[];
}
export interface ProgramDto {
  id: string;
  name: string;
  athleteIds: string[];
  athleteNames: string[];
  version: number;
  createdAt: string;
  sessions: ProgramSessionDto[];
}
export interface ExceptionDto {
  id: string;
  sessionId: string;
  sessionDate: string;
  sessionTitle: string;
  athleteId: string;
  athleteName: string;
  setIds: string[];
  reason: string;
  requestedByName: string | null;
  status: 'pending' | 'granted' | 'refused';
  grantedSetIds: string[];
  decidedByName: string | null;
  decidedAt: string | null;
  decisionNote: string | null;
  createdAt: string;
}
export interface RosterRowDto {
  athleteId: string;
  athleteName: string;
  status: ParticipationStatus;
  /** Plain-words caps in force today (restricted patterns only). */
  limitsToday: string[];
  sessionsOnHold: number;
  pendingExceptions: number;
  nextSession: { id: string; date: string; title: string } | null;
}
export interface TodayDto {
  athleteId: string;
  date: string;
  unit: Unit;
  sessions: (ProgramSessionDto & { onHold: boolean; exerciseNames: Record<string, string>; loadsKg: Record<string, number | null> })[];
}
/** "My week": the coming seven days from the organization's today, each with its sessions and limits in the athlete's words. */
export interface AthleteWeekDto {
  athleteId: string;
  from: string;
  to: string;
  unit: Unit;
  days: {
    date: string;
    status: ParticipationStatus;
    /** The plan stages covering the day; none on a day no plan covers. */
    stages: { label: string | null; startDate: string; endDate: string }[];
    painCeiling: number;
    limits: DayInWords;
    sessions: TodayDto['sessions'];
  }[];
}
