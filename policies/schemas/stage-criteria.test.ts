import { describe, expect, it } from 'vitest';
import { PlanStageSchema } from './cases';
import { StageAdvanceSchema, StageAssessmentSchema } from './stage-criteria';

const ID1 = '00000000-0000-4000-8000-000000000001';
const ID2 = '00000000-0000-4000-8000-000000000002';
const stage = (criteria: unknown) => ({ id: ID1, startDate: '2026-01-05', endDate: '2026-01-18', patterns: {}, criteria });
const paths = (r: { success: boolean; error?: { issues: { path: PropertyKey[] }[] } }) =>
  r.success ? [] : r.error!.issues.map((i) => i.path.join('.'));

describe('stage criteria schema (ASVS 5.0 V2.2.1: unknown keys refused; 400 names the field)', () => {
  it('accepts the three kinds and a stage without criteria', () => {
    const r = PlanStageSchema.safeParse(
      stage([
        { id: ID1, kind: 'record', rule: 'pain_settled_sessions', count: 3, maxPain: 2 },
        {
          id: ID2,
          kind: 'clinician',
          label: 'Side-to-side strength',
          measure: 'threshold',
          threshold: 90,
          direction: 'at_least',
          unit: '%',
        },
      ]),
    );
    expect(r.success).toBe(true);
    expect(PlanStageSchema.safeParse(stage(undefined)).success).toBe(true);
  });

  it('names the missing or stray field of a rule, a repeated id and an unknown kind', () => {
    expect(paths(PlanStageSchema.safeParse(stage([{ id: ID1, kind: 'record', rule: 'sessions_logged' }])))).toEqual(['criteria.0.count']);
    expect(paths(PlanStageSchema.safeParse(stage([{ id: ID1, kind: 'record', rule: 'no_red_flags', maxRpe: 5 }])))).toEqual([
      'criteria.0.maxRpe',
    ]);
    expect(paths(PlanStageSchema.safeParse(stage([{ id: ID1, kind: 'clinician', label: 'x', measure: 'threshold' }])))).toEqual([
      'criteria.0.threshold',
    ]);
    expect(paths(PlanStageSchema.safeParse(stage([{ id: ID1, kind: 'athlete', threshold: 11 }])))).toEqual(['criteria.0.threshold']);
    expect(
      paths(
        PlanStageSchema.safeParse(
          stage([
            { id: ID1, kind: 'athlete', threshold: 7 },
            { id: ID1, kind: 'record', rule: 'no_red_flags' },
          ]),
        ),
      ),
    ).toEqual(['criteria.1.id']);
    expect(PlanStageSchema.safeParse(stage([{ id: ID1, kind: 'coach' }])).success).toBe(false);
  });

  it('an assessment needs a value or a judgement; a decision needs who agreed', () => {
    expect(paths(StageAssessmentSchema.safeParse({ stageId: ID1, criterionId: ID2, date: '2026-01-10' }))).toEqual(['value']);
    expect(paths(StageAdvanceSchema.safeParse({ fromStageId: ID1, effectiveDate: '2026-01-10', agreedBy: [], version: 1 }))).toEqual([
      'agreedBy',
    ]);
    expect(
      StageAdvanceSchema.safeParse({ fromStageId: ID1, effectiveDate: '2026-01-10', agreedBy: ['athlete', 'guardian'], version: 1 })
        .success,
    ).toBe(true);
  });
});
