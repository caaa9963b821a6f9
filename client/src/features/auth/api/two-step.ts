import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { TwoStepEnabledDto, TwoStepSetupDto, TwoStepStatusDto } from '../../../../../policies/dto';
import type { TwoStepDisableInput, TwoStepEnableInput } from '../../../../../policies/schemas';
import { api } from '../../../lib/api-client';

export const twoStepQueryKey = ['account', 'two-step'] as const;

export function twoStepQueryOptions() {
  return queryOptions({ queryKey: twoStepQueryKey, queryFn: () => api.get<TwoStepStatusDto>('/account/two-step') });
}

export function useTwoStepStatus() {
  return useQuery(twoStepQueryOptions());
}

export function useStartTwoStepSetup() {
  return useMutation({ mutationFn: () => api.post<TwoStepSetupDto>('/account/two-step/setup') });
}

export function useEnableTwoStep() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: TwoStepEnableInput) => api.post<TwoStepEnabledDto>('/account/two-step/enable', input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: twoStepQueryKey }),
  });
}

export function useDisableTwoStep() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: TwoStepDisableInput) => api.post<void>('/account/two-step/disable', input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: twoStepQueryKey }),
  });
}

export function useRenewRecoveryCodes() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: TwoStepDisableInput) => api.post<TwoStepEnabledDto>('/account/two-step/recovery-codes', input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: twoStepQueryKey }),
  });
}
