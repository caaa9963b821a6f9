import type { Query, QueryClient, QueryKey } from '@tanstack/react-query';
import type { SessionDto } from '../../../policies/dto';
import { startedFromSessionCopy } from './api-client';
import { sessionQueryKey } from './query-client';

/**
 * The athlete's own screens from the last visit, readable without signal: the answers of a short list
 * of queries (the session, the organization, today's sessions and limits, the week, the logs, check-ins
 * and reports) are copied to this browser's storage under the signed-in person's id, and put back into
 * the query cache when the app starts. Only queries about one of the person's own athlete memberships
 * (or the organization as a whole) are copied: a coach's roster or another athlete's record never is.
 * A sign-out, or a session found ended, removes every copy. The service worker caches the app's files
 * only, never an API answer.
 */
const PREFIX = 'loadline.offline.';
const LAST_USER = `${PREFIX}last-user`;
const copyKey = (userId: string) => `${PREFIX}user.${userId}`;

/** Parts of the key (['orgs', orgId, part, …]) of queries about the organization as a whole. */
const ORG_WIDE = new Set(['organization', 'exercises']);
/** Parts of the key of queries about one athlete, copied only when that athlete is the person signed in. */
const ABOUT_AN_ATHLETE = new Set(['athletes', 'in-force', 'training-logs', 'check-ins', 'workload', 'pain-reports']);

interface Entry {
  key: QueryKey;
  data: unknown;
  updatedAt: number;
}

/** When this page load put the copies back: anything not refreshed since is shown from the copy. */
let restoredAt = 0;

function storage(): Storage | null {
  try {
    return typeof window === 'undefined' ? null : window.localStorage;
  } catch {
    return null;
  }
}

function ownAthleteIds(session: SessionDto | undefined): Set<string> {
  return new Set((session?.memberships ?? []).filter((m) => m.roles.includes('athlete')).map((m) => m.id));
}

function shouldCopy(key: QueryKey, athleteIds: Set<string>): boolean {
  if (key[0] !== 'orgs' || typeof key[2] !== 'string') return false;
  if (ORG_WIDE.has(key[2])) return athleteIds.size > 0;
  return ABOUT_AN_ATHLETE.has(key[2]) && key.some((part) => typeof part === 'string' && athleteIds.has(part));
}

export function clearOfflineCopies(): void {
  const store = storage();
  if (!store) return;
  for (const k of Object.keys(store)) if (k.startsWith(PREFIX)) store.removeItem(k);
}

function readCopy(userId: string): Entry[] {
  try {
    const parsed: unknown = JSON.parse(storage()?.getItem(copyKey(userId)) ?? '[]');
    return Array.isArray(parsed) ? (parsed as Entry[]) : [];
  } catch {
    return [];
  }
}

function save(userId: string, entry: Entry): void {
  const store = storage();
  if (!store) return;
  const hash = JSON.stringify(entry.key);
  const entries = readCopy(userId).filter((e) => JSON.stringify(e.key) !== hash);
  entries.push(entry);
  try {
    store.setItem(copyKey(userId), JSON.stringify(entries));
    store.setItem(LAST_USER, userId);
  } catch {
    // Storage full: the copy is a convenience, the app works without it.
  }
}

/**
 * Puts the last visit's copies back (before the first render) and keeps them up to date. Returns the
 * unsubscribe function.
 */
export function installOfflineCopy(queryClient: QueryClient): () => void {
  const store = storage();
  if (!store) return () => {};
  const lastUser = store.getItem(LAST_USER);
  if (lastUser) {
    for (const entry of readCopy(lastUser)) {
      queryClient.setQueryData(entry.key, entry.data, { updatedAt: entry.updatedAt });
      // Shown at once, but asked for again on first use: a copy is never taken for a fresh answer.
      void queryClient.invalidateQueries({ queryKey: entry.key, exact: true, refetchType: 'none' });
      if (entry.key[0] === sessionQueryKey[0]) startedFromSessionCopy();
    }
  }
  restoredAt = Date.now();

  return queryClient.getQueryCache().subscribe((event) => {
    if (event.type !== 'updated' || event.action.type !== 'success') return;
    const query: Query = event.query;
    const session = queryClient.getQueryData<SessionDto>(sessionQueryKey);
    if (query.queryKey[0] === sessionQueryKey[0]) {
      const fresh = query.state.data as SessionDto | undefined;
      // Signed out, someone else signed in, or no athlete to read offline: no copy is kept.
      if (!fresh?.user || store.getItem(LAST_USER) !== fresh.user.id || ownAthleteIds(fresh).size === 0) clearOfflineCopies();
      if (!fresh?.user || ownAthleteIds(fresh).size === 0) return;
      // The CSRF token is bound to the live session: never stored.
      save(fresh.user.id, { key: sessionQueryKey, data: { ...fresh, csrfToken: '' }, updatedAt: query.state.dataUpdatedAt });
      return;
    }
    if (!session?.user || !shouldCopy(query.queryKey, ownAthleteIds(session))) return;
    save(session.user.id, { key: query.queryKey, data: query.state.data, updatedAt: query.state.dataUpdatedAt });
  });
}

/**
 * When some of what a screen shows comes from the copy of an earlier visit and could not be refreshed
 * yet: the time of the oldest such answer, else null.
 */
export function oldestCopyShown(queries: { data: unknown; dataUpdatedAt: number }[]): number | null {
  const fromCopy = queries.filter((q) => q.data !== undefined && q.dataUpdatedAt > 0 && q.dataUpdatedAt < restoredAt);
  return fromCopy.length ? Math.min(...fromCopy.map((q) => q.dataUpdatedAt)) : null;
}
