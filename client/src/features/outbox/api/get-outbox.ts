import { queryOptions, useQuery } from '@tanstack/react-query';
import type { OutboxMessageDto } from '../../../../../policies/dto';
import { api, isApiError } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';

/** The local test mail server's messages, newest first (admins; only while that server is in use). */
export function getOutbox(orgId: string): Promise<OutboxMessageDto[]> {
  return api.get<OutboxMessageDto[]>(`/orgs/${orgId}/outbox`);
}

export function getOutboxQueryOptions(orgId: string) {
  return queryOptions({ queryKey: queryKeys.outbox(orgId), queryFn: () => getOutbox(orgId), retry: false });
}

export function useOutbox(orgId: string) {
  return useQuery(getOutboxQueryOptions(orgId));
}

/** The server answers 404 when real mail is configured: there is no local mailbox to show. */
export function isOutboxOff(error: unknown): boolean {
  return isApiError(error) && error.status === 404;
}
