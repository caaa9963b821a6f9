import { useContext, useSyncExternalStore } from 'react';
import type { SessionDto } from '../../../policies/dto';
import { api, apiRequest, isApiError, setCsrfToken } from './api-client';
import { MembershipContext } from './membership-context';

/**
 * The phone's outbox: pain reports, check-ins and session logs made without signal are kept in this
 * browser's storage, under the signed-in person's id, and sent in the order they were made when the
 * connection returns. Each keeps the `Idempotency-Key` it was first tried with, so a send whose answer
 * was lost is answered from the server's store and never stored twice (server/src/http/idempotency.ts).
 * A log the server refuses on arrival (the planned session was deleted, a field no longer fits) stays
 * here with the server's sentence until the athlete retries or discards it.
 */
export type OutboxKind = 'pain_report' | 'check_in' | 'training_log';

export interface OutboxItem {
  /** Also the Idempotency-Key. */
  key: string;
  orgId: string;
  kind: OutboxKind;
  path: string;
  body: unknown;
  /** When the athlete made it (ISO instant). */
  madeAt: string;
  state: 'waiting' | 'rejected';
  /** The sentence the athlete reads, when Loadline refused it on arrival. */
  reason?: string;
  /** The fields the refusal named (e.g. `sessionId`), so the screen can offer the way out that fits. */
  refusedFields?: string[];
}

export type SendOutcome<T> = { sent: T } | { kept: OutboxItem };

const PREFIX = 'loadline.outbox.';
const storageKey = (userId: string) => `${PREFIX}${userId}`;

const listeners = new Set<() => void>();
const emit = () => listeners.forEach((l) => l());

function storage(): Storage | null {
  try {
    return typeof window === 'undefined' ? null : window.localStorage;
  } catch {
    return null;
  }
}

function readRaw(userId: string): string {
  return storage()?.getItem(storageKey(userId)) ?? '[]';
}

export function outboxOf(userId: string): OutboxItem[] {
  try {
    const parsed: unknown = JSON.parse(readRaw(userId));
    return Array.isArray(parsed) ? (parsed as OutboxItem[]) : [];
  } catch {
    return [];
  }
}

function write(userId: string, items: OutboxItem[]): void {
  const store = storage();
  if (!store) return;
  if (items.length === 0) store.removeItem(storageKey(userId));
  else store.setItem(storageKey(userId), JSON.stringify(items));
  emit();
}

function update(userId: string, key: string, change: (item: OutboxItem) => OutboxItem | null): void {
  write(
    userId,
    outboxOf(userId).flatMap((item) => {
      if (item.key !== key) return [item];
      const next = change(item);
      return next ? [next] : [];
    }),
  );
}

export const discardOutboxItem = (userId: string, key: string) => update(userId, key, () => null);

/** Every outbox on this browser goes with a deliberate sign-out: a shared phone keeps nobody's health data. */
export function clearAllOutboxes(): void {
  const store = storage();
  if (!store) return;
  for (const k of Object.keys(store)) if (k.startsWith(PREFIX)) store.removeItem(k);
  emit();
}

const newKey = () => crypto.randomUUID();

/**
 * Sends a write now, or keeps it when Loadline cannot be reached. Anything already waiting goes first,
 * so a new write never overtakes an older one. Refusals with an answer (400, 404, 422…) are thrown as
 * usual: the athlete is looking at the form and can fix it there.
 */
export async function sendOrKeep<T>(
  userId: string | null,
  item: { orgId: string; kind: OutboxKind; path: string; body: unknown },
): Promise<SendOutcome<T>> {
  const key = newKey();
  const kept = (): SendOutcome<T> => {
    const entry: OutboxItem = { ...item, key, madeAt: new Date().toISOString(), state: 'waiting' };
    write(userId!, [...outboxOf(userId!), entry]);
    return { kept: entry };
  };
  if (userId && outboxOf(userId).some((i) => i.state === 'waiting')) {
    const result = kept();
    void flushOutbox(userId);
    return result;
  }
  try {
    return { sent: await apiRequest<T>('POST', item.path, { body: item.body, idempotencyKey: key }) };
  } catch (error) {
    if (userId && isApiError(error) && error.code === 'network') return kept();
    throw error;
  }
}

