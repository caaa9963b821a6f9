/** Team programming: groups, team programs, the review grid and each athlete's version. Types only. */
import type { Breach } from '../load/compliance';
import type { ParticipationStatus } from '../load/patterns';
import type { FitChange, FitState, FittedSession } from '../load/team-fit-types';
import type { ProgramSessionDto } from './programs';

export interface GroupPersonDto {
  id: string;
  name: string;
}
export interface GroupDto {
  id: string;
  name: string;
  kind: 'team' | 'position' | 'block';
  coaches: GroupPersonDto[];
  athletes: GroupPersonDto[];
  /** Whether the reader may change the group and its membership (an admin, or one of its coaches). */
  canManage: boolean;
  /** Whether the reader may change who coaches it (admins only). */
  canSetCoaches: boolean;
  /** An archived group is kept for the record: nobody coaches through it any more. */
  archived: boolean;
  version: number;
}

export interface TeamProgramSummaryDto {
  id: string;
  name: string;
  groupId: string;
  groupName: string;
  sessions: number;
  /** The group is archived: the program is kept for the record and changes no more. */
  archived: boolean;
  version: number;
}

/** A team program: its sessions as written (ProgramSessionDto with holds always empty). */
export interface TeamProgramDto extends TeamProgramSummaryDto {
  athletes: GroupPersonDto[];
  teamSessions: ProgramSessionDto[];
}

/** One cell of the review grid: one athlete's version of one team session. */
export interface GridCellDto {
  athleteId: string;
  teamSessionId: string;
  /** The athlete's own session (an ordinary program session); null only before it was first fitted. */
  versionId: string | null;
  state: FitState;
  changes: number;
  overridden: boolean;
  needsReview: boolean;
  /**
   * The coach accepted the current fit (a drop accepted, a re-fit or change looked at): the version's
   * reviewedAt, cleared whenever the fit changes or the version needs review again.
   */
  reviewed: boolean;
  published: boolean;
  /** On hold after a limit change (published and now breaching). */
  held: boolean;
}
export interface TeamGridDto {
  programId: string;
  programName: string;
  groupName: string;
  /** setCount: the team session's sets as written (0: nothing written yet, so nothing to fit). */
  sessions: { id: string; date: string; title: string; status: 'draft' | 'published'; version: number; setCount: number }[];
  athletes: (GroupPersonDto & { statusToday: ParticipationStatus })[];
  cells: GridCellDto[];
}

/** One athlete's version beside the team session, for the line-by-line review. */
export interface TeamVersionDto {
  athleteId: string;
  athleteName: string;
  teamSession: ProgramSessionDto;
  version: ProgramSessionDto;
  state: FitState;
  changes: FitChange[];
  overridden: boolean;
  needsReview: boolean;
  /** The coach accepted the current fit (as on the grid cell). */
  reviewed: boolean;
  /** A re-fit after a limit change, waiting for the coach to accept it. */
  proposal: FittedSession | null;
  /** What the engine says about the version as it stands (blocking ones stop publishing). */
  breaches: Breach[];
}

/** A 422 from publishing a group: who, which session, and what. */
export interface TeamPublishProblemDto {
  athleteId: string;
  athleteName: string;
  teamSessionId: string;
  date: string;
  title: string;
  problems: string[];
}
