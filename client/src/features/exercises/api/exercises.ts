import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { ExerciseDto } from '../../../../../policies/dto';
import type { ExerciseCreateInput, ExerciseUpdateInput } from '../../../../../policies/schemas';
import { api } from '../../../lib/api-client';

/** Same key as the programs feature's library read, so an edit here refreshes the builder too. */
export const exercisesKey = (orgId: string) => ['orgs', orgId, 'exercises'] as const;

export function getExercises(orgId: string): Promise<ExerciseDto[]> {
  return api.get<ExerciseDto[]>(`/orgs/${orgId}/exercises`);
}

export function getExercisesQueryOptions(orgId: string) {
  return queryOptions({ queryKey: exercisesKey(orgId), queryFn: () => getExercises(orgId), staleTime: 60_000 });
}

export function useExercises(orgId: string) {
  return useQuery(getExercisesQueryOptions(orgId));
}

export function createExercise(orgId: string, input: ExerciseCreateInput): Promise<ExerciseDto> {
  return api.post<ExerciseDto>(`/orgs/${orgId}/exercises`, input);
}

export function updateExercise(orgId: string, id: string, input: ExerciseUpdateInput): Promise<ExerciseDto> {
  return api.patch<ExerciseDto>(`/orgs/${orgId}/exercises/${id}`, input);
}

export function useCreateExercise(orgId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: ExerciseCreateInput) => createExercise(orgId, input),
    onSuccess: () => void queryClient.invalidateQueries({ queryKey: exercisesKey(orgId) }),
  });
}

export function useUpdateExercise(orgId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, input }: { id: string; input: ExerciseUpdateInput }) => updateExercise(orgId, id, input),
    onSuccess: () => void queryClient.invalidateQueries({ queryKey: exercisesKey(orgId) }),
  });
}
