import type { RosterCounts, RosterProblem, RowOutcome } from '../roster';

/** One row of a roster preview: who, what is wrong, and what importing it would do (in words). */
export interface RosterPreviewRowDto {
  line: number;
  name: string;
  email: string;
  outcome: RowOutcome;
  problems: RosterProblem[];
  does: string[];
}

export type RosterImportStatusName = 'previewed' | 'queued' | 'running' | 'done' | 'failed';

/** A roster import's state, polled by the page while the background job runs. */
export interface RosterImportDto {
  id: string;
  status: RosterImportStatusName;
  fileName: string | null;
  totalRows: number;
  processed: number;
  created: number;
  updated: number;
  unchanged: number;
  skipped: number;
  invitations: number;
  error: string | null;
  createdAt: string;
  finishedAt: string | null;
}

/** The answer to an upload: the import (not started) and its preview. */
export interface RosterPreviewDto {
  import: RosterImportDto;
  counts: RosterCounts;
  rows: RosterPreviewRowDto[];
}

/** The admin's last checked file that is not imported yet, or none (a reload of the page shows it again). */
export interface RosterLastCheckDto {
  preview: RosterPreviewDto | null;
}
