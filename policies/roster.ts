import { DisplayNameSchema, EmailSchema, IsoDateSchema, line } from './schemas/common';
import { AGE_OF_MAJORITY, isMinor, type Role } from './roles';

/**
 * Bringing a roster: the checks of each CSV row and what importing it would do, with no I/O, so the
 * preview (before anything is written) and the import itself (row by row, against the database as it
 * is then) judge a row by the very same rules. Importing the same file twice changes nothing: people
 * are matched by e-mail and every link is added only when missing.
 */

/** The template's columns, in its order. Lists inside a cell are separated by ";". */
export const ROSTER_COLUMNS = [
  'name',
  'email',
  'date_of_birth',
  'sport',
  'position',
  'groups',
  'guardian1_name',
  'guardian1_email',
  'guardian2_name',
  'guardian2_email',
  'coach_emails',
  'clinician_emails',
] as const;
export type RosterColumn = (typeof ROSTER_COLUMNS)[number];
const REQUIRED_COLUMNS: RosterColumn[] = ['name', 'email'];

/** Upload limits: a season's roster of a large school fits many times over. */
export const ROSTER_MAX_BYTES = 2 * 1024 * 1024;
export const ROSTER_MAX_ROWS = 5000;
/** At most this many entries in one list cell (groups, coaches, clinicians). */
const MAX_LIST = 10;

/** The template an admin downloads: the header and one example row (a minor with a guardian). */
export function rosterTemplateCsv(): string {
  const example = [
    'Sam Example',
    'sam@example.org',
    '2010-04-02',
    'Rowing',
    'Stroke',
    'Varsity; Juniors',
    'Alex Example',
    'alex@example.org',
    '',
    '',
    'coach@example.org',
    'clinician@example.org',
  ];
  return `${ROSTER_COLUMNS.join(',')}\r\n${example.map((v) => (/[,;"]/.test(v) ? `"${v}"` : v)).join(',')}\r\n`;
}

export interface RosterGuardian {
  name: string;
  email: string;
}

/** One row as read, normalised (e-mails lower-cased, lists split, blanks dropped). */
export interface RosterRow {
  /** The line in the file (the header is line 1). */
  line: number;
  name: string;
  email: string;
  dateOfBirth: string | null;
  sport: string | null;
  position: string | null;
  groups: string[];
  guardians: RosterGuardian[];
  coachEmails: string[];
  clinicianEmails: string[];
}

export interface RosterProblem {
  field: RosterColumn;
  message: string;
}

export interface CheckedRow {
  row: RosterRow;
  problems: RosterProblem[];
}

export interface CheckedFile {
  /** Problems of the file as a whole (header, size): nothing can be imported until they are fixed. */
  fileProblems: string[];
  rows: CheckedRow[];
}

const NameSchema = DisplayNameSchema.refine((v) => !/\p{Cc}/u.test(v), { message: 'must not contain control characters' });
const ShortText = line(80).refine((v) => !/\p{Cc}/u.test(v), { message: 'must not contain control characters' });
const GroupName = line(120).refine((v) => !/\p{Cc}/u.test(v), { message: 'must not contain control characters' });

const first = (r: { success: boolean; error?: { issues: { message: string }[] } }) => r.error?.issues[0]?.message ?? 'is not valid';
const list = (cell: string) =>
  cell
    .split(';')
    .map((v) => v.trim())
    .filter((v) => v !== '');

/**
 * Reads the header and the records (as a CSV parser gives them: arrays of cells) and checks what can be
 * checked from the file alone: required cells, e-mail, name and date formats, a date of birth in the
 * future, duplicates within the file. `today` is the organization's local date (policies/today.ts).
 */
