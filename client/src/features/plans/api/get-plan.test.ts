import { QueryClient } from '@tanstack/react-query';
import { describe, expect, it } from 'vitest';
import type { PlanDto } from '../../../../../policies/dto';
import { queryKeys } from '../../../lib/query-keys';
import { refreshAfterPlanChange } from './get-plan';

describe('refreshAfterPlanChange', () => {
  it('sets the saved plan and marks what is read under it (its stage criteria) stale, so new thresholds show at once', () => {
    const client = new QueryClient();
    const orgId = 'org-1';
    const planId = 'plan-1';
    const criteriaKey = [...queryKeys.plan(orgId, planId), 'stage-criteria'];
    client.setQueryData(criteriaKey, { met: 2 });
    client.setQueryData(queryKeys.plan(orgId, 'other-plan'), { id: 'other-plan' });
    client.setQueryData([...queryKeys.plan(orgId, 'other-plan'), 'stage-criteria'], { met: 1 });
    const saved = { id: planId, caseId: 'case-1', version: 2 } as unknown as PlanDto;

    refreshAfterPlanChange(client, orgId, saved);

    expect(client.getQueryData(queryKeys.plan(orgId, planId))).toBe(saved);
    expect(client.getQueryState(queryKeys.plan(orgId, planId))?.isInvalidated).toBe(false);
    expect(client.getQueryState(criteriaKey)?.isInvalidated).toBe(true);
    expect(client.getQueryState([...queryKeys.plan(orgId, 'other-plan'), 'stage-criteria'])?.isInvalidated).toBe(false);
  });
});
