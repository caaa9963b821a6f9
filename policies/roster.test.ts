import { describe, expect, it } from 'vitest';
import {
  checkRosterFile,
  planRow,
  previewRoster,
  ROSTER_COLUMNS,
  ROSTER_MAX_ROWS,
  rosterTemplateCsv,
  type RosterMember,
  type RosterWorld,
} from './roster';

const TODAY = '2026-12-04';
const header = [...ROSTER_COLUMNS];

/** A record in the template's column order from the cells named. */
function rec(cells: Partial<Record<(typeof ROSTER_COLUMNS)[number], string>>): string[] {
  return ROSTER_COLUMNS.map((c) => cells[c] ?? '');
}

const member = (roles: RosterMember['roles'], more: Partial<RosterMember> = {}): RosterMember => ({
  active: true,
  roles,
  guardianEmails: [],
  coachEmails: [],
  clinicianEmails: [],
  groups: [],
  ...more,
});

function world(): RosterWorld {
  return {
    members: new Map([
      ['coach@school.test', member(['coach'])],
      ['clin@school.test', member(['clinician'])],
    ]),
    groups: new Map([
      ['varsity', { archived: false }],
      ['old squad', { archived: true }],
    ]),
  };
}

const adult = { name: 'Ada Adult', email: 'Ada@School.test', date_of_birth: '2000-01-01' };

describe('checking a roster file', () => {
  it('the template has every column and its example row passes the file checks', () => {
    const [head, row] = rosterTemplateCsv().trim().split('\r\n');
    expect(head.split(',')).toEqual([...ROSTER_COLUMNS]);
    expect(row).toContain('"Varsity; Juniors"');
  });

  it('refuses unknown, missing and repeated columns as problems of the whole file', () => {
    expect(checkRosterFile(['name', 'mail'], [['a', 'b']], TODAY).fileProblems).toEqual([
      "Unknown column: mail. Use the template's columns.",
      'Missing column: email.',
    ]);
    expect(checkRosterFile(['name', 'email', 'Email'], [['a', 'b', 'c']], TODAY).fileProblems).toEqual(['Column named twice: email.']);
    expect(checkRosterFile(header, [], TODAY).fileProblems).toEqual(['The file has no rows under its header.']);
    const many = Array.from({ length: ROSTER_MAX_ROWS + 1 }, () => rec(adult));
    expect(checkRosterFile(header, many, TODAY).fileProblems[0]).toMatch(/5,001 rows/);
  });

  it('takes columns in any order and in any case, and lower-cases e-mails', () => {
    const { rows } = checkRosterFile(['EMAIL', ' Name '], [['Ada@School.test', 'Ada Adult']], TODAY);
    expect(rows[0]).toMatchObject({ row: { line: 2, name: 'Ada Adult', email: 'ada@school.test' }, problems: [] });
  });

  it('names a bad e-mail, a bad or future date and a name with a control character', () => {
    const { rows } = checkRosterFile(
      header,
      [
        rec({ name: 'Bea', email: 'not-an-address' }),
        rec({ name: 'Cal', email: 'cal@school.test', date_of_birth: '2010-02-30' }),
        rec({ name: 'Dee', email: 'dee@school.test', date_of_birth: '2027-01-01' }),
        rec({ name: 'E\u0007d', email: 'ed@school.test' }),
      ],
      TODAY,
    );
    expect(rows.map((r) => r.problems)).toEqual([
      [{ field: 'email', message: 'must be a valid e-mail address' }],
      [{ field: 'date_of_birth', message: 'must be a date (YYYY-MM-DD)' }],
      [{ field: 'date_of_birth', message: 'is in the future' }],
      [{ field: 'name', message: 'must not contain control characters' }],
    ]);
  });

  it('marks the second row with the same e-mail as a duplicate of the first', () => {
    const { rows } = checkRosterFile(header, [rec(adult), rec({ ...adult, email: 'ada@school.test' })], TODAY);
    expect(rows[0].problems).toEqual([]);
    expect(rows[1].problems).toEqual([{ field: 'email', message: 'is already on line 2 of this file' }]);
  });

  it("a minor without a guardian is a problem; minor by the organization's date: 18 on the birthday (AGE_OF_MAJORITY, from memory)", () => {
    const { rows } = checkRosterFile(
      header,
      [
        rec({ name: 'Mia', email: 'mia@school.test', date_of_birth: '2008-12-05' }),
        rec({ name: 'Max', email: 'max@school.test', date_of_birth: '2008-12-04' }),
        rec({
          name: 'Noa',
          email: 'noa@school.test',
          date_of_birth: '2012-05-01',
          guardian1_name: 'Pat',
          guardian1_email: 'pat@home.test',
        }),
      ],
      TODAY,
    );
    expect(rows[0].problems).toEqual([{ field: 'guardian1_email', message: 'is required: the athlete is under 18 on 2026-12-04' }]);
    expect(rows[1].problems).toEqual([]);
    expect(rows[2].problems).toEqual([]);
    expect(rows[2].row.guardians).toEqual([{ name: 'Pat', email: 'pat@home.test' }]);
  });

  it("refuses a guardian without a name, with the athlete's own e-mail, or named twice", () => {
    const { rows } = checkRosterFile(
      header,
      [
        rec({ ...adult, guardian1_email: 'pat@home.test' }),
        rec({ ...adult, email: 'b@school.test', guardian1_name: 'B', guardian1_email: 'b@school.test' }),
        rec({
          ...adult,
          email: 'c@school.test',
          guardian1_name: 'P',
          guardian1_email: 'p@h.test',
          guardian2_name: 'Q',
          guardian2_email: 'P@h.test',
        }),
      ],
      TODAY,
    );
    expect(rows[0].problems).toEqual([{ field: 'guardian1_name', message: 'is required' }]);
    expect(rows[1].problems).toEqual([{ field: 'guardian1_email', message: "must not be the athlete's own e-mail" }]);
    expect(rows[2].problems).toEqual([{ field: 'guardian2_email', message: 'is the same as the other guardian' }]);
  });

  it('splits list cells on ";" and drops blanks and repeats', () => {
    const { rows } = checkRosterFile(
      header,
      [rec({ ...adult, groups: 'Varsity; varsity;; Juniors', coach_emails: 'A@x.test;a@x.test', clinician_emails: ' ' })],
      TODAY,
    );
    expect(rows[0].row).toMatchObject({ groups: ['Varsity', 'Juniors'], coachEmails: ['a@x.test'], clinicianEmails: [] });
  });
});

