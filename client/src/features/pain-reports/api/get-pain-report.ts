import { queryOptions, useQuery } from '@tanstack/react-query';
import type { PainReportDetailDto } from '../../../../../policies/dto';
import { api } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';

/** One pain report and who was told. A clinician's read is written to the audit trail. */
export function getPainReport(orgId: string, reportId: string): Promise<PainReportDetailDto> {
  return api.get<PainReportDetailDto>(`/orgs/${orgId}/pain-reports/${reportId}`);
}

/** Each read is audited, so the page does not re-read on focus; a filed report does not change. */
export function getPainReportQueryOptions(orgId: string, reportId: string) {
  return queryOptions({
    queryKey: queryKeys.painReport(orgId, reportId),
    queryFn: () => getPainReport(orgId, reportId),
    staleTime: 5 * 60_000,
    refetchOnWindowFocus: false,
  });
}

export function usePainReport(orgId: string, reportId: string) {
  return useQuery(getPainReportQueryOptions(orgId, reportId));
}
