import { describe, expect, it } from 'vitest';
import { noRedFlags, RED_FLAG_ITEMS } from '../red-flags';
import {
  CheckInSchema,
  FlagListQuerySchema,
  LoggedSetSchema,
  NextMorningSchema,
  PainReportCreateSchema,
  PainScoreSchema,
  SessionRpeSchema,
  SetRpeSchema,
  TrainingLogCreateSchema,
} from './athlete';

const ATHLETE = '33333333-3333-4333-8333-333333333333';

/** Issues of a failed parse as { 'joined.path': message }, the way the API names fields. */
function issues(result: {
  success: boolean;
  error?: { issues: { path: PropertyKey[]; message: string; code: string; keys?: string[] }[] };
}) {
  expect(result.success).toBe(false);
  const out: Record<string, string> = {};
  for (const i of result.error!.issues) {
    const path = i.path.map(String).join('.');
    if (i.code === 'unrecognized_keys') for (const k of i.keys!) out[path ? `${path}.${k}` : k] = 'unrecognized';
    else out[path] = i.message;
  }
  return out;
}

const allNo = () => Object.fromEntries(RED_FLAG_ITEMS.map((i) => [i.id, false]));
const report = (over: Record<string, unknown> = {}) => ({
  athleteId: ATHLETE,
  bodyRegions: ['lower_back'],
  painNow: 4,
  painWorst24h: 6,
  onsetDate: '2026-01-05',
  startedInTraining: true,
  redFlags: allNo(),
  ...over,
});
const log = (over: Record<string, unknown> = {}) => ({
  athleteId: ATHLETE,
  date: '2026-01-05',
  durationMinutes: 60,
  sessionRpe: 5,
  painBefore: 1,
  painDuring: 3,
  ...over,
});

describe('pain score 0–10 (LOINC 72514-3, integer 0–10, HL7 FHIR R4; Silbernagel et al. 2007)', () => {
  it.each([0, 5, 10])('%d accepted', (v) => expect(PainScoreSchema.safeParse(v).success).toBe(true));

  it.each([
    [11, 'must be from 0 to 10', 'LOINC 72514-3: 11 rejected'],
    [-1, 'must be from 0 to 10', 'below the scale'],
    [4.5, 'must be a whole number from 0 to 10', 'LOINC 72514-3 value is an integer'],
  ])('%d refused with "%s" (%s)', (v, message) => {
    const r = PainScoreSchema.safeParse(v);
    expect(r.success).toBe(false);
    expect(r.error!.issues[0].message).toBe(message);
  });

  it('a string is refused, not coerced (common practice)', () => {
    expect(PainScoreSchema.safeParse('4').success).toBe(false);
  });
});

describe("session RPE on Foster's CR-10 (Foster et al. 2001, JSCR 15:109–115)", () => {
  it('0 (rest) and 10 (maximal) accepted', () => {
    expect(SessionRpeSchema.safeParse(0).success).toBe(true);
    expect(SessionRpeSchema.safeParse(10).success).toBe(true);
  });

  it('11, −1 and 6.5 refused (integers 0–10 only)', () => {
    expect(SessionRpeSchema.safeParse(11).success).toBe(false);
    expect(SessionRpeSchema.safeParse(-1).success).toBe(false);
    expect(SessionRpeSchema.safeParse(6.5).success).toBe(false);
  });
});

describe('set RPE on the reps-in-reserve scale (Zourdos et al. 2016, JSCR 30:267–275)', () => {
  it('whole and half steps from 1 to 10 accepted', () => {
    for (const v of [1, 7, 8.5, 10]) expect(SetRpeSchema.safeParse(v).success, String(v)).toBe(true);
  });

  it('0, 10.5 and 8.3 refused', () => {
    expect(SetRpeSchema.safeParse(0).success).toBe(false);
    expect(SetRpeSchema.safeParse(10.5).success).toBe(false);
    expect(issues(SetRpeSchema.safeParse(8.3))).toEqual({ '': 'must be a whole or half step' });
  });
});