export function checkRosterFile(header: string[], records: string[][], today: string): CheckedFile {
  const names = header.map((h) => h.trim().toLowerCase());
  const fileProblems: string[] = [];
  const unknown = names.filter((n) => !(ROSTER_COLUMNS as readonly string[]).includes(n));
  if (unknown.length)
    fileProblems.push(`Unknown column${unknown.length > 1 ? 's' : ''}: ${unknown.join(', ')}. Use the template's columns.`);
  const missing = REQUIRED_COLUMNS.filter((c) => !names.includes(c));
  if (missing.length) fileProblems.push(`Missing column${missing.length > 1 ? 's' : ''}: ${missing.join(', ')}.`);
  const repeated = names.filter((n, i) => names.indexOf(n) !== i);
  if (repeated.length) fileProblems.push(`Column${repeated.length > 1 ? 's' : ''} named twice: ${[...new Set(repeated)].join(', ')}.`);
  if (records.length === 0) fileProblems.push('The file has no rows under its header.');
  if (records.length > ROSTER_MAX_ROWS)
    fileProblems.push(
      `The file has ${records.length.toLocaleString('en-US')} rows; split it into files of at most ${ROSTER_MAX_ROWS.toLocaleString('en-US')}.`,
    );
  if (fileProblems.length) return { fileProblems, rows: [] };

  const firstLineOf = new Map<string, number>();
  const rows = records.map((cells, i) => {
    const cell = (c: RosterColumn) => {
      const at = names.indexOf(c);
      return at < 0 ? '' : (cells[at] ?? '').trim();
    };
    const problems: RosterProblem[] = [];
    const problem = (field: RosterColumn, message: string) => problems.push({ field, message });
    const lineNo = i + 2;

    const name = NameSchema.safeParse(cell('name'));
    if (!name.success) problem('name', first(name));
    const email = EmailSchema.safeParse(cell('email'));
    if (!email.success) problem('email', first(email));
    else {
      const earlier = firstLineOf.get(email.data);
      if (earlier !== undefined) problem('email', `is already on line ${earlier} of this file`);
      else firstLineOf.set(email.data, lineNo);
    }

    let dateOfBirth: string | null = null;
    if (cell('date_of_birth')) {
      const dob = IsoDateSchema.safeParse(cell('date_of_birth'));
      if (!dob.success) problem('date_of_birth', first(dob));
      else if (dob.data > today) problem('date_of_birth', 'is in the future');
      else dateOfBirth = dob.data;
    }

    const optional = (c: 'sport' | 'position') => {
      if (!cell(c)) return null;
      const v = ShortText.safeParse(cell(c));
      if (!v.success) problem(c, first(v));
      return v.success ? v.data : null;
    };
    const sport = optional('sport');
    const position = optional('position');

    const groups: string[] = [];
    for (const g of list(cell('groups'))) {
      const v = GroupName.safeParse(g);
      if (!v.success) problem('groups', `"${g.slice(0, 40)}" ${first(v)}`);
      else if (!groups.some((x) => x.toLowerCase() === v.data.toLowerCase())) groups.push(v.data);
    }
    if (groups.length > MAX_LIST) problem('groups', `must name at most ${MAX_LIST} groups`);

    const guardians: RosterGuardian[] = [];
    for (const n of [1, 2] as const) {
      const nameCol = `guardian${n}_name` as const;
      const emailCol = `guardian${n}_email` as const;
      if (!cell(nameCol) && !cell(emailCol)) continue;
      const gName = NameSchema.safeParse(cell(nameCol));
      const gEmail = EmailSchema.safeParse(cell(emailCol));
      if (!gName.success) problem(nameCol, first(gName));
      if (!gEmail.success) problem(emailCol, first(gEmail));
      else if (email.success && gEmail.data === email.data) problem(emailCol, "must not be the athlete's own e-mail");
      else if (guardians.some((g) => g.email === gEmail.data)) problem(emailCol, 'is the same as the other guardian');
      if (gName.success && gEmail.success) guardians.push({ name: gName.data, email: gEmail.data });
    }
    if (dateOfBirth && isMinor(dateOfBirth, today) && guardians.length === 0 && !problems.some((p) => p.field.startsWith('guardian')))
      problem('guardian1_email', `is required: the athlete is under ${AGE_OF_MAJORITY} on ${today}`);

    const emails = (c: 'coach_emails' | 'clinician_emails') => {
      const out: string[] = [];
      for (const e of list(cell(c))) {
        const v = EmailSchema.safeParse(e);
        if (!v.success) problem(c, `"${e.slice(0, 60)}" ${first(v)}`);
        else if (!out.includes(v.data)) out.push(v.data);
      }
      if (out.length > MAX_LIST) problem(c, `must name at most ${MAX_LIST} people`);
      return out;
    };
    const coachEmails = emails('coach_emails');
    const clinicianEmails = emails('clinician_emails');

    const row: RosterRow = {
      line: lineNo,
      name: name.success ? name.data : cell('name'),
      email: email.success ? email.data : cell('email'),
      dateOfBirth,
      sport,
      position,
      groups,
      guardians,
      coachEmails,
      clinicianEmails,
    };
    return { row, problems };
  });
  return { fileProblems, rows };
}

