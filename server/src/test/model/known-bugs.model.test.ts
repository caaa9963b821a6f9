/**
 * The shortest sequence the model found (or was walked through) for each known bug of the app
 * (known-bugs.ts), replayed through the same model runner and invariant. While a bug is listed in
 * KNOWN_BUGS its sequence must fail with the symptom named here; when the fix lands, this test
 * says so, the line in KNOWN_BUGS goes, and the sequence must then pass like any other.
 */
import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { useHarness } from '../harness';
import { CloseCase, EditExercise, OpenCase, SavePlan } from './commands-limits';
import { CreateSession, Unpublish } from './commands-sessions';
import { KNOWN_BUGS, showing, type KnownBug } from './known-bugs';
import { wallClockOn } from './model';
import type { Step } from './step';
import { setUp } from './world';

const LA = 'America/Los_Angeles';
/** Deadlift (exercise 0, hinge), 3 × 50 kg at RPE 8: a hard set. */
const hardDeadlift = [{ exercise: 0, sets: [{ reps: 3, load: { kind: 'kg' as const, value: 50 }, targetRpe: 8 }] }];
const oneHardHingeSetAWeek = [{ start: -3, length: 12, patterns: { hinge: { mode: 'capped' as const, caps: { maxHardSetsPerWeek: 1 } } } }];

const SEQUENCES: { bug: KnownBug; story: string; zone: string; start: string; symptom: RegExp; steps: () => Step[] }[] = [
  {
    bug: 'archive-wipes-patterns',
    story: 'archiving an exercise erases its movement patterns',
    zone: LA,
    start: '2026-06-15T09:00',
    symptom: /the database differs from what was sent: exercise Deadlift\n {2}database: \[\[\],/,
    steps: () => [new EditExercise(0, 'archive or restore')],
  },
  {
    bug: 'case-opening-skips-recheck',
    story: 'a case opened as Out leaves a published session of that day published and not held',
    zone: LA,
    start: '2026-06-15T09:00',
    symptom: /session s1 on 2026-06-15 is published and not held for athlete A, but breaches: Out/,
    steps: () => [new CreateSession(0, 0, hardDeadlift, true), new OpenCase(0, 'out', 0)],
  },
  {
    bug: 'utc-today',
    story: 'in Sydney at 00:30, closing a case on the local today is refused as a future date',
    zone: 'Australia/Sydney',
    start: '2026-03-06T00:30',
    symptom: /close c1 on 2026-03-06: HTTP 400 \(expected 200\)/,
    steps: () => [new OpenCase(0, 'limited', 0), new CloseCase(0, false)],
  },
  {
    bug: 'exercise-edit-skips-recheck',
    story: 'an exercise moved into a blocked pattern leaves its published session published and not held',
    zone: LA,
    start: '2026-06-15T09:00',
    symptom: /session s1 on 2026-06-16 is published and not held for athlete A, but breaches: blocked pattern/,
    steps: () => [
      new SavePlan(0, 0, [{ start: -3, length: 12, patterns: { squat: { mode: 'blocked' } } }]),
      new CreateSession(0, 1, hardDeadlift, true),
      new EditExercise(0, { patterns: ['squat'] }),
    ],
  },
  {
    bug: 'week-not-rechecked',
    story: 'publishing an earlier session of the week puts a later published one over the weekly hard-set limit, not held',
    zone: LA,
    start: '2026-06-15T09:00',
    symptom: /session s1 on 2026-06-17 is published and not held for athlete A, but breaches: hinge: hard set 2 of the week/,
    steps: () => [
      new SavePlan(0, 0, oneHardHingeSetAWeek),
      new CreateSession(0, 2, hardDeadlift, true),
      // Earlier in the same week: this session's set is now the week's first, the other one's the second.
      new CreateSession(0, 1, hardDeadlift, true),
    ],
  },
  {
    bug: 'week-not-rechecked',
    story: 'unpublishing an earlier session of the week leaves a later one held though it now fits',
    zone: LA,
    start: '2026-06-15T09:00',
    symptom: /session s1 on 2026-06-17 is held for athlete A, but breaches nothing/,
    steps: () => [
      new CreateSession(0, 2, hardDeadlift, true),
      new CreateSession(0, 1, hardDeadlift, true),
      new SavePlan(0, 0, oneHardHingeSetAWeek),
      // The earlier session goes back to draft: the later one is the week's only hard set again.
      new Unpublish(1),
    ],
  },
];

describe('the known bugs of the guarantee, each shown by its shortest sequence', () => {
  const h = useHarness({ SIGNIN_MAX_PER_IP: '1000000' });
  beforeAll(() => {
    vi.useFakeTimers({ toFake: ['Date'] });
  });
  afterAll(() => {
    vi.useRealTimers();
  });

  it.each(SEQUENCES)('$bug: $story', async ({ bug, zone, start, symptom, steps }) => {
    const [day, time] = start.split('T');
    const [hour, minute] = time.split(':').map(Number);
    const at = wallClockOn(zone, day, hour, minute);
    const run = () => fc.asyncModelRun(() => setUp(h, zone, at, false), steps());
    if (!KNOWN_BUGS.has(bug)) return run();
    const failure = await showing(bug, run).then(
      () => null,
      (err: Error) => err.message,
    );
    expect(failure, `${bug} no longer shows: delete it from KNOWN_BUGS (known-bugs.ts)`).toMatch(symptom);
  });
});