describe('planning a row against the organization', () => {
  const one = (cells: Parameters<typeof rec>[0], w = world()) => planRow(checkRosterFile(header, [rec(cells)], TODAY).rows[0], w, TODAY);

  it('an unknown coach or clinician, or one in another role, is a problem and the row is skipped', () => {
    const planned = one({ ...adult, coach_emails: 'nobody@school.test', clinician_emails: 'coach@school.test' });
    expect(planned.outcome).toBe('skip');
    expect(planned.problems).toEqual([
      { field: 'coach_emails', message: 'nobody@school.test is not a coach in this organization' },
      { field: 'clinician_emails', message: 'coach@school.test is not a clinician in this organization' },
    ]);
  });

  it('an archived group and a person the organization removed are problems', () => {
    const w = world();
    w.members.set('ada@school.test', member(['athlete'], { active: false }));
    const planned = one({ ...adult, groups: 'Old squad' }, w);
    expect(planned.problems.map((p) => p.field)).toEqual(['email', 'groups']);
  });

  it('a new athlete is created with everything the row names', () => {
    const planned = one({
      ...adult,
      groups: 'Varsity; Juniors',
      coach_emails: 'coach@school.test',
      guardian1_name: 'Pat',
      guardian1_email: 'pat@home.test',
    });
    expect(planned.outcome).toBe('create');
    expect(planned.plan).toEqual({
      athlete: 'create',
      guardians: [{ name: 'Pat', email: 'pat@home.test', step: 'create', link: true }],
      addCoaches: ['coach@school.test'],
      addClinicians: [],
      joinGroups: ['Varsity', 'Juniors'],
      createGroups: ['Juniors'],
    });
  });

  it('an existing athlete with everything linked is unchanged; a missing link makes it an update', () => {
    const w = world();
    w.members.set('ada@school.test', member(['athlete'], { coachEmails: ['coach@school.test'], groups: ['varsity'] }));
    expect(one({ ...adult, groups: 'VARSITY', coach_emails: 'coach@school.test' }, w).outcome).toBe('unchanged');
    const more = one({ ...adult, groups: 'Varsity', coach_emails: 'coach@school.test', clinician_emails: 'clin@school.test' }, w);
    expect(more.outcome).toBe('update');
    expect(more.plan?.addClinicians).toEqual(['clin@school.test']);
  });

  it('a minor already linked to a guardian needs none in the file', () => {
    const w = world();
    w.members.set('mia@school.test', member(['athlete'], { guardianEmails: ['pat@home.test'] }));
    const planned = one({ name: 'Mia', email: 'mia@school.test', date_of_birth: '2012-01-01' }, w);
    expect(planned.problems).toEqual([]);
    expect(planned.outcome).toBe('unchanged');
  });

  it('a staff member named as an athlete gets the athlete role added', () => {
    expect(one({ ...adult, email: 'coach@school.test' }).plan?.athlete).toBe('add_role');
  });
});

describe('previewing a whole file', () => {
  it('a guardian of two athletes is created once; a group started by one row is joined by the next', () => {
    const file = checkRosterFile(
      header,
      [
        rec({
          name: 'Kid One',
          email: 'k1@school.test',
          date_of_birth: '2012-01-01',
          guardian1_name: 'Pat',
          guardian1_email: 'pat@home.test',
          groups: 'Juniors',
        }),
        rec({
          name: 'Kid Two',
          email: 'k2@school.test',
          date_of_birth: '2013-01-01',
          guardian1_name: 'Pat',
          guardian1_email: 'pat@home.test',
          groups: 'juniors',
        }),
        rec({ name: 'Bad', email: 'bad' }),
      ],
      TODAY,
    );
    const { rows, counts } = previewRoster(file, world(), TODAY);
    expect(rows[0].plan?.guardians[0].step).toBe('create');
    expect(rows[1].plan?.guardians[0]).toMatchObject({ step: 'exists', link: true });
    expect(rows[0].plan?.createGroups).toEqual(['Juniors']);
    expect(rows[1].plan?.createGroups).toEqual([]);
    expect(counts).toEqual({ rows: 3, create: 2, update: 0, unchanged: 0, skip: 1 });
  });
});
