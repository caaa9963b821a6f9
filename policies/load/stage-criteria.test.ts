import { describe, expect, it } from 'vitest';
import { jargonIn, plainCriterion, plainCriterionProgress } from '../plain-words';
import {
  evaluateStageCriteria,
  meetsThreshold,
  moveToNextStage,
  type CriteriaEvidence,
  type LogEvidence,
  type StageCriterion,
} from './stage-criteria';

const log = (
  date: string,
  painBefore: number,
  painDuring: number,
  painNextMorning: number | null,
  sessionRpe = 4,
  planned = true,
): LogEvidence => ({
  date,
  painBefore,
  painDuring,
  painNextMorning,
  sessionRpe,
  planned,
});

const ev = (over: Partial<CriteriaEvidence> = {}): CriteriaEvidence => ({
  stageStart: '2026-03-02',
  today: '2026-03-20',
  logs: [],
  redFlagDates: [],
  assessments: [],
  ratings: [],
  ...over,
});

// The pain-monitoring model (Silbernagel et al. 2007, AJSM 35:897–906): next-morning pain not above
// the pre-session level; the ceiling during is the clinician's (here 2, lower for the back).
const painSettled: StageCriterion = { id: 'c1', kind: 'record', rule: 'pain_settled_sessions', count: 3, maxPain: 2 };

describe('record criteria, worked sequences', () => {
  it('3 sessions in a row with pain during ≤ 2 and next morning not above before: a bad session resets the run (Silbernagel et al. 2007)', () => {
    const logs = [
      log('2026-03-03', 1, 2, 1), // passes
      log('2026-03-05', 1, 3, 1), // 3 during > 2: breaks
      log('2026-03-07', 1, 2, 1), // 1
      log('2026-03-09', 2, 1, 2), // 2 (morning equal to before counts)
    ];
    const two = evaluateStageCriteria([painSettled], ev({ logs }));
    expect(two.results[0]).toMatchObject({ state: 'not_met', have: 2, need: 3, lastDate: '2026-03-09' });
    const three = evaluateStageCriteria([painSettled], ev({ logs: [...logs, log('2026-03-11', 1, 2, 0)] }));
    expect(three.results[0]).toMatchObject({ state: 'met', have: 3, need: 3 });
    expect(three.allMet).toBe(true);
  });

  it('a next morning above the pre-session level breaks the run (Silbernagel et al. 2007: 3 during, morning 2 above → reduce)', () => {
    const logs = [log('2026-03-03', 0, 1, 0), log('2026-03-05', 0, 1, 0), log('2026-03-07', 1, 2, 3)];
    expect(evaluateStageCriteria([painSettled], ev({ logs })).results[0]).toMatchObject({ state: 'not_met', have: 0 });
  });

  it('the latest session still waiting for its morning answer is skipped, not counted; an old unanswered one breaks the run (common practice: unknown never passes)', () => {
    const logs = [log('2026-03-03', 1, 1, 1), log('2026-03-05', 1, 1, 1), log('2026-03-07', 1, 1, 1), log('2026-03-09', 1, 1, null)];
    expect(evaluateStageCriteria([painSettled], ev({ logs })).results[0]).toMatchObject({ state: 'met', have: 3 });
    const gap = [log('2026-03-03', 1, 1, 1), log('2026-03-05', 1, 1, null), log('2026-03-07', 1, 1, 1), log('2026-03-09', 1, 1, 1)];
    expect(evaluateStageCriteria([painSettled], ev({ logs: gap })).results[0]).toMatchObject({ state: 'not_met', have: 2 });
  });

  it('logs before the stage began or after today do not count; none at all is waiting', () => {
    const logs = [log('2026-02-27', 1, 1, 1), log('2026-02-28', 1, 1, 1), log('2026-03-21', 1, 1, 1)];
    expect(evaluateStageCriteria([painSettled], ev({ logs })).results[0]).toMatchObject({ state: 'waiting', have: 0 });
  });

  it('sessions logged counts every log of the stage; session RPE ≤ 5 counts planned sessions in a row (Foster et al. 2001 session RPE, 0–10)', () => {
    const logs = [
      log('2026-03-03', 0, 0, 0, 6),
      log('2026-03-04', 0, 0, 0, 5),
      log('2026-03-05', 0, 0, 0, 7, false),
      log('2026-03-06', 0, 0, 0, 4),
    ];
    const r = evaluateStageCriteria(
      [
        { id: 'n', kind: 'record', rule: 'sessions_logged', count: 4 },
        { id: 'r', kind: 'record', rule: 'rpe_at_most', maxRpe: 5, count: 2 },
        { id: 'r3', kind: 'record', rule: 'rpe_at_most', maxRpe: 5, count: 3 },
      ],
      ev({ logs }),
    );
    expect(r.results.map((x) => [x.state, x.have, x.need])).toEqual([
      ['met', 4, 4],
      ['met', 2, 2], // the unplanned RPE 7 session is not at the planned load: skipped
      ['not_met', 2, 3], // the planned RPE 6 on 3 Mar ends the run
    ]);
    expect(r.allMet).toBe(false);
    expect(r.metCount).toBe(2);
  });

  it('no red-flag answer since the stage began: one before the stage does not count, one during it does (NICE NG59 red flags)', () => {
    const c: StageCriterion = { id: 'f', kind: 'record', rule: 'no_red_flags' };
    expect(evaluateStageCriteria([c], ev({ redFlagDates: ['2026-02-20'] })).results[0].state).toBe('met');
    expect(evaluateStageCriteria([c], ev({ redFlagDates: ['2026-03-10'] })).results[0]).toMatchObject({
      state: 'not_met',
      lastDate: '2026-03-10',
    });
    expect(evaluateStageCriteria([c], ev({ today: '2026-03-01' })).results[0].state).toBe('waiting');
  });
});

