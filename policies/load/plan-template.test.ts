import { describe, expect, it } from 'vitest';
import type { PlanStage } from './in-force';
import { daysBetween, planStagesFromTemplate, templateLengthDays, templateStageIssues, templateStagesFromPlan } from './plan-template';

// Check values are calendar arithmetic worked by hand (e.g. 1 Mar 2026 + 14 days = 15 Mar 2026).
const stage = (id: string, startDate: string, endDate: string, over: Partial<PlanStage> = {}): PlanStage => ({
  id,
  startDate,
  endDate,
  painCeiling: 3,
  patterns: { hinge: { mode: 'blocked' } },
  ...over,
});

const ids = () => {
  let n = 0;
  return () => `new-${++n}`;
};

describe('daysBetween', () => {
  it('counts calendar days, across month ends, leap days and clock changes', () => {
    expect(daysBetween('2026-03-01', '2026-03-15')).toBe(14);
    expect(daysBetween('2028-02-28', '2028-03-01')).toBe(2); // 2028 is a leap year
    expect(daysBetween('2026-03-07', '2026-03-09')).toBe(2); // US clocks change on 8 Mar 2026
    expect(daysBetween('2026-12-31', '2027-01-01')).toBe(1);
    expect(daysBetween('2026-03-15', '2026-03-01')).toBe(-14);
  });
});

describe('templateStagesFromPlan', () => {
  it('counts each stage from the earliest start, in date order, keeping gaps and review days', () => {
    const plan = [
      stage('b', '2026-03-15', '2026-03-28', { label: 'Loading' }),
      stage('a', '2026-03-01', '2026-03-14', { label: 'Settle', reviewDate: '2026-03-10' }),
      stage('c', '2026-04-01', '2026-04-30'),
    ];
    const t = templateStagesFromPlan(plan);
    expect(t.map((s) => [s.label ?? null, s.startOffset, s.endOffset, s.reviewOffset ?? null])).toEqual([
      ['Settle', 0, 13, 9],
      ['Loading', 14, 27, null],
      [null, 31, 60, null], // 1 Apr is 31 days after 1 Mar; 30 Apr is 60
    ]);
    expect(t[0]).not.toHaveProperty('id');
    expect(t[0]).not.toHaveProperty('startDate');
  });

  it('copies the stage whole: fields it does not know (exit criteria) go into the template unchanged', () => {
    const criteria = [{ kind: 'clinician', label: 'Pain-free single-leg bridge hold', threshold: 30 }];
    const withCriteria = { ...stage('a', '2026-03-01', '2026-03-14'), criteria } as PlanStage & { criteria: unknown };
    const [t] = templateStagesFromPlan([withCriteria]);
    expect(t).toMatchObject({ criteria, painCeiling: 3, patterns: { hinge: { mode: 'blocked' } } });
    // A copy, not the same object: editing the template does not edit the plan.
    expect(t.criteria).not.toBe(criteria);
  });

  it('makes nothing of no stages', () => {
    expect(templateStagesFromPlan([])).toEqual([]);
  });
});

describe('planStagesFromTemplate', () => {
  it('dates each stage from the start date, with fresh ids', () => {
    const t = templateStagesFromPlan([
      stage('a', '2026-03-01', '2026-03-14', { reviewDate: '2026-03-10' }),
      stage('b', '2026-03-15', '2026-03-28'),
    ]);
    const stages = planStagesFromTemplate(t, '2026-12-24', ids());
    expect(stages.map((s) => [s.id, s.startDate, s.endDate, s.reviewDate])).toEqual([
      ['new-1', '2026-12-24', '2027-01-06', '2027-01-02'],
      ['new-2', '2027-01-07', '2027-01-20', null],
    ]);
  });

  it('gives back the plan it came from when started on the same day (a round trip)', () => {
    const plan = [stage('a', '2028-02-20', '2028-03-05', { reviewDate: '2028-02-29' }), stage('b', '2028-03-06', '2028-03-31')];
    const back = planStagesFromTemplate(templateStagesFromPlan(plan), '2028-02-20', ids());
    expect(back).toEqual(plan.map((s, i) => ({ ...s, id: `new-${i + 1}`, reviewDate: s.reviewDate ?? null })));
  });

  it('carries unknown stage fields back into the plan', () => {
    const t = [{ startOffset: 0, endOffset: 6, painCeiling: 2, patterns: {}, criteria: [{ kind: 'record' }] }];
    const [s] = planStagesFromTemplate(t as never, '2026-05-01', ids()) as (PlanStage & { criteria: unknown })[];
    expect(s.criteria).toEqual([{ kind: 'record' }]);
    expect(s).not.toHaveProperty('startOffset');
  });
});

describe('templateStageIssues and templateLengthDays', () => {
  it('refuses an end before its start and two stages on one day, naming the day as people count it', () => {
    expect(templateStageIssues([{ startOffset: 5, endOffset: 4 }])).toEqual([
      { path: [0, 'endOffset'], message: 'must be on or after the first day of the stage' },
    ]);
    expect(
      templateStageIssues([
        { startOffset: 0, endOffset: 13 },
        { startOffset: 13, endOffset: 20 },
      ]),
    ).toEqual([{ path: [1, 'startOffset'], message: 'overlaps stage 1 (which ends on day 14); a day can belong to one stage only' }]);
    expect(
      templateStageIssues([
        { startOffset: 0, endOffset: 13 },
        { startOffset: 14, endOffset: 20 },
      ]),
    ).toEqual([]);
  });

  it('runs from day 1 to the last stage end', () => {
    expect(templateLengthDays([{ endOffset: 13 }, { endOffset: 41 }])).toBe(42);
    expect(templateLengthDays([])).toBe(0);
  });
});
