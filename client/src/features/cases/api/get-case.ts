import { queryOptions, useQuery, type QueryClient } from '@tanstack/react-query';
import type { CaseDetailDto } from '../../../../../policies/dto';
import { api } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';

/** One case with its status history. Clinicians also get the notes, and that read is audited. */
export function getCase(orgId: string, caseId: string): Promise<CaseDetailDto> {
  return api.get<CaseDetailDto>(`/orgs/${orgId}/cases/${caseId}`);
}

/**
 * A clinician's every read of a case is written to the audit trail, so the page does not re-read it
 * on its own: it changes through this page's saves (which return the new case), and a stale copy is
 * caught by the case version when saving.
 */
export function getCaseQueryOptions(orgId: string, caseId: string) {
  return queryOptions({
    queryKey: queryKeys.case(orgId, caseId),
    queryFn: () => getCase(orgId, caseId),
    staleTime: 5 * 60_000,
    refetchOnWindowFocus: false,
  });
}

export function useCase(orgId: string, caseId: string) {
  return useQuery(getCaseQueryOptions(orgId, caseId));
}

/**
 * After any change to a case (whose own query the caller has just updated from the reply): every
 * list of cases, the caseload's status and review dates, and what is in force may all have moved.
 */
export function refreshAfterCaseChange(queryClient: QueryClient, orgId: string) {
  void queryClient.invalidateQueries({ queryKey: queryKeys.caseLists(orgId) });
  void queryClient.invalidateQueries({ queryKey: queryKeys.caseload(orgId) });
  void queryClient.invalidateQueries({ queryKey: queryKeys.inForceAll(orgId) });
  void queryClient.invalidateQueries({ queryKey: queryKeys.audit(orgId) });
  // A letter in force may now be out of date (worked out by the server on each read).
  void queryClient.invalidateQueries({ queryKey: queryKeys.lettersAll(orgId) });
}
