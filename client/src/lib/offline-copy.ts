import type { Query, QueryClient, QueryKey } from '@tanstack/react-query';
import type { SessionDto } from '../../../policies/dto';
import { startedFromSessionCopy } from './api-client';
import { sessionQueryKey } from './query-client';

/**
 * The athlete's own screens from the last visit, readable without signal: the answers of a short list
 * of queries (the session, the organization, today's sessions and limits, the week, the logs, check-ins,
 * reports and the clearance letters) are copied to this browser's storage under the signed-in person's id, and put back into
 * the query cache when the app starts. Only queries about one of the person's own athlete memberships
 * (or the organization as a whole) are copied: a coach's roster or another athlete's record never is.
 * A guardian's page is copied the same way, narrower: the athletes they are linked to, their status and
 * limits today and their clearance letters — lists kept only with the entries about those athletes.
 * A sign-out, or a session found ended, removes every copy. The service worker caches the app's files
 * only, never an API answer.
 */
const PREFIX = 'loadline.offline.';
const LAST_USER = `${PREFIX}last-user`;
const copyKey = (userId: string) => `${PREFIX}user.${userId}`;

/** Parts of the key (['orgs', orgId, part, …]) of queries about the organization as a whole. */
const ORG_WIDE = new Set(['organization', 'exercises']);
/** Parts of the key of queries about one athlete, copied only when that athlete is the person signed in. */
const ABOUT_AN_ATHLETE = new Set(['athletes', 'in-force', 'training-logs', 'check-ins', 'workload', 'pain-reports', 'letters']);
/** Parts of the key of queries about an athlete the person is guardian of: what the guardian's page shows. */
const ABOUT_A_WARD = new Set(['in-force', 'letters']);

/** The athlete ids a key names: plain parts, and the `athleteId` of an object part (`{ athleteId }` of letters). */
function namesAthlete(key: QueryKey, athleteIds: Set<string>): boolean {
  return key.some((part) => {
    if (typeof part === 'string') return athleteIds.has(part);
    const id = part && typeof part === 'object' ? (part as { athleteId?: unknown }).athleteId : undefined;
    return typeof id === 'string' && athleteIds.has(id);
  });
}

/**
 * Many copied queries are keyed by a day (today's sessions, what is in force on a date, the week from
 * today, a range of logs). On a later day the screen asks for a new key; the copy of the latest earlier
 * day is shown in its place, marked with when it was saved, rather than nothing (phone first: the app
 * works without signal). A few days per kind of query are kept, so the copy does not grow with every
 * day the app is opened.
 */
const DAYS_KEPT_PER_KIND = 3;
const ISO_DAY = /^\d{4}-\d{2}-\d{2}$/;

/** The key's days, in order: plain parts and the values of object parts (a `{ from, to }` range). */
function daysIn(key: QueryKey): string[] {
  return key.flatMap((part) => {
    if (typeof part === 'string') return ISO_DAY.test(part) ? [part] : [];
    if (part && typeof part === 'object') return Object.values(part).filter((v): v is string => typeof v === 'string' && ISO_DAY.test(v));
    return [];
  });
}

/** The latest day the key names, or null for a key about no day. */
function dayOfKey(key: QueryKey): string | null {
  const days = daysIn(key);
  return days.length ? days.reduce((a, b) => (a > b ? a : b)) : null;
}

/** The key with its days left out: keys of one kind of query, for different days, share it. */
function kindOf(key: QueryKey): string {
  return JSON.stringify(key, (_k, value: unknown) => (typeof value === 'string' && ISO_DAY.test(value) ? 'day' : value));
}

interface Entry {
  key: QueryKey;
  data: unknown;
  updatedAt: number;
}

/** When this page load put the copies back: anything not refreshed since is shown from the copy. */
let restoredAt = 0;
/** Answers put in for a later day's key (even from a copy saved during this visit): always marked. */
const fromEarlierDay = new WeakSet<object>();

function storage(): Storage | null {
  try {
    return typeof window === 'undefined' ? null : window.localStorage;
  } catch {
    return null;
  }
}

/** Whose records a person's copy may hold: their own athlete memberships, and the athletes they are guardian of. */
interface CopyScope {
  own: Set<string>;
  wards: Set<string>;
  /** Organizations where the person is a guardian: their lists of athletes and letters are copied, cut to `wards`. */
  guardianIn: Set<string>;
}

function scopeOf(session: SessionDto | undefined): CopyScope {
  const memberships = session?.memberships ?? [];
  const guardians = memberships.filter((m) => m.roles.includes('guardian'));
  return {
    own: new Set(memberships.filter((m) => m.roles.includes('athlete')).map((m) => m.id)),
    wards: new Set(guardians.flatMap((m) => m.actor?.guardianOf ?? [])),
    guardianIn: new Set(guardians.map((m) => m.organizationId)),
  };
}

const keepsACopy = (scope: CopyScope) => scope.own.size > 0 || scope.wards.size > 0;

/**
 * The lists a guardian's page reads with no athlete in the key (the athletes they may see, every letter
 * they may read), with the athlete each entry is about. Someone who is also staff reads more in them.
 */
function wardListItemAthlete(key: QueryKey): ((item: unknown) => unknown) | null {
  if (key.length === 3 && key[2] === 'athletes') return (item) => (item as { id?: unknown } | null)?.id;
  const filter = key[3] as { athleteId?: unknown } | undefined;
  if (key.length === 4 && key[2] === 'letters' && filter && typeof filter === 'object' && filter.athleteId === null)
    return (item) => (item as { athleteId?: unknown } | null)?.athleteId;
  return null;
}