describe('clinician and athlete criteria', () => {
  const ratio: StageCriterion = {
    id: 'lsi',
    kind: 'clinician',
    label: 'Strength between sides',
    measure: 'threshold',
    threshold: 90,
    direction: 'at_least',
    unit: '%',
  };
  const judgement: StageCriterion = { id: 'ok', kind: 'clinician', label: 'Moves without guarding', measure: 'yes_no' };
  const ready: StageCriterion = { id: 'ready', kind: 'athlete', threshold: 7 };

  it('the latest assessment in the stage decides: a side-to-side ratio of 88 % is not met, 91 % is (≥ 90 %, common practice)', () => {
    const a = (date: string, value: number) => ({ criterionId: 'lsi', date, value, met: null });
    expect(evaluateStageCriteria([ratio], ev({ assessments: [a('2026-03-05', 88)] })).results[0]).toMatchObject({ state: 'not_met' });
    const r = evaluateStageCriteria([ratio], ev({ assessments: [a('2026-03-12', 91), a('2026-03-05', 88)] })).results[0];
    expect(r).toMatchObject({ state: 'met', lastDate: '2026-03-12' });
    expect(r.evidence).toContain('91 %');
    expect(evaluateStageCriteria([ratio], ev({ assessments: [a('2026-02-20', 95)] })).results[0].state).toBe('waiting');
  });

  it('a hold time "at most" and a yes/no judgement; a missing value never passes', () => {
    expect(meetsThreshold(30, 30, 'at_most')).toBe(true);
    expect(meetsThreshold(31, 30, 'at_most')).toBe(false);
    expect(meetsThreshold(null, 30)).toBe(false);
    expect(meetsThreshold(Number.NaN, 30)).toBe(false);
    const yes = evaluateStageCriteria(
      [judgement],
      ev({ assessments: [{ criterionId: 'ok', date: '2026-03-06', value: null, met: true, note: 'Squats with even weight' }] }),
    );
    expect(yes.results[0]).toMatchObject({ state: 'met' });
    expect(yes.results[0].evidence).toContain('Squats with even weight');
  });

  it('readiness 0–10: 6 is not met at a threshold of 7, 7 is', () => {
    expect(evaluateStageCriteria([ready], ev({ ratings: [{ date: '2026-03-06', value: 6 }] })).results[0].state).toBe('not_met');
    expect(
      evaluateStageCriteria(
        [ready],
        ev({
          ratings: [
            { date: '2026-03-06', value: 6 },
            { date: '2026-03-09', value: 7 },
          ],
        }),
      ).results[0].state,
    ).toBe('met');
    expect(evaluateStageCriteria([ready], ev()).results[0].state).toBe('waiting');
  });

  it('a stage without criteria is never "all met" (the prompt needs criteria)', () => {
    expect(evaluateStageCriteria([], ev()).allMet).toBe(false);
  });
});

