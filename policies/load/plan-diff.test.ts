import { describe, expect, it } from 'vitest';
import { diffPlans } from './plan-diff';
import type { PlanStage } from './in-force';

const stage = (id: string, over: Partial<PlanStage> = {}): PlanStage => ({
  id,
  startDate: '2026-03-01',
  endDate: '2026-03-14',
  painCeiling: 5,
  patterns: { hinge: { mode: 'capped', caps: { maxPercent1RM: 60 } } },
  ...over,
});

describe('diffPlans', () => {
  it('reports nothing for identical plans', () => {
    const p = { stages: [stage('a')], guidance: 'Go easy' };
    expect(diffPlans(p, structuredClone(p))).toEqual([]);
  });

  it('names a changed cap with before and after', () => {
    const before = { stages: [stage('a')], guidance: '' };
    const after = { stages: [stage('a', { patterns: { hinge: { mode: 'capped', caps: { maxPercent1RM: 75 } } } })], guidance: '' };
    expect(diffPlans(before, after)).toEqual([{ where: 'Stage 1', what: 'Hinge: max % of estimated 1RM', before: '60', after: '75' }]);
  });

  it('reports added and removed stages, mode changes and dates', () => {
    const before = { stages: [stage('a'), stage('b', { startDate: '2026-03-15', endDate: '2026-03-31' })], guidance: 'x' };
    const after = {
      stages: [
        stage('a', { endDate: '2026-03-10', patterns: { hinge: { mode: 'blocked' } } }),
        stage('c', { startDate: '2026-03-11', endDate: '2026-04-01' }),
      ],
      guidance: 'y',
    };
    const changes = diffPlans(before, after);
    expect(changes).toContainEqual({ where: 'Plan', what: 'guidance', before: 'x', after: 'y' });
    expect(changes).toContainEqual({ where: 'Stage 2', what: 'stage removed', before: 'Sun 15 Mar 2026 – Tue 31 Mar 2026', after: null });
    expect(changes).toContainEqual({ where: 'Stage 2', what: 'stage added', before: null, after: 'Wed 11 Mar 2026 – Wed 1 Apr 2026' });
    expect(changes).toContainEqual({ where: 'Stage 1', what: 'end date', before: '2026-03-14', after: '2026-03-10' });
    expect(changes).toContainEqual({ where: 'Stage 1', what: 'Hinge: mode', before: 'capped', after: 'blocked' });
    expect(changes).toContainEqual({ where: 'Stage 1', what: 'Hinge: max % of estimated 1RM', before: '60', after: null });
  });

  it('treats a reorder as a position change, not as removal and addition', () => {
    const a = stage('a');
    const b = stage('b', { startDate: '2026-03-15', endDate: '2026-03-31' });
    const changes = diffPlans({ stages: [a, b], guidance: '' }, { stages: [b, a], guidance: '' });
    expect(changes.map((c) => c.what)).toEqual(['position', 'position']);
  });
});
