import { keepPreviousData, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { InjuryReportDto, TeamSessionHoursDto } from '../../../../../policies/dto/injury-report';
import type { TeamSessionKind } from '../../../../../policies/schemas/injury-report';
import { api } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';

/** The injury report and team session hours (server: routes/injury-report). */

export const injuryReportKeys = {
  all: (orgId: string) => [...queryKeys.org(orgId), 'injury-report'] as const,
  one: (orgId: string, from: string, to: string) => [...queryKeys.org(orgId), 'injury-report', { from, to }] as const,
};

const period = (from: string, to: string) => `from=${encodeURIComponent(from)}&to=${encodeURIComponent(to)}`;

export function useInjuryReport(orgId: string, from: string, to: string, enabled = true) {
  return useQuery({
    queryKey: injuryReportKeys.one(orgId, from, to),
    queryFn: () => api.get<InjuryReportDto>(`/orgs/${orgId}/injury-report?${period(from, to)}`),
    enabled,
    placeholderData: keepPreviousData,
  });
}

export const injuryReportCsvHref = (orgId: string, from: string, to: string) => `/api/orgs/${orgId}/injury-report.csv?${period(from, to)}`;

export interface SessionHoursValues {
  date: string;
  minutes: number;
  kind: TeamSessionKind;
  athleteIds: string[];
}

export function useRecordSessionHours(orgId: string, groupId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (values: SessionHoursValues) => api.post<TeamSessionHoursDto>(`/orgs/${orgId}/groups/${groupId}/session-hours`, values),
    onSuccess: () => void queryClient.invalidateQueries({ queryKey: injuryReportKeys.all(orgId) }),
  });
}
