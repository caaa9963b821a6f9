import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { PainReportOutcomeDto } from '../../../../../policies/dto';
import type { PainReportCreateInput } from '../../../../../policies/schemas';
import { sendOrKeep, useSignedInUserId } from '../../../lib/offline-queue';
import { queryKeys } from '../../../lib/query-keys';

/**
 * A report can set the athlete Out, open flags and send notices, so everything those touch is
 * refreshed afterwards. Without signal it is kept on the phone and sent later (lib/offline-queue.ts).
 */
export function useCreatePainReport(orgId: string) {
  const queryClient = useQueryClient();
  const userId = useSignedInUserId();
  return useMutation({
    // Runs without signal too: sendOrKeep keeps it on the phone then (react-query would only pause it).
    networkMode: 'always',
    mutationFn: (input: PainReportCreateInput) =>
      sendOrKeep<PainReportOutcomeDto>(userId, { orgId, kind: 'pain_report', path: `/orgs/${orgId}/pain-reports`, body: input }),
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
