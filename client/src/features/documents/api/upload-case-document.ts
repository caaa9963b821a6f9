import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CaseDocumentDto } from '../../../../../policies/dto';
import type { CaseDocumentFieldsInput } from '../../../../../policies/schemas';
import { queryKeys } from '../../../lib/query-keys';
import { uploadForm, uploadWithProgress, type UploadOptions } from '../../../lib/upload';

export interface CaseDocumentUpload {
  fields: CaseDocumentFieldsInput;
  file: File;
}

export function uploadCaseDocument(
  orgId: string,
  caseId: string,
  { fields, file }: CaseDocumentUpload,
  options?: UploadOptions,
): Promise<CaseDocumentDto> {
  return uploadWithProgress<CaseDocumentDto>(`/orgs/${orgId}/cases/${caseId}/documents`, uploadForm(fields, file, file.name), options);
}

export function useUploadCaseDocument(orgId: string, caseId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ options, ...input }: CaseDocumentUpload & { options?: UploadOptions }) =>
      uploadCaseDocument(orgId, caseId, input, options),
    onSuccess: () => {
      void queryClient.invalidateQueries({ queryKey: queryKeys.caseDocuments(orgId, caseId) });
      void queryClient.invalidateQueries({ queryKey: queryKeys.audit(orgId) });
    },
  });
}