describe('moving to the next stage (Bern consensus, Ardern et al. 2016: a shared decision, not the calendar)', () => {
  const stages = [
    { id: 'a', startDate: '2026-03-02', endDate: '2026-03-15', reviewDate: '2026-03-13' },
    { id: 'b', startDate: '2026-03-16', endDate: '2026-03-29', reviewDate: null },
    { id: 'c', startDate: '2026-03-30', endDate: '2026-04-12', reviewDate: '2026-04-10' },
  ];

  it('four days early: stage a ends 11 Mar, b and c keep their 14 days and move 4 days earlier', () => {
    const r = moveToNextStage(stages, 'a', '2026-03-12');
    expect(r).toMatchObject({ ok: true, toStageId: 'b', plannedStart: '2026-03-16', daysEarly: 4 });
    if (!r.ok) return;
    expect(r.stages).toEqual([
      { id: 'a', startDate: '2026-03-02', endDate: '2026-03-11', reviewDate: null },
      { id: 'b', startDate: '2026-03-12', endDate: '2026-03-25', reviewDate: null },
      { id: 'c', startDate: '2026-03-26', endDate: '2026-04-08', reviewDate: '2026-04-06' },
    ]);
  });

  it('three days late: stage a runs to 18 Mar, b starts 19 Mar (daysEarly −3)', () => {
    const r = moveToNextStage(stages, 'a', '2026-03-19');
    expect(r).toMatchObject({ ok: true, daysEarly: -3 });
    if (!r.ok) return;
    expect(r.stages.map((s) => [s.startDate, s.endDate])).toEqual([
      ['2026-03-02', '2026-03-18'],
      ['2026-03-19', '2026-04-01'],
      ['2026-04-02', '2026-04-15'],
    ]);
  });

  it('refuses the last stage, an unknown stage and a date not after the stage began', () => {
    expect(moveToNextStage(stages, 'c', '2026-04-01')).toMatchObject({ ok: false, field: 'fromStageId' });
    expect(moveToNextStage(stages, 'x', '2026-04-01')).toMatchObject({ ok: false, field: 'fromStageId' });
    expect(moveToNextStage(stages, 'a', '2026-03-02')).toMatchObject({ ok: false, field: 'effectiveDate' });
  });
});

describe('what unlocks the next stage, in plain words', () => {
  const all: StageCriterion[] = [
    { id: '1', kind: 'record', rule: 'pain_settled_sessions', count: 3, maxPain: 2 },
    { id: '2', kind: 'record', rule: 'no_red_flags' },
    { id: '3', kind: 'record', rule: 'sessions_logged', count: 1 },
    { id: '4', kind: 'record', rule: 'rpe_at_most', count: 2, maxRpe: 5 },
    { id: '5', kind: 'clinician', label: 'a steady single-leg balance', measure: 'yes_no' },
    { id: '6', kind: 'athlete', threshold: 7 },
  ];

  it('common practice: no word of the trade in any criterion or progress line', () => {
    const texts = all.map(plainCriterion);
    for (const state of ['met', 'not_met', 'waiting'] as const)
      for (const kind of ['record', 'clinician', 'athlete'] as const)
        texts.push(plainCriterionProgress({ state, kind, have: 1, need: 3 }), plainCriterionProgress({ state, kind, have: 0, need: 1 }));
    for (const t of texts) expect(jargonIn(t), t).toEqual([]);
  });

  it('reads the worked criterion and its progress', () => {
    expect(plainCriterion(all[0])).toBe(
      '3 training days in a row with pain during training at 2 out of 10 or less, and no worse the next morning than before training.',
    );
    expect(plainCriterion(all[2])).toBe('1 training day recorded in this stage.');
    expect(plainCriterionProgress({ state: 'not_met', kind: 'record', have: 2, need: 3 })).toBe('2 of 3 so far.');
    expect(plainCriterionProgress({ state: 'met', kind: 'record', have: 3, need: 3 })).toBe('Done.');
  });
});