/** What to keep of an answer: all of it, only its entries about the guardian's athletes, or nothing (undefined). */
function copyOf(key: QueryKey, data: unknown, scope: CopyScope): { data: unknown } | undefined {
  if (!keepsACopy(scope) || key[0] !== 'orgs' || typeof key[1] !== 'string' || typeof key[2] !== 'string') return undefined;
  if (ORG_WIDE.has(key[2])) return { data };
  if (ABOUT_AN_ATHLETE.has(key[2]) && namesAthlete(key, scope.own)) return { data };
  if (ABOUT_A_WARD.has(key[2]) && namesAthlete(key, scope.wards)) return { data };
  const athleteOf = wardListItemAthlete(key);
  if (athleteOf && scope.guardianIn.has(key[1]) && Array.isArray(data))
    return { data: data.filter((item) => scope.wards.has(athleteOf(item) as string)) };
  return undefined;
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
  const entries = keepLatestDays([...readCopy(userId).filter((e) => JSON.stringify(e.key) !== hash), entry]);
  try {
    store.setItem(copyKey(userId), JSON.stringify(entries));
    store.setItem(LAST_USER, userId);
  } catch {
    // Storage full: the copy is a convenience, the app works without it.
  }
}

/** Of the entries keyed by a day, the latest few days of each kind; entries about no day stay. */
function keepLatestDays(entries: Entry[]): Entry[] {
  const byKind = new Map<string, Entry[]>();
  for (const e of entries) {
    if (dayOfKey(e.key) === null) continue;
    const kind = kindOf(e.key);
    byKind.set(kind, [...(byKind.get(kind) ?? []), e]);
  }
  const dropped = new Set<Entry>();
  for (const same of byKind.values()) {
    same.sort((a, b) => dayOfKey(b.key)!.localeCompare(dayOfKey(a.key)!) || b.updatedAt - a.updatedAt);
    same.slice(DAYS_KEPT_PER_KIND).forEach((e) => dropped.add(e));
  }
  return entries.filter((e) => !dropped.has(e));
}

/** The copy of the latest day before the key's own, of the same kind of query; null when there is none. */
function copyOfEarlierDay(entries: Entry[], key: QueryKey): Entry | null {
  const day = dayOfKey(key);
  if (day === null) return null;
  const kind = kindOf(key);
  let best: Entry | null = null;
  for (const e of entries) {
    const eDay = dayOfKey(e.key);
    if (eDay === null || eDay >= day || kindOf(e.key) !== kind) continue;
    if (!best || eDay > dayOfKey(best.key)! || (eDay === dayOfKey(best.key) && e.updatedAt > best.updatedAt)) best = e;
  }
  return best;
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

  /** Set while a copy of an earlier day is put in: it is the copy, not a new answer to save. */
  let filling = false;
  /**
   * A query asked for on a later day than the copy was saved (the key names today): shown from the
   * latest earlier day's copy, with that copy's own time, so the screen says when it was last updated.
   * Only for the person the copy belongs to; the query is still asked for on first use.
   */
  const fillFromEarlierDay = (query: Query) => {
    if (query.state.data !== undefined) return;
    const owner = store.getItem(LAST_USER);
    if (!owner || queryClient.getQueryData<SessionDto>(sessionQueryKey)?.user?.id !== owner) return;
    const entry = copyOfEarlierDay(readCopy(owner), query.queryKey);
    if (!entry) return;
    if (entry.data !== null && typeof entry.data === 'object') fromEarlierDay.add(entry.data);
    filling = true;
    try {
      queryClient.setQueryData(query.queryKey, entry.data, { updatedAt: entry.updatedAt });
    } finally {
      filling = false;
    }
    // Shown at once, but asked for again on first use, as a restored copy is.
    query.invalidate();
  };

  return queryClient.getQueryCache().subscribe((event) => {
    if (event.type === 'added') {
      if (dayOfKey(event.query.queryKey) !== null) fillFromEarlierDay(event.query);
      return;
    }
    if (filling || event.type !== 'updated' || event.action.type !== 'success') return;
    const query: Query = event.query;
    const session = queryClient.getQueryData<SessionDto>(sessionQueryKey);
    if (query.queryKey[0] === sessionQueryKey[0]) {
      const fresh = query.state.data as SessionDto | undefined;
      // Signed out, someone else signed in, or no athlete of one's own or in one's care: no copy is kept.
      const user = fresh?.user;
      const keeps = !!user && keepsACopy(scopeOf(fresh));
      if (!user || !keeps || store.getItem(LAST_USER) !== user.id) clearOfflineCopies();
      if (!user || !keeps) return;
      // The CSRF token is bound to the live session: never stored.
      save(user.id, { key: sessionQueryKey, data: { ...fresh, csrfToken: '' }, updatedAt: query.state.dataUpdatedAt });
      return;
    }
    if (!session?.user) return;
    const copy = copyOf(query.queryKey, query.state.data, scopeOf(session));
    if (copy) save(session.user.id, { key: query.queryKey, data: copy.data, updatedAt: query.state.dataUpdatedAt });
  });
}

/**
 * When some of what a screen shows comes from the copy of an earlier visit and could not be refreshed
 * yet: the time of the oldest such answer, else null.
 */
export function oldestCopyShown(queries: { data: unknown; dataUpdatedAt: number }[]): number | null {
  const fromCopy = queries.filter(
    (q) =>
      q.data !== undefined &&
      q.dataUpdatedAt > 0 &&
      (q.dataUpdatedAt < restoredAt || (q.data !== null && typeof q.data === 'object' && fromEarlierDay.has(q.data))),
  );
  return fromCopy.length ? Math.min(...fromCopy.map((q) => q.dataUpdatedAt)) : null;
}