/**
 * What the athlete reads for a refusal on arrival: the server's sentence, except where it names a field
 * the athlete never typed (the planned session a log was made from).
 */
export function rejectionReason(item: Pick<OutboxItem, 'kind'>, error: unknown): string {
  if (!isApiError(error)) return 'Loadline did not accept it.';
  if (item.kind === 'training_log' && error.fields.sessionId)
    return 'The planned session it was logged against is no longer in your program: your coach may have moved or removed it.';
  return error.message;
}

/** A session log refused only because its planned session is gone can still be sent as a session of its own. */
export function canSendWithoutPlan(item: OutboxItem): boolean {
  return item.kind === 'training_log' && item.state === 'rejected' && (item.refusedFields ?? []).includes('sessionId');
}

/** Worth another try later: no answer, a server fault, a limit, the same key still running, or signed out. */
function tryLater(error: unknown): boolean {
  if (!isApiError(error)) return true;
  return error.code === 'network' || error.status >= 500 || error.status === 409 || error.status === 429 || error.status === 401;
}

const flushing = new Map<string, Promise<number>>();

/**
 * Sends what is waiting, oldest first, and answers how many arrived. Stops at the first that cannot
 * be sent yet (still offline), so the order holds; one refused on arrival is marked with the reason
 * and the rest go on. Runs once at a time per person.
 */
export function flushOutbox(userId: string, onSent?: (item: OutboxItem) => void): Promise<number> {
  const running = flushing.get(userId);
  if (running) return running;
  const run = (async () => {
    if (!outboxOf(userId).some((i) => i.state === 'waiting')) return 0;
    // A fresh CSRF token, and proof the same person is still signed in before anything is sent.
    let session: SessionDto;
    try {
      session = await api.get<SessionDto>('/session');
    } catch {
      return 0;
    }
    setCsrfToken(session.csrfToken);
    if (session.user?.id !== userId) return 0;
    let sent = 0;
    for (const item of outboxOf(userId)) {
      if (item.state !== 'waiting') continue;
      try {
        await apiRequest('POST', item.path, { body: item.body, idempotencyKey: item.key });
        discardOutboxItem(userId, item.key);
        sent += 1;
        onSent?.(item);
      } catch (error) {
        if (tryLater(error)) break;
        update(userId, item.key, (i) => ({
          ...i,
          state: 'rejected',
          reason: rejectionReason(i, error),
          refusedFields: isApiError(error) ? Object.keys(error.fields) : [],
        }));
      }
    }
    return sent;
  })().finally(() => flushing.delete(userId));
  flushing.set(userId, run);
  return run;
}

/**
 * Back in the queue, in its old place, for the next send. Sent without its planned session, it is another
 * request, so it gets a new Idempotency-Key (the server refuses one key reused with another body).
 */
export function retryOutboxItem(userId: string, key: string, options: { withoutPlan?: boolean } = {}): void {
  update(userId, key, (i) => {
    const again: OutboxItem = { ...i, state: 'waiting', reason: undefined, refusedFields: undefined };
    if (!options.withoutPlan) return again;
    const { sessionId: _dropped, ...body } = (i.body ?? {}) as Record<string, unknown>;
    return { ...again, key: newKey(), body };
  });
}

const snapshots = new Map<string, { raw: string; items: OutboxItem[] }>();

function subscribe(listener: () => void): () => void {
  listeners.add(listener);
  // Another tab of the same person changes the same storage.
  window.addEventListener('storage', listener);
  return () => {
    listeners.delete(listener);
    window.removeEventListener('storage', listener);
  };
}

/** The outbox of a person, re-read whenever it changes. */
export function useOutbox(userId: string | null): OutboxItem[] {
  return useSyncExternalStore(subscribe, () => {
    if (!userId) return EMPTY;
    const raw = readRaw(userId);
    const cached = snapshots.get(userId);
    if (cached && cached.raw === raw) return cached.items;
    const items = outboxOf(userId);
    snapshots.set(userId, { raw, items });
    return items;
  });
}
const EMPTY: OutboxItem[] = [];

/** The signed-in person's id, when there is one (forms are also rendered alone in tests). */
export function useSignedInUserId(): string | null {
  return useContext(MembershipContext)?.user.id ?? null;
}
