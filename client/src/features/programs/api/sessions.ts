import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { ProgramDto, ProgramSessionDto } from '../../../../../policies/dto';
import type { Breach } from '../../../../../policies/load/compliance';
import type { SessionCreateInput, SessionUpdateInput } from '../../../../../policies/schemas';
import { api } from '../../../lib/api-client';
import { refreshAfterProgramChange } from './get-programs';
import { programKeys } from './keys';

/**
 * A program's sessions: create, edit (versioned), delete, check, publish and unpublish. Every
 * change refreshes the program and the roster (holds, next session).
 */
export interface CheckResult {
  results: { athleteId: string; breaches: Breach[] }[];
}

export const createSession = (orgId: string, programId: string, input: SessionCreateInput) =>
  api.post<ProgramSessionDto>(`/orgs/${orgId}/programs/${programId}/sessions`, input);
export const updateSession = (orgId: string, sessionId: string, input: SessionUpdateInput) =>
  api.put<ProgramSessionDto>(`/orgs/${orgId}/sessions/${sessionId}`, input);
export const deleteSession = (orgId: string, sessionId: string) => api.delete(`/orgs/${orgId}/sessions/${sessionId}`);
export const publishSession = (orgId: string, sessionId: string, version: number) =>
  api.post<ProgramSessionDto>(`/orgs/${orgId}/sessions/${sessionId}/publish`, { version });
export const unpublishSession = (orgId: string, sessionId: string, version: number) =>
  api.post<ProgramSessionDto>(`/orgs/${orgId}/sessions/${sessionId}/unpublish`, { version });
export const checkSession = (orgId: string, sessionId: string) => api.post<CheckResult>(`/orgs/${orgId}/sessions/${sessionId}/check`);

/** The server's own check of the saved session: which sets a granted exception still covers. */
export function getSessionCheckQueryOptions(orgId: string, sessionId: string, version: number) {
  return queryOptions({ queryKey: programKeys.check(orgId, sessionId, version), queryFn: () => checkSession(orgId, sessionId) });
}

export function useSessionCheck(orgId: string, sessionId: string, version: number, enabled = true) {
  return useQuery({ ...getSessionCheckQueryOptions(orgId, sessionId, version), enabled });
}

function useRefresh(orgId: string) {
  const queryClient = useQueryClient();
  return () => refreshAfterProgramChange(queryClient, orgId);
}

export function useCreateSession(orgId: string, programId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: SessionCreateInput) => createSession(orgId, programId, input),
    onSuccess: (session) => {
      // Shown at once, so the new session can be opened before the program is read again.
      queryClient.setQueryData<ProgramDto>(programKeys.program(orgId, programId), (old) =>
        old ? { ...old, sessions: [...old.sessions, session].sort((a, b) => (a.date < b.date ? -1 : a.date > b.date ? 1 : 0)) } : old,
      );
      refreshAfterProgramChange(queryClient, orgId);
    },
  });
}

export function useUpdateSession(orgId: string, sessionId: string) {
  const refresh = useRefresh(orgId);
  return useMutation({ mutationFn: (input: SessionUpdateInput) => updateSession(orgId, sessionId, input), onSuccess: refresh });
}

export function useDeleteSession(orgId: string, sessionId: string) {
  const refresh = useRefresh(orgId);
  return useMutation({ mutationFn: () => deleteSession(orgId, sessionId), onSuccess: refresh });
}

export function usePublishSession(orgId: string, sessionId: string) {
  const refresh = useRefresh(orgId);
  return useMutation({ mutationFn: (version: number) => publishSession(orgId, sessionId, version), onSuccess: refresh });
}

export function useUnpublishSession(orgId: string, sessionId: string) {
  const refresh = useRefresh(orgId);
  return useMutation({ mutationFn: (version: number) => unpublishSession(orgId, sessionId, version), onSuccess: refresh });
}
