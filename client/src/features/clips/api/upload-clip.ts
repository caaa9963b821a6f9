import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ClipDto } from '../../../../../policies/dto';
import type { ClipFieldsInput } from '../../../../../policies/schemas';
import { queryKeys } from '../../../lib/query-keys';
import { uploadForm, uploadWithProgress, type UploadOptions } from '../../../lib/upload';

export interface ClipUpload {
  fields: ClipFieldsInput;
  file: File;
}

export function uploadClip(orgId: string, { fields, file }: ClipUpload, options?: UploadOptions): Promise<ClipDto> {
  const { athleteId, trainingLogId, exercise, caption } = fields;
  return uploadWithProgress<ClipDto>(
    `/orgs/${orgId}/clips`,
    uploadForm({ athleteId, trainingLogId, exercise, caption }, file, file.name),
    options,
  );
}

export function useUploadClip(orgId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ options, ...input }: ClipUpload & { options?: UploadOptions }) => uploadClip(orgId, input, options),
    onSuccess: (clip) => {
      queryClient.setQueryData(queryKeys.clip(orgId, clip.id), { ...clip, notes: clip.notes ?? [] });
      void queryClient.invalidateQueries({ queryKey: queryKeys.clipsAll(orgId) });
      void queryClient.invalidateQueries({ queryKey: queryKeys.audit(orgId) });
    },
  });
}
