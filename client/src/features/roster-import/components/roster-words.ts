import type { RosterColumn, RosterProblem, RowOutcome } from '../../../../../policies/roster';
import type { RosterImportDto } from '../../../../../policies/dto';
import { fieldSentence } from '../../../lib/form-errors';

/**
 * How the roster page reads: each template column (policies/roster.ts ROSTER_COLUMNS, the list the
 * server reads uploads with) with a label and what goes in it, each row's outcome as a word plus a
 * glyph (never colour alone), and each problem as a sentence naming its column.
 */
export const COLUMN_WORDS: Record<RosterColumn, { label: string; says: string }> = {
  name: { label: 'Name', says: "The athlete's full name. Required." },
  email: { label: 'E-mail', says: 'Where their invitation goes. Required; a person already here is matched by it.' },
  date_of_birth: { label: 'Date of birth', says: 'As YYYY-MM-DD. An athlete under 18 needs a guardian in the file or already linked.' },
  sport: { label: 'Sport', says: 'Optional.' },
  position: { label: 'Position', says: 'Optional.' },
  groups: { label: 'Groups', says: 'Optional, separated by ";". A group not yet here is started.' },
  guardian1_name: { label: 'Guardian 1 name', says: "A parent's or guardian's name." },
  guardian1_email: { label: 'Guardian 1 e-mail', says: 'They are invited as guardian and linked to the athlete.' },
  guardian2_name: { label: 'Guardian 2 name', says: 'Optional, a second guardian.' },
  guardian2_email: { label: 'Guardian 2 e-mail', says: 'Optional.' },
  coach_emails: { label: 'Coach e-mails', says: 'Optional, separated by ";". Each must already be a coach here.' },
  clinician_emails: { label: 'Clinician e-mails', says: 'Optional, separated by ";". Each must already be a clinician here.' },
};

/** List cells name the entry at fault first ("x@y is not a coach…"), so their label leads with a colon. */
const LIST_COLUMNS: RosterColumn[] = ['groups', 'coach_emails', 'clinician_emails'];

export function problemSentence({ field, message }: RosterProblem): string {
  const label = COLUMN_WORDS[field]?.label ?? field;
  const sentence = LIST_COLUMNS.includes(field) ? `${label}: ${message}` : (fieldSentence(label, message) ?? label);
  return /[.!?]$/.test(sentence) ? sentence : `${sentence}.`;
}

export const OUTCOME_WORDS: Record<RowOutcome, { word: string; glyph: string }> = {
  create: { word: 'New', glyph: '+' },
  update: { word: 'Already here, adds what is missing', glyph: '~' },
  unchanged: { word: 'Already here, nothing to change', glyph: '=' },
  skip: { word: 'Left out: has problems', glyph: '▲' },
};

export const rowsWord = (n: number) => `${n.toLocaleString('en-US')} ${n === 1 ? 'row' : 'rows'}`;

/** The result of a finished import, one line per count, in the order a person asks about them. */
export function summaryFacts(r: RosterImportDto): Array<{ label: string; value: string }> {
  const n = (v: number) => v.toLocaleString('en-US');
  return [
    { label: 'Rows in the file', value: n(r.totalRows) },
    { label: 'Athletes added', value: n(r.created) },
    { label: 'Already here, completed', value: n(r.updated) },
    { label: 'Already here, unchanged', value: n(r.unchanged) },
    { label: 'Left out (problems)', value: n(r.skipped) },
    { label: 'Invitations queued', value: n(r.invitations) },
  ];
}
