import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';

export function deleteCaseDocument(orgId: string, documentId: string): Promise<void> {
  return api.delete(`/orgs/${orgId}/documents/${documentId}`);
}

export function useDeleteCaseDocument(orgId: string, caseId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (documentId: string) => deleteCaseDocument(orgId, documentId),
    onSuccess: () => {
      void queryClient.invalidateQueries({ queryKey: queryKeys.caseDocuments(orgId, caseId) });
      void queryClient.invalidateQueries({ queryKey: queryKeys.audit(orgId) });
    },
  });
}
