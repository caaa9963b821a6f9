import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { RecordExportDto, RecordExportLinkDto, RecordExportsDto } from '../../../../../policies/dto';
import { api, errorFromResponse, getCsrfToken, ApiError } from '../../../lib/api-client';

export const recordExportsKey = (orgId: string) => ['orgs', orgId, 'record-exports'] as const;

/** Whose whole record the reader may ask for, and the copies they asked for (newest first). */
export function getRecordExports(orgId: string): Promise<RecordExportsDto> {
  return api.get<RecordExportsDto>(`/orgs/${orgId}/record-exports`);
}

export function getRecordExportsQueryOptions(orgId: string) {
  return queryOptions({ queryKey: recordExportsKey(orgId), queryFn: () => getRecordExports(orgId) });
}

/** While a copy is being prepared the list is read again every few seconds, so its state moves on by itself. */
export function useRecordExports(orgId: string, enabled = true) {
  return useQuery({
    ...getRecordExportsQueryOptions(orgId),
    enabled,
    refetchInterval: (q) => (q.state.data?.requests.some((r) => r.state === 'preparing') ? 3000 : false),
  });
}

export function requestRecordExport(orgId: string, athleteId: string): Promise<RecordExportDto> {
  return api.post<RecordExportDto>(`/orgs/${orgId}/record-exports`, { athleteId });
}

export function useRequestRecordExport(orgId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (athleteId: string) => requestRecordExport(orgId, athleteId),
    onSuccess: (created) => {
      // Shown at once as the newest request (preparing), so an older copy's state never stands in for it.
      queryClient.setQueryData<RecordExportsDto>(recordExportsKey(orgId), (old) =>
        old ? { ...old, requests: [created, ...old.requests.filter((r) => r.id !== created.id)] } : old,
      );
      void queryClient.invalidateQueries({ queryKey: recordExportsKey(orgId) });
    },
  });
}

/** What the e-mailed link opens to. The code goes in the body, never in a URL. */
export function checkRecordLink(orgId: string, token: string): Promise<RecordExportLinkDto> {
  return api.post<RecordExportLinkDto>(`/orgs/${orgId}/record-exports/link`, { token });
}

export function useRecordLink(orgId: string, token: string) {
  return useQuery({
    queryKey: [...recordExportsKey(orgId), 'link', token],
    queryFn: () => checkRecordLink(orgId, token),
    retry: false,
  });
}

/**
 * The ZIP itself. A POST (the code rides in the body), so it is fetched and handed to the browser as
 * a file: the same CSRF header as every write, and the server's error sentence when it refuses.
 */
export async function downloadRecord(orgId: string, token: string): Promise<void> {
  let response: Response;
  try {
    response = await fetch(`/api/orgs/${orgId}/record-exports/download`, {
      method: 'POST',
      headers: { 'Content-Type': 'application/json', Accept: 'application/zip', 'X-CSRF-Token': getCsrfToken() ?? '' },
      credentials: 'same-origin',
      body: JSON.stringify({ token }),
    });
  } catch {
    throw new ApiError({ status: 0, code: 'network', message: 'Loadline could not be reached. Check your connection and try again.' });
  }
  if (!response.ok) throw await errorFromResponse(response);
  const name = /filename="([^"]+)"/.exec(response.headers.get('Content-Disposition') ?? '')?.[1] ?? 'loadline-record.zip';
  const url = URL.createObjectURL(await response.blob());
  try {
    const a = document.createElement('a');
    a.href = url;
    a.download = name;
    document.body.appendChild(a);
    a.click();
    a.remove();
  } finally {
    // Revoked after the click has been handled: the browser has the file by then.
    setTimeout(() => URL.revokeObjectURL(url), 10_000);
  }
}

export function useDownloadRecord(orgId: string, token: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => downloadRecord(orgId, token),
    onSettled: () => void queryClient.invalidateQueries({ queryKey: recordExportsKey(orgId) }),
  });
}
