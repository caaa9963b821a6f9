import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CaseloadRowDto } from '../../../../../policies/dto';
import { api } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';

/** Every athlete the reader may see, with status, open cases and the next review (the server filters). */
export function getCaseload(orgId: string): Promise<CaseloadRowDto[]> {
  return api.get<CaseloadRowDto[]>(`/orgs/${orgId}/caseload`);
}

export function getCaseloadQueryOptions(orgId: string) {
  return queryOptions({ queryKey: queryKeys.caseload(orgId), queryFn: () => getCaseload(orgId) });
}

export function useCaseload(orgId: string) {
  return useQuery(getCaseloadQueryOptions(orgId));
}
