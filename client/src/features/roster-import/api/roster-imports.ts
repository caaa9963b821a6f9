import { useCallback } from 'react';
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { RosterImportDto, RosterLastCheckDto, RosterPreviewDto } from '../../../../../policies/dto';
import { api } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';
import { uploadForm, uploadWithProgress, type UploadOptions } from '../../../lib/upload';
import type { FileUploadVariables } from '../../../lib/use-file-upload';

/**
 * Bringing a roster from a CSV: the server's template, the upload that answers with a preview and
 * writes no people, the start of the background import, and its progress, polled while it runs.
 */
export const rosterImportKey = (orgId: string, id: string) => ['orgs', orgId, 'roster-imports', id] as const;

/** The admin's last checked file not yet imported: kept by the server, so a reload shows it again. */
export const rosterLastCheckKey = (orgId: string) => ['orgs', orgId, 'roster-imports', 'last-check'] as const;

/** Served by the server from the same column list it reads uploads with (policies/roster.ts). */
export const rosterTemplateHref = (orgId: string) => `/api/orgs/${orgId}/roster-imports/template.csv`;

export function previewRoster(orgId: string, file: File, options?: UploadOptions): Promise<RosterPreviewDto> {
  return uploadWithProgress<RosterPreviewDto>(`/orgs/${orgId}/roster-imports`, uploadForm({}, file, file.name), options);
}

/** The upload has no text fields; the shape matches useFileUpload's so the shared form parts apply. */
export function usePreviewRoster(orgId: string) {
  return useMutation({
    mutationFn: ({ file, options }: FileUploadVariables<Record<string, never>>) => previewRoster(orgId, file, options),
  });
}

export function getLastRosterCheck(orgId: string): Promise<RosterLastCheckDto> {
  return api.get<RosterLastCheckDto>(`/orgs/${orgId}/roster-imports/last-check`);
}

export function getLastRosterCheckQueryOptions(orgId: string) {
  return queryOptions({ queryKey: rosterLastCheckKey(orgId), queryFn: () => getLastRosterCheck(orgId) });
}

/** Read when the page opens on no started import; a new check or a start writes it in place. */
export function useLastRosterCheck(orgId: string, enabled: boolean) {
  return useQuery({ ...getLastRosterCheckQueryOptions(orgId), enabled });
}

export function startRosterImport(orgId: string, id: string): Promise<RosterImportDto> {
  return api.post<RosterImportDto>(`/orgs/${orgId}/roster-imports/${id}/start`);
}

export function useStartRosterImport(orgId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (id: string) => startRosterImport(orgId, id),
    onSuccess: (started) => {
      queryClient.setQueryData(rosterImportKey(orgId, started.id), started);
      // A started file is no longer waiting: the server answers none from now on.
      queryClient.setQueryData<RosterLastCheckDto>(rosterLastCheckKey(orgId), { preview: null });
    },
  });
}

export function getRosterImport(orgId: string, id: string): Promise<RosterImportDto> {
  return api.get<RosterImportDto>(`/orgs/${orgId}/roster-imports/${id}`);
}

export const isUnderWay = (r: RosterImportDto | undefined) => r?.status === 'queued' || r?.status === 'running';

/** Polling interval while the import runs: often enough for a bar that moves, cheap for the server. */
export const ROSTER_POLL_MS = 1000;

export function getRosterImportQueryOptions(orgId: string, id: string) {
  return queryOptions({ queryKey: rosterImportKey(orgId, id), queryFn: () => getRosterImport(orgId, id) });
}

/** Read again every second while queued or running; still once it is done or stopped. */
export function useRosterImport(orgId: string, id: string) {
  return useQuery({
    ...getRosterImportQueryOptions(orgId, id),
    refetchInterval: (q) => (isUnderWay(q.state.data) ? ROSTER_POLL_MS : false),
  });
}

/** What an import changes shows elsewhere: the people, their invitations, the audit trail. */
export function useRefreshAfterImport(orgId: string) {
  const queryClient = useQueryClient();
  return useCallback(() => {
    for (const key of [queryKeys.people(orgId), queryKeys.invitations(orgId), queryKeys.audit(orgId)])
      void queryClient.invalidateQueries({ queryKey: key });
  }, [orgId, queryClient]);
}
