import { queryOptions, useMutation, useQuery, useQueryClient, type QueryClient } from '@tanstack/react-query';
import type { ProgramSessionDto } from '../../../../../policies/dto';
import type {
  TeamGridDto,
  TeamProgramDto,
  TeamProgramSummaryDto,
  TeamPublishProblemDto,
  TeamVersionDto,
} from '../../../../../policies/dto/teams';
import type { SessionCreateInput, SessionUpdateInput } from '../../../../../policies/schemas';
import { api, isApiError } from '../../../lib/api-client';

/**
 * Team programs: a group's sessions written once, and each athlete's fitted version of them.
 * The keys sit under the programs prefix (['orgs', orgId, 'programs', 'team', …]), so a change made
 * through the ordinary session editor (a hand edit of one athlete's version) refreshes the grid too.
 */
export const teamKeys = {
  all: (orgId: string) => ['orgs', orgId, 'programs', 'team'] as const,
  list: (orgId: string, groupId: string | null) => ['orgs', orgId, 'programs', 'team', 'list', groupId ?? 'all'] as const,
  program: (orgId: string, id: string) => ['orgs', orgId, 'programs', 'team', id] as const,
  grid: (orgId: string, id: string) => ['orgs', orgId, 'programs', 'team', id, 'grid'] as const,
  version: (orgId: string, teamSessionId: string, athleteId: string) =>
    ['orgs', orgId, 'programs', 'team', 'version', teamSessionId, athleteId] as const,
};

/**
 * Anything a team change can move: the team program and its grid, the athletes' own programs (their
 * versions are ordinary sessions), the roster's holds and the exception requests.
 */
export function refreshAfterTeamChange(queryClient: QueryClient, orgId: string) {
  void queryClient.invalidateQueries({ queryKey: ['orgs', orgId, 'programs'] });
  void queryClient.invalidateQueries({ queryKey: ['orgs', orgId, 'roster'] });
  void queryClient.invalidateQueries({ queryKey: ['orgs', orgId, 'exceptions'] });
}

export const listTeamPrograms = (orgId: string, groupId: string | null) =>
  api.get<TeamProgramSummaryDto[]>(`/orgs/${orgId}/team-programs`, { query: { groupId } });
export const getTeamProgram = (orgId: string, id: string) => api.get<TeamProgramDto>(`/orgs/${orgId}/team-programs/${id}`);
export const getTeamGrid = (orgId: string, id: string) => api.get<TeamGridDto>(`/orgs/${orgId}/team-programs/${id}/grid`);
export const getTeamVersion = (orgId: string, teamSessionId: string, athleteId: string) =>
  api.get<TeamVersionDto>(`/orgs/${orgId}/team-sessions/${teamSessionId}/versions/${athleteId}`);

export function getTeamProgramsQueryOptions(orgId: string, groupId: string | null = null) {
  return queryOptions({ queryKey: teamKeys.list(orgId, groupId), queryFn: () => listTeamPrograms(orgId, groupId) });
}
export function useTeamPrograms(orgId: string, groupId: string | null = null) {
  return useQuery(getTeamProgramsQueryOptions(orgId, groupId));
}

export function getTeamProgramQueryOptions(orgId: string, id: string) {
  return queryOptions({ queryKey: teamKeys.program(orgId, id), queryFn: () => getTeamProgram(orgId, id) });
}
export function useTeamProgram(orgId: string, id: string) {
  return useQuery(getTeamProgramQueryOptions(orgId, id));
}

export function useTeamGrid(orgId: string, id: string) {
  return useQuery({ queryKey: teamKeys.grid(orgId, id), queryFn: () => getTeamGrid(orgId, id) });
}

export function getTeamVersionQueryOptions(orgId: string, teamSessionId: string, athleteId: string) {
  return queryOptions({
    queryKey: teamKeys.version(orgId, teamSessionId, athleteId),
    queryFn: () => getTeamVersion(orgId, teamSessionId, athleteId),
  });
}
export function useTeamVersion(orgId: string, teamSessionId: string, athleteId: string) {
  return useQuery(getTeamVersionQueryOptions(orgId, teamSessionId, athleteId));
}

function useTeamMutation<I, O>(orgId: string, fn: (input: I) => Promise<O>) {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: fn, onSuccess: () => refreshAfterTeamChange(queryClient, orgId) });
}

export function useCreateTeamProgram(orgId: string) {
  return useTeamMutation(orgId, (input: { groupId: string; name: string }) =>
    api.post<TeamProgramDto>(`/orgs/${orgId}/team-programs`, input),
  );
}

export function useRenameTeamProgram(orgId: string, id: string) {
  return useTeamMutation(orgId, (input: { name: string; version: number }) =>
    api.patch<TeamProgramDto>(`/orgs/${orgId}/team-programs/${id}`, input),
  );
}

export function useAddTeamSession(orgId: string, programId: string) {
  return useTeamMutation(orgId, (input: SessionCreateInput) =>
    api.post<ProgramSessionDto>(`/orgs/${orgId}/team-programs/${programId}/sessions`, input),
  );
}

export function useEditTeamSession(orgId: string, teamSessionId: string) {
  return useTeamMutation(orgId, (input: SessionUpdateInput) =>
    api.patch<ProgramSessionDto>(`/orgs/${orgId}/team-sessions/${teamSessionId}`, input),
  );
}

export function useDeleteTeamSession(orgId: string) {
  return useTeamMutation(orgId, (teamSessionId: string) => api.delete(`/orgs/${orgId}/team-sessions/${teamSessionId}`));
}

export interface PublishResult {
  published: number;
  outSkipped: { athleteId: string; teamSessionId: string }[];
}

export function usePublishTeamSessions(orgId: string, programId: string) {
  return useTeamMutation(orgId, (teamSessionIds: string[]) =>
    api.post<PublishResult>(`/orgs/${orgId}/team-programs/${programId}/publish`, { teamSessionIds }),
  );
}

/** The athlete × session problems a refused group publish (422) lists, or null for any other error. */
export function publishProblems(error: unknown): TeamPublishProblemDto[] | null {
  if (!isApiError(error) || error.status !== 422) return null;
  const details = error.details as { problems?: unknown } | undefined;
  return Array.isArray(details?.problems) ? (details.problems as TeamPublishProblemDto[]) : null;
}

export type VersionAction = 'accept' | 'reset' | 'as-written';

export function useVersionAction(orgId: string, teamSessionId: string, athleteId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ action, version }: { action: VersionAction; version: number }) =>
      api.post<TeamVersionDto>(`/orgs/${orgId}/team-sessions/${teamSessionId}/versions/${athleteId}/${action}`, { version }),
    onSuccess: (dto) => {
      queryClient.setQueryData(teamKeys.version(orgId, teamSessionId, athleteId), dto);
      refreshAfterTeamChange(queryClient, orgId);
    },
  });
}
