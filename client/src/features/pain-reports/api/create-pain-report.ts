import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { PainReportOutcomeDto } from '../../../../../policies/dto';
import type { PainReportCreateInput } from '../../../../../policies/schemas';
import { api } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';

export function createPainReport(orgId: string, input: PainReportCreateInput): Promise<PainReportOutcomeDto> {
  return api.post<PainReportOutcomeDto>(`/orgs/${orgId}/pain-reports`, input);
}

/**
 * A report can set the athlete Out, open flags and send notices, so everything those touch is
 * refreshed afterwards.
 */
export function useCreatePainReport(orgId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: PainReportCreateInput) => createPainReport(orgId, input),
    onSuccess: () => {
      for (const queryKey of [
        queryKeys.painReportsAll(orgId),
        queryKeys.flagsAll(orgId),
        queryKeys.notifications(orgId),
        queryKeys.caseload(orgId),
        queryKeys.caseLists(orgId),
        queryKeys.inForceAll(orgId),
      ]) {
        void queryClient.invalidateQueries({ queryKey });
      }
    },
  });
}
