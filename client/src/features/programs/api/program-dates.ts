import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ProgramSessionDto } from '../../../../../policies/dto';
import type { z } from 'zod';
import type { CopyWeekSchema, ShiftDatesSchema } from '../../../../../policies/schemas';
import { api } from '../../../lib/api-client';
import { refreshAfterProgramChange } from './get-programs';

export type CopyWeekInput = z.infer<typeof CopyWeekSchema>;
export type ShiftDatesInput = z.infer<typeof ShiftDatesSchema>;

/** Copies one week's sessions to another week, as drafts with new set ids. */
export const copyWeek = (orgId: string, programId: string, input: CopyWeekInput) =>
  api.post<ProgramSessionDto[]>(`/orgs/${orgId}/programs/${programId}/copy-week`, input);

/** Moves every draft from a date on by some days; published sessions keep their dates. */
export const shiftDates = (orgId: string, programId: string, input: ShiftDatesInput) =>
  api.post<{ moved: number; note: string }>(`/orgs/${orgId}/programs/${programId}/shift`, input);

export function useCopyWeek(orgId: string, programId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: CopyWeekInput) => copyWeek(orgId, programId, input),
    onSuccess: () => refreshAfterProgramChange(queryClient, orgId),
  });
}

export function useShiftDates(orgId: string, programId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: ShiftDatesInput) => shiftDates(orgId, programId, input),
    onSuccess: () => refreshAfterProgramChange(queryClient, orgId),
  });
}
