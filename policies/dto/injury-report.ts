/** Response shapes of the injury report and of team session hours. Types only. */
import type { InjuryReport } from '../load/injury-report';
import type { TeamSessionKind } from '../schemas/injury-report';

export type InjuryReportDto = InjuryReport;

export interface TeamSessionHoursDto {
  id: string;
  groupId: string;
  date: string;
  minutes: number;
  kind: TeamSessionKind;
  /** How many athletes were present (the names stay with the group's own page). */
  present: number;
  athleteIds: string[];
}
