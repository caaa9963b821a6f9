import { queryOptions, useQuery, type QueryClient } from '@tanstack/react-query';
import type { ProgramDto } from '../../../../../policies/dto';
import { api } from '../../../lib/api-client';
import { programKeys } from './keys';

/** Programs the reader may see, optionally only those one athlete is part of, each with its sessions. */
export function getPrograms(orgId: string, athleteId: string | null): Promise<ProgramDto[]> {
  return api.get<ProgramDto[]>(`/orgs/${orgId}/programs`, { query: { athleteId } });
}

export function getProgramsQueryOptions(orgId: string, athleteId: string | null) {
  return queryOptions({ queryKey: programKeys.list(orgId, athleteId), queryFn: () => getPrograms(orgId, athleteId) });
}

export function usePrograms(orgId: string, athleteId: string | null, enabled = true) {
  return useQuery({ ...getProgramsQueryOptions(orgId, athleteId), enabled });
}

export function getProgram(orgId: string, programId: string): Promise<ProgramDto> {
  return api.get<ProgramDto>(`/orgs/${orgId}/programs/${programId}`);
}

export function getProgramQueryOptions(orgId: string, programId: string) {
  return queryOptions({ queryKey: programKeys.program(orgId, programId), queryFn: () => getProgram(orgId, programId) });
}

export function useProgram(orgId: string, programId: string) {
  return useQuery(getProgramQueryOptions(orgId, programId));
}

/**
 * Anything a session change can move: the program, other lists holding its sessions (weekly
 * counts), the roster's holds and next sessions, and the exception requests.
 */
export function refreshAfterProgramChange(queryClient: QueryClient, orgId: string) {
  void queryClient.invalidateQueries({ queryKey: programKeys.all(orgId) });
  void queryClient.invalidateQueries({ queryKey: programKeys.roster(orgId) });
  void queryClient.invalidateQueries({ queryKey: programKeys.exceptions(orgId) });
}
