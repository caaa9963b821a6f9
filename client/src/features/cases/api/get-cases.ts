import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CaseDto } from '../../../../../policies/dto';
import { api } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';

export interface CaseFilters {
  athleteId?: string;
  state?: 'open' | 'closed' | 'all';
}

/** Cases the reader may see, each with only the fields their role may read. */
export function getCases(orgId: string, filters: CaseFilters): Promise<CaseDto[]> {
  return api.get<CaseDto[]>(`/orgs/${orgId}/cases`, { query: { ...filters } });
}

export function getCasesQueryOptions(orgId: string, filters: CaseFilters) {
  return queryOptions({ queryKey: queryKeys.caseList(orgId, filters), queryFn: () => getCases(orgId, filters) });
}

export function useCases(orgId: string, filters: CaseFilters, enabled = true) {
  return useQuery({ ...getCasesQueryOptions(orgId, filters), enabled });
}
