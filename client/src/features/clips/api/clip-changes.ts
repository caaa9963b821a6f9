import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ClipNoteDto } from '../../../../../policies/dto';
import type { ClipNoteCreateInput } from '../../../../../policies/schemas';
import { api } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';

export function deleteClip(orgId: string, clipId: string): Promise<void> {
  return api.delete(`/orgs/${orgId}/clips/${clipId}`);
}

export function useDeleteClip(orgId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (clipId: string) => deleteClip(orgId, clipId),
    onSuccess: (_done, clipId) => {
      queryClient.removeQueries({ queryKey: queryKeys.clip(orgId, clipId) });
      void queryClient.invalidateQueries({ queryKey: queryKeys.clipsAll(orgId) });
      void queryClient.invalidateQueries({ queryKey: queryKeys.audit(orgId) });
    },
  });
}

export function addClipNote(orgId: string, clipId: string, input: ClipNoteCreateInput): Promise<ClipNoteDto> {
  return api.post<ClipNoteDto>(`/orgs/${orgId}/clips/${clipId}/notes`, input);
}

export function deleteClipNote(orgId: string, clipId: string, noteId: string): Promise<void> {
  return api.delete(`/orgs/${orgId}/clips/${clipId}/notes/${noteId}`);
}

/** A note changes the clip (its notes) and every list (the note count). */
function useRefreshClip(orgId: string, clipId: string) {
  const queryClient = useQueryClient();
  return () => {
    void queryClient.invalidateQueries({ queryKey: queryKeys.clip(orgId, clipId) });
    void queryClient.invalidateQueries({ queryKey: queryKeys.clipLists(orgId) });
    void queryClient.invalidateQueries({ queryKey: queryKeys.audit(orgId) });
  };
}

export function useAddClipNote(orgId: string, clipId: string) {
  const refresh = useRefreshClip(orgId, clipId);
  return useMutation({ mutationFn: (input: ClipNoteCreateInput) => addClipNote(orgId, clipId, input), onSuccess: refresh });
}

export function useDeleteClipNote(orgId: string, clipId: string) {
  const refresh = useRefreshClip(orgId, clipId);
  return useMutation({ mutationFn: (noteId: string) => deleteClipNote(orgId, clipId, noteId), onSuccess: refresh });
}
