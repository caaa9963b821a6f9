import { queryOptions, useQuery } from '@tanstack/react-query';
import type { PainReportDto } from '../../../../../policies/dto';
import { api } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';

/** An athlete's pain reports, newest first (a coach's copy comes without the note and the answers). */
export function getPainReports(orgId: string, athleteId: string): Promise<PainReportDto[]> {
  return api.get<PainReportDto[]>(`/orgs/${orgId}/pain-reports`, { query: { athleteId } });
}

export function getPainReportsQueryOptions(orgId: string, athleteId: string) {
  return queryOptions({ queryKey: queryKeys.painReports(orgId, athleteId), queryFn: () => getPainReports(orgId, athleteId) });
}

export function usePainReports(orgId: string, athleteId: string) {
  return useQuery(getPainReportsQueryOptions(orgId, athleteId));
}
