import { describe, expect, it } from 'vitest';
import { checkSets } from './compliance';
import { ctx, plan, stage } from './compliance-fixtures';
import { dayInWords, describeRuleOnTheBar } from './day-words';
import { inForceOn } from './in-force';
import {
  knownOverLimit,
  loadCapKg,
  loggedEngineSets,
  loggedSetIndex,
  overLimitForAthlete,
  overLimitWords,
  type LoggedSet,
} from './logged-sets';

const byName: Record<string, string> = { deadlift: 'dl', 'back squat': 'sq', 'box jump': 'bj' };
const resolve = (s: LoggedSet) => s.exerciseId ?? byName[s.exercise.trim().toLowerCase()] ?? null;
const hinge80 = plan(stage({ hinge: { mode: 'capped', caps: { maxLoadKg: 80 } }, jump: { mode: 'blocked' } }));

describe('logged sets through the same engine as planned sets', () => {
  it('Deadlift 100 kg × 5 under an 80 kg hinge cap is one breach, said as "over the limit … max 80 kg" (common practice)', () => {
    const sets: LoggedSet[] = [
      { exercise: 'Deadlift', exerciseId: 'dl', loadKg: 80, reps: 5 },
      { exercise: 'Deadlift', exerciseId: 'dl', loadKg: 100, reps: 5 },
    ];
    const breaches = checkSets(loggedEngineSets({ sessionKey: 'log1', date: '2026-03-03', sets }, resolve), ctx(hinge80));
    expect(breaches.map((b) => [b.rule, loggedSetIndex(b)])).toEqual([['absolute_load', 1]]);
    expect(overLimitWords(breaches[0], sets[1], 'Deadlift', 'kg')).toBe(
      'Deadlift 100 kg × 5 is over the limit for lifting from the floor and bending at the hips (hinge): max 80 kg.',
    );
  });

  it('the set at the limit passes; a set of no library exercise, or of 0 reps, is not checked', () => {
    const sets: LoggedSet[] = [
      { exercise: 'deadlift ', loadKg: 80, reps: 5 },
      { exercise: 'Farmer walk with a sandbag', loadKg: 200, reps: 1 },
      { exercise: 'Deadlift', loadKg: 120, reps: 0 },
    ];
    const engineSets = loggedEngineSets({ sessionKey: 'log2', date: '2026-03-03', sets }, resolve);
    expect(engineSets.map((s) => s.order)).toEqual([0]);
    expect(checkSets(engineSets, ctx(hinge80))).toEqual([]);
  });

  it('a blocked movement is said in everyday words, with the date in words (never ISO inside a sentence)', () => {
    const sets: LoggedSet[] = [{ exercise: 'Box jump', loadKg: 0, reps: 5 }];
    const [b] = checkSets(loggedEngineSets({ sessionKey: 'log3', date: '2026-03-03', sets }, resolve), ctx(hinge80));
    expect(overLimitWords(b, sets[0], 'Box jump', 'kg')).toBe(
      'Box jump × 5: jumping and landing (jump / landing) is not allowed on 3 March 2026.',
    );
  });

  it('the load is said in the reader unit: 100 kg = 220.46 lb (NIST SP 811)', () => {
    const sets: LoggedSet[] = [{ exercise: 'Deadlift', loadKg: 100, reps: 5, rpe: 8 }];
    const [b] = checkSets(loggedEngineSets({ sessionKey: 'log4', date: '2026-03-03', sets }, resolve), ctx(hinge80, {}, { unit: 'lb' }));
    expect(overLimitWords(b, sets[0], 'Deadlift', 'lb')).toBe(
      'Deadlift 220.46 lb × 5 at RPE 8 is over the limit for lifting from the floor and bending at the hips (hinge): max 176.36 lb.',
    );
  });
});