/** A member of the organization as the roster sees them, keyed by e-mail. */
export interface RosterMember {
  active: boolean;
  roles: Role[];
  /** For athletes: who is already linked (e-mails) and the groups they are in (lower-cased names). */
  guardianEmails: string[];
  coachEmails: string[];
  clinicianEmails: string[];
  groups: string[];
}

/** The organization as it is: its members by e-mail and its groups by lower-cased name. */
export interface RosterWorld {
  members: Map<string, RosterMember>;
  groups: Map<string, { archived: boolean }>;
}

export type PersonStep = 'create' | 'add_role' | 'exists';

/** What importing one row does; every list holds only what is missing now. */
export interface RosterPlan {
  athlete: PersonStep;
  guardians: (RosterGuardian & { step: PersonStep; link: boolean })[];
  addCoaches: string[];
  addClinicians: string[];
  joinGroups: string[];
  createGroups: string[];
}

export type RowOutcome = 'create' | 'update' | 'unchanged' | 'skip';

export interface PlannedRow extends CheckedRow {
  plan: RosterPlan | null;
  outcome: RowOutcome;
}

const stepFor = (member: RosterMember | undefined, role: Role): PersonStep =>
  !member ? 'create' : member.roles.includes(role) ? 'exists' : 'add_role';

/**
 * Judges a checked row against the organization: coaches and clinicians must be its members in that
 * role; a person it removed is not brought back by a file; an archived group is not joined; a minor
 * needs a guardian in the file or already linked. Then lists what is missing (the plan); a row with
 * nothing missing is "unchanged", which is what makes a second import of the same file a no-op.
 */
export function planRow(checked: CheckedRow, world: RosterWorld, today: string): PlannedRow {
  const problems = [...checked.problems];
  const { row } = checked;
  const problem = (field: RosterColumn, message: string) => problems.push({ field, message });
  const athlete = world.members.get(row.email);
  if (athlete && !athlete.active) problem('email', 'belongs to someone removed from this organization; invite them again from People');

  const staff = (emails: string[], role: 'coach' | 'clinician', field: RosterColumn) => {
    for (const e of emails) {
      const m = world.members.get(e);
      if (!m || !m.active || !m.roles.includes(role)) problem(field, `${e} is not a ${role} in this organization`);
    }
  };
  staff(row.coachEmails, 'coach', 'coach_emails');
  staff(row.clinicianEmails, 'clinician', 'clinician_emails');

  row.guardians.forEach((g, i) => {
    const m = world.members.get(g.email);
    if (m && !m.active) problem(i === 0 ? 'guardian1_email' : 'guardian2_email', 'belongs to someone removed from this organization');
  });
  for (const g of row.groups) {
    if (world.groups.get(g.toLowerCase())?.archived) problem('groups', `"${g}" is an archived group`);
  }
  const dob = row.dateOfBirth;
  if (
    dob &&
    isMinor(dob, today) &&
    row.guardians.length === 0 &&
    athlete?.guardianEmails.length &&
    problems.some((p) => p.field === 'guardian1_email' && p.message.startsWith('is required'))
  ) {
    // Already linked to a guardian in the organization: the file need not name them again.
    problems.splice(
      problems.findIndex((p) => p.field === 'guardian1_email'),
      1,
    );
  }
  if (problems.length) return { ...checked, problems, plan: null, outcome: 'skip' };

  const has = (list: string[] | undefined, v: string) => (list ?? []).includes(v);
  const plan: RosterPlan = {
    athlete: stepFor(athlete, 'athlete'),
    guardians: row.guardians
      .map((g) => ({ ...g, step: stepFor(world.members.get(g.email), 'guardian'), link: !has(athlete?.guardianEmails, g.email) }))
      .filter((g) => g.step !== 'exists' || g.link),
    addCoaches: row.coachEmails.filter((e) => !has(athlete?.coachEmails, e)),
    addClinicians: row.clinicianEmails.filter((e) => !has(athlete?.clinicianEmails, e)),
    joinGroups: row.groups.filter((g) => !has(athlete?.groups, g.toLowerCase())),
    createGroups: row.groups.filter((g) => !world.groups.has(g.toLowerCase())),
  };
  const changes =
    plan.athlete !== 'exists' || plan.guardians.length + plan.addCoaches.length + plan.addClinicians.length + plan.joinGroups.length > 0;
  return { ...checked, problems, plan, outcome: plan.athlete === 'create' ? 'create' : changes ? 'update' : 'unchanged' };
}

