import { MutationCache, QueryCache, QueryClient } from '@tanstack/react-query';
import { isApiError } from './api-client';

/** The session query is shared infrastructure: the app gates on it and features read from it. */
export const sessionQueryKey = ['session'] as const;

/** Client errors will not change on a retry; only a lost connection or a server fault might. */
function shouldRetry(failureCount: number, error: unknown): boolean {
  if (isApiError(error) && error.status >= 400 && error.status < 500) return false;
  return failureCount < 2;
}

export function createQueryClient(): QueryClient {
  const client: QueryClient = new QueryClient({
    queryCache: new QueryCache({ onError: (error) => onAnyError(error) }),
    mutationCache: new MutationCache({ onError: (error) => onAnyError(error) }),
    defaultOptions: {
      queries: { retry: shouldRetry, staleTime: 30_000, refetchOnWindowFocus: true },
      mutations: { retry: false },
    },
  });

  /**
   * A 401 means the session ended (expired, or signed out in another tab); a csrf_failed means our
   * token is stale. Either way, reload the session: the route guard then sends a signed-out person
   * to the sign-in page, and a signed-in one gets a fresh token for the next try.
   */
  function onAnyError(error: unknown): void {
    if (!isApiError(error)) return;
    if (error.status === 401 && error.code !== 'invalid_credentials') {
      void client.invalidateQueries({ queryKey: sessionQueryKey });
    } else if (error.code === 'csrf_failed') {
      void client.invalidateQueries({ queryKey: sessionQueryKey });
    }
  }

  return client;
}