describe('the athlete is told in their unit, a load limit as a load on the bar', () => {
  it('45 kg cap, pounds: "up to 95 lb", not 99.2 lb (NIST SP 811; 5-lb steps, common practice)', () => {
    const sets: LoggedSet[] = [{ exercise: 'Deadlift', loadKg: 100, reps: 5 }];
    const c = ctx(plan(stage({ hinge: { mode: 'capped', caps: { maxLoadKg: 45 } } })));
    const [b] = checkSets(loggedEngineSets({ sessionKey: 'log6', date: '2026-03-03', sets }, resolve), c);
    expect(loadCapKg(b, c)).toBe(45);
    expect(overLimitForAthlete(b, sets[0], 'Deadlift', 'lb', c)).toBe(
      'Deadlift 220.46 lb × 5 was more than your limit for lifting from the floor and bending at the hips (hinge) on 3 March 2026: up to 95 lb.',
    );
  });

  it('60% of a 140 kg best lift = 84 kg → "up to 82.5 kg" on the exercise 2.5 kg steps (common practice: under a cap, round down, never to nearest)', () => {
    const sets: LoggedSet[] = [{ exercise: 'Deadlift', loadKg: 87.5, reps: 3, rpe: 6 }];
    const c = ctx(plan(stage({ hinge: { mode: 'capped', caps: { maxPercent1RM: 60 } } })), { dl: 140 });
    const [b] = checkSets(loggedEngineSets({ sessionKey: 'log7', date: '2026-03-03', sets }, resolve), c);
    expect(b.rule).toBe('percent_1rm');
    expect(loadCapKg(b, c)).toBeCloseTo(84, 9);
    expect(overLimitForAthlete(b, sets[0], 'Deadlift', 'kg', c)).toMatch(/: up to 82\.5 kg\.$/);
  });

  it('a limit that is not a load reads as the care team reads it', () => {
    const sets: LoggedSet[] = [{ exercise: 'Box jump', loadKg: 0, reps: 5 }];
    const c = ctx(hinge80);
    const [b] = checkSets(loggedEngineSets({ sessionKey: 'log8', date: '2026-03-03', sets }, resolve), c);
    expect(loadCapKg(b, c)).toBeNull();
    expect(overLimitForAthlete(b, sets[0], 'Box jump', 'kg', c)).toBe(overLimitWords(b, sets[0], 'Box jump', 'kg'));
  });
});

describe('only what is known to be over a limit is told', () => {
  const rpe7 = plan(stage({ hinge: { mode: 'capped', caps: { maxRpe: 7, maxPercent1RM: 60 } } }));
  const sets: LoggedSet[] = [
    { exercise: 'Deadlift', loadKg: 60, reps: 5 },
    { exercise: 'Deadlift', loadKg: 60, reps: 5, rpe: 9 },
  ];
  const engineSets = loggedEngineSets({ sessionKey: 'log5', date: '2026-03-03', sets }, resolve);

  it('with no RPE given and no best lift, the engine fails closed, but the log is not "over": only the RPE 9 set is told', () => {
    const breaches = checkSets(engineSets, ctx(rpe7));
    expect(breaches.filter(knownOverLimit).map((b) => [b.rule, loggedSetIndex(b)])).toEqual([['rpe', 1]]);
    expect(breaches.some((b) => b.rule === 'no_baseline')).toBe(true);
  });

  it('with a best lift of 100 kg, 60 kg × 5 is 60% and RPE is estimated (Baechle & Earle 2008 table) — told only when over', () => {
    const breaches = checkSets(engineSets, ctx(rpe7, { dl: 100 })).filter(knownOverLimit);
    expect(breaches.map((b) => [b.rule, loggedSetIndex(b)])).toEqual([['rpe', 1]]);
  });
});

describe('a day in the athlete words', () => {
  it('a capped load reads as a load on the bar: 45 kg → "up to 95 lb" (NIST SP 811; 5-lb steps, common practice)', () => {
    const day = inForceOn(
      plan(stage({ hinge: { mode: 'capped', caps: { maxLoadKg: 45, maxRpe: 7 } }, jump: { mode: 'blocked' } })),
      '2026-03-03',
    );
    const words = dayInWords(day, 'limited', 'lb');
    expect(words.withLimits).toEqual(['lifting from the floor and bending at the hips (hinge): up to 95 lb, effort RPE 7 or easier']);
    expect(words.mayNot).toEqual(['jumping and landing (jump / landing)']);
    expect(words.pain).toBe('Stop and tell your clinician if pain goes past 5/10.');
    expect(words.free).toMatch(/^No limit on everything else: squatting, /);
    expect(JSON.stringify(words)).not.toMatch(/99\.2/);
  });

  it('today on the athlete home: "Hinge: up to 95 lb" for a 45 kg cap; other rules read as before (NIST SP 811; 5-lb steps)', () => {
    expect(describeRuleOnTheBar('hinge', { mode: 'capped', caps: { maxLoadKg: 45, maxRpe: 7 } }, 'lb')).toBe(
      'Hinge: up to 95 lb, effort RPE 7 or easier',
    );
    expect(describeRuleOnTheBar('hinge', { mode: 'capped', caps: { maxPercent1RM: 55 } }, 'kg')).toBe('Hinge: up to 55% of your best lift');
    expect(describeRuleOnTheBar('jump', { mode: 'blocked' }, 'kg')).toBe('Jump / landing: not allowed for now');
    expect(describeRuleOnTheBar('squat', { mode: 'capped', caps: {} }, 'kg')).toBe('Squat: allowed with care');
  });

  it('a day no stage covers has no limits; Out with no plan means no training', () => {
    const none = inForceOn(plan(stage({ hinge: { mode: 'blocked' } })), '2026-04-30');
    expect(dayInWords(none, 'full', 'kg')).toEqual({ headline: 'No limits.', mayNot: [], withLimits: [], free: null, pain: null });
    expect(dayInWords(none, 'out', 'kg').headline).toBe('Out: no training until your clinician says what you may do.');
  });
});