describe('TrainingLogCreateSchema', () => {
  it('a valid session passes, sets default to [] (common practice)', () => {
    const r = TrainingLogCreateSchema.safeParse(log());
    expect(r.success, JSON.stringify(r.error?.issues)).toBe(true);
    expect(r.data!.sets).toEqual([]);
  });

  it('session RPE 0 is allowed: CR-10 0 = rest (Foster et al. 2001)', () => {
    expect(TrainingLogCreateSchema.safeParse(log({ sessionRpe: 0 })).success).toBe(true);
  });

  it('session RPE 11 and pain −1 refused, each naming its field (Foster et al. 2001; LOINC 72514-3)', () => {
    expect(issues(TrainingLogCreateSchema.safeParse(log({ sessionRpe: 11, painDuring: -1 })))).toEqual({
      sessionRpe: 'must be from 0 to 10',
      painDuring: 'must be from 0 to 10',
    });
  });

  it('pain 4.5 refused naming the field (LOINC 72514-3 integer)', () => {
    expect(issues(TrainingLogCreateSchema.safeParse(log({ painBefore: 4.5 })))).toEqual({
      painBefore: 'must be a whole number from 0 to 10',
    });
  });

  it('a set RPE of 11 is refused at its path (Zourdos et al. 2016)', () => {
    const sets = [
      { exercise: 'Back squat', loadKg: 100, reps: 5, rpe: 8 },
      { exercise: 'Back squat', loadKg: 100, reps: 5, rpe: 11 },
    ];
    expect(issues(TrainingLogCreateSchema.safeParse(log({ sets })))).toEqual({ 'sets.1.rpe': 'must be from 1 to 10' });
  });

  it('unknown keys refused, at the top and inside a set (common practice: strict request shapes)', () => {
    expect(issues(TrainingLogCreateSchema.safeParse(log({ sessionLoad: 300 })))).toEqual({ sessionLoad: 'unrecognized' });
    expect(issues(LoggedSetSchema.safeParse({ exercise: 'Deadlift', loadKg: 100, reps: 5, e1rm: 116 }))).toEqual({ e1rm: 'unrecognized' });
  });

  it('0 minutes refused; whole minutes only (common practice)', () => {
    expect(issues(TrainingLogCreateSchema.safeParse(log({ durationMinutes: 0 })))).toHaveProperty('durationMinutes');
    expect(issues(TrainingLogCreateSchema.safeParse(log({ durationMinutes: 30.5 })))).toHaveProperty('durationMinutes');
  });
});