/** What a plan does, in words for the preview: "creates the athlete; invites 1 guardian; joins Varsity". */
export function planWords(plan: RosterPlan): string[] {
  const words: string[] = [];
  if (plan.athlete === 'create') words.push('adds the athlete and sends an invitation');
  if (plan.athlete === 'add_role') words.push('makes this member an athlete too');
  for (const g of plan.guardians) {
    if (g.step === 'create') words.push(`adds guardian ${g.name} and sends an invitation`);
    else if (g.step === 'add_role') words.push(`makes ${g.email} a guardian`);
    else words.push(`links guardian ${g.email}`);
  }
  if (plan.addCoaches.length) words.push(`puts ${plan.addCoaches.join(', ')} on the care team as coach`);
  if (plan.addClinicians.length) words.push(`puts ${plan.addClinicians.join(', ')} on the care team as clinician`);
  const joining = plan.joinGroups.filter((g) => !plan.createGroups.includes(g));
  if (plan.createGroups.length) words.push(`starts group${plan.createGroups.length > 1 ? 's' : ''} ${plan.createGroups.join(', ')}`);
  if (joining.length || plan.createGroups.length) words.push(`joins ${plan.joinGroups.join(', ')}`);
  return words;
}

/** Applies a row's plan to the world, so the rows after it in the same file see what it made. */
export function applyToWorld(world: RosterWorld, row: RosterRow, plan: RosterPlan): void {
  const member = (email: string, role: Role): RosterMember => {
    let m = world.members.get(email);
    if (!m) {
      m = { active: true, roles: [], guardianEmails: [], coachEmails: [], clinicianEmails: [], groups: [] };
      world.members.set(email, m);
    }
    if (!m.roles.includes(role)) m.roles.push(role);
    return m;
  };
  const a = member(row.email, 'athlete');
  for (const g of plan.guardians) {
    member(g.email, 'guardian');
    if (!a.guardianEmails.includes(g.email)) a.guardianEmails.push(g.email);
  }
  a.coachEmails.push(...plan.addCoaches);
  a.clinicianEmails.push(...plan.addClinicians);
  for (const g of plan.createGroups) world.groups.set(g.toLowerCase(), { archived: false });
  a.groups.push(...plan.joinGroups.map((g) => g.toLowerCase()));
}

export interface RosterCounts {
  rows: number;
  create: number;
  update: number;
  unchanged: number;
  skip: number;
}

/** The preview of a whole file: each row planned in order, later rows seeing what earlier rows would make. */
export function previewRoster(file: CheckedFile, world: RosterWorld, today: string): { rows: PlannedRow[]; counts: RosterCounts } {
  const counts: RosterCounts = { rows: file.rows.length, create: 0, update: 0, unchanged: 0, skip: 0 };
  const rows = file.rows.map((checked) => {
    const planned = planRow(checked, world, today);
    if (planned.plan) applyToWorld(world, planned.row, planned.plan);
    counts[planned.outcome] += 1;
    return planned;
  });
  return { rows, counts };
}
