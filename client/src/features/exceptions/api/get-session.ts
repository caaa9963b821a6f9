import { useQuery } from '@tanstack/react-query';
import type { ExerciseDto, ProgramDto, ProgramSessionDto } from '../../../../../policies/dto';
import { api } from '../../../lib/api-client';
import { exceptionKeys } from './exceptions';

/** The programs one athlete is part of; the request's session is found among their sessions. */
export function useAthletePrograms(orgId: string, athleteId: string) {
  return useQuery({
    queryKey: exceptionKeys.athletePrograms(orgId, athleteId),
    queryFn: () => api.get<ProgramDto[]>(`/orgs/${orgId}/programs`, { query: { athleteId } }),
  });
}

export function findSession(programs: ProgramDto[] | undefined, sessionId: string): ProgramSessionDto | undefined {
  for (const p of programs ?? []) {
    const found = p.sessions.find((s) => s.id === sessionId);
    if (found) return found;
  }
  return undefined;
}

export function useExerciseNames(orgId: string) {
  return useQuery({
    queryKey: exceptionKeys.exercises(orgId),
    queryFn: () => api.get<ExerciseDto[]>(`/orgs/${orgId}/exercises`),
    staleTime: 60_000,
  });
}