describe('PainReportCreateSchema (NICE NG59: every red-flag question asked)', () => {
  it('a full report with every item answered passes', () => {
    const r = PainReportCreateSchema.safeParse(report({ note: '  hurts after deadlifts ' }));
    expect(r.success, JSON.stringify(r.error?.issues)).toBe(true);
    expect(r.data!.note).toBe('hurts after deadlifts');
    expect(r.data!.aggravatingPatterns).toEqual([]);
  });

  it.each(RED_FLAG_ITEMS.map((i) => i.id))('missing the answer to %s → refused naming that item (not read as "no")', (id) => {
    const redFlags = allNo();
    delete redFlags[id];
    expect(issues(PainReportCreateSchema.safeParse(report({ redFlags })))).toEqual({ [`redFlags.${id}`]: 'must be answered yes or no' });
  });

  it('an unknown red-flag key or an unknown top-level key is refused, naming it (common practice)', () => {
    expect(issues(PainReportCreateSchema.safeParse(report({ redFlags: { ...allNo(), made_up: true } })))).toEqual({
      'redFlags.made_up': 'is not a warning question',
    });
    expect(issues(PainReportCreateSchema.safeParse(report({ route: 'routine' })))).toEqual({ route: 'unrecognized' });
  });

  it('a knee report answers the general questions only: back questions are refused by name (NICE NG59; Finucane et al. 2020)', () => {
    const knee = noRedFlags(['knee_left']);
    expect(PainReportCreateSchema.safeParse(report({ bodyRegions: ['knee_left'], redFlags: knee })).success).toBe(true);
    expect(issues(PainReportCreateSchema.safeParse(report({ bodyRegions: ['knee_left'], redFlags: allNo() })))).toEqual(
      Object.fromEntries(
        RED_FLAG_ITEMS.filter((i) => i.scope === 'back_or_pelvis').map((i) => [`redFlags.${i.id}`, 'is not asked for the places chosen']),
      ),
    );
  });

  it('a lower-back report without the cauda equina answers is refused naming each (NICE NG59; Finucane et al. 2020)', () => {
    expect(issues(PainReportCreateSchema.safeParse(report({ redFlags: noRedFlags(['knee_left']) })))).toEqual(
      Object.fromEntries(
        RED_FLAG_ITEMS.filter((i) => i.scope === 'back_or_pelvis').map((i) => [`redFlags.${i.id}`, 'must be answered yes or no']),
      ),
    );
  });

  it('the retired "both legs" id is refused for new reports, pointing to the new question (NICE NG59: new symptoms)', () => {
    expect(issues(PainReportCreateSchema.safeParse(report({ redFlags: { ...allNo(), both_legs: false } })))).toEqual({
      'redFlags.both_legs': 'is no longer asked; answer both_legs_new instead',
    });
  });

  it('pain now 11 and worst −1 refused, naming the fields (LOINC 72514-3, integer 0–10)', () => {
    expect(issues(PainReportCreateSchema.safeParse(report({ painNow: 11, painWorst24h: -1 })))).toEqual({
      painNow: 'must be from 0 to 10',
      painWorst24h: 'must be from 0 to 10',
    });
  });

  it('no body region, or one not on the list, refused (common practice)', () => {
    expect(issues(PainReportCreateSchema.safeParse(report({ bodyRegions: [] })))).toEqual({ bodyRegions: 'choose at least one place' });
    expect(issues(PainReportCreateSchema.safeParse(report({ bodyRegions: ['tail'] })))).toEqual({
      'bodyRegions.0': 'must be a body region from the list',
    });
  });

  it('a "yes" string is not a yes: answers must be booleans (common practice)', () => {
    expect(issues(PainReportCreateSchema.safeParse(report({ redFlags: { ...allNo(), both_legs_new: 'yes' } })))).toEqual({
      'redFlags.both_legs_new': 'must be answered yes or no',
    });
  });
});

describe('CheckInSchema and NextMorningSchema', () => {
  const checkIn = (over: Record<string, unknown> = {}) => ({
    athleteId: ATHLETE,
    date: '2026-01-05',
    sleepHours: 7.5,
    soreness: 2,
    readiness: 8,
    painNow: 1,
    ...over,
  });

  it('a check-in passes; sleep in half hours 0–16 (common practice)', () => {
    expect(CheckInSchema.safeParse(checkIn()).success).toBe(true);
    expect(issues(CheckInSchema.safeParse(checkIn({ sleepHours: 7.25 })))).toEqual({ sleepHours: 'must be in half hours' });
    expect(issues(CheckInSchema.safeParse(checkIn({ sleepHours: 17 })))).toEqual({ sleepHours: 'must be 0–16' });
  });

  it('check-in pain 11 refused naming painNow (LOINC 72514-3, integer 0–10)', () => {
    expect(issues(CheckInSchema.safeParse(checkIn({ painNow: 11 })))).toEqual({ painNow: 'must be from 0 to 10' });
  });

  it('next-morning pain needs a version and a 0–10 integer (LOINC 72514-3)', () => {
    expect(NextMorningSchema.safeParse({ painNextMorning: 3, version: 1 }).success).toBe(true);
    expect(issues(NextMorningSchema.safeParse({ painNextMorning: 11, version: 1 }))).toEqual({ painNextMorning: 'must be from 0 to 10' });
    expect(issues(NextMorningSchema.safeParse({ painNextMorning: 3 }))).toHaveProperty('version');
  });

  it('the flag list defaults to open flags and refuses other states (common practice)', () => {
    expect(FlagListQuerySchema.parse({}).state).toBe('open');
    expect(issues(FlagListQuerySchema.safeParse({ state: 'closed' }))).toEqual({ state: 'must be open, acknowledged or all' });
  });
});
