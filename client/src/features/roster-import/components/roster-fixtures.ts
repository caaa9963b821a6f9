import type { RosterImportDto } from '../../../../../policies/dto';

/** A roster import as the server reports it, for the component tests. */
export const importDto = (over: Partial<RosterImportDto> = {}): RosterImportDto => ({
  id: '55555555-5555-4555-8555-555555555555',
  status: 'previewed',
  fileName: 'roster.csv',
  totalRows: 5,
  processed: 0,
  created: 0,
  updated: 0,
  unchanged: 0,
  skipped: 0,
  invitations: 0,
  error: null,
  createdAt: '2026-12-05T08:00:00.000Z',
  finishedAt: null,
  ...over,
});
