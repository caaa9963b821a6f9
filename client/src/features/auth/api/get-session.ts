import { queryOptions, useQuery } from '@tanstack/react-query';
import type { SessionDto } from '../../../../../policies/dto';
import { api, setCsrfToken } from '../../../lib/api-client';
import { sessionQueryKey } from '../../../lib/query-client';

/** Every SessionDto carries the newest CSRF token; keep it before anyone else sees the session. */
export function rememberSession(session: SessionDto): SessionDto {
  setCsrfToken(session.csrfToken);
  return session;
}

export async function getSession(): Promise<SessionDto> {
  return rememberSession(await api.get<SessionDto>('/session'));
}

export function getSessionQueryOptions() {
  return queryOptions({ queryKey: sessionQueryKey, queryFn: getSession, staleTime: 60_000 });
}

export function useSession() {
  return useQuery(getSessionQueryOptions());
}
