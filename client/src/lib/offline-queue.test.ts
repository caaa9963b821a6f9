import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import {
  canSendWithoutPlan,
  discardOutboxItem,
  flushOutbox,
  outboxOf,
  rejectionReason,
  retryOutboxItem,
  sendOrKeep,
  type OutboxItem,
} from './offline-queue';
import { ApiError } from './api-client';

/**
 * The phone's outbox (phone first: the app works without signal), driven through the real API client against
 * a fake server in place of fetch: kept in order when there is no signal, each with one Idempotency-Key for
 * all its tries (draft-ietf-httpapi-idempotency-key-header), a refusal on arrival kept with its reason until
 * the athlete acts, server faults and lost connections tried again later, and nothing lost on a reload.
 */
const USER = 'user-1';
const ORG = 'org-1';

type Answer = { status: number; body?: unknown } | 'offline';
interface Sent {
  path: string;
  key: string | null;
  body: Record<string, unknown>;
}

/** A fake Loadline: GET /api/session answers who is signed in; each POST takes the next scripted answer. */
function fakeServer(signedIn: string | null = USER) {
  const sent: Sent[] = [];
  const answers: Answer[] = [];
  let online = true;
  const reply = (status: number, body: unknown) =>
    new Response(JSON.stringify(body), { status, headers: { 'Content-Type': 'application/json' } });
  const fetchStub = vi.fn(async (url: string, init: RequestInit) => {
    if (!online) throw new TypeError('Failed to fetch');
    if (init.method === 'GET') return reply(200, { user: signedIn ? { id: signedIn } : null, memberships: [], csrfToken: 'fresh' });
    const answer = answers.shift() ?? { status: 201, body: { ok: true } };
    if (answer === 'offline') throw new TypeError('Failed to fetch');
    const headers = init.headers as Record<string, string>;
    sent.push({ path: url, key: headers['Idempotency-Key'] ?? null, body: JSON.parse(String(init.body)) as Record<string, unknown> });
    return reply(answer.status, answer.body ?? {});
  });
  vi.stubGlobal('fetch', fetchStub);
  return {
    sent,
    /** The next POSTs' answers, in order; after them every POST is stored (201). */
    answer: (...next: Answer[]) => answers.push(...next),
    setOnline: (value: boolean) => (online = value),
  };
}

const refusal = (message: string, fields: Record<string, string[]> = {}) => ({
  status: 400,
  body: { error: { code: 'validation_failed', message, fields }, requestId: 'r1' },
});

const log = (notes: string, extra: Record<string, unknown> = {}) => ({
  orgId: ORG,
  kind: 'training_log' as const,
  path: `/orgs/${ORG}/training-logs`,
  body: { notes, ...extra },
});

/** Makes entries while there is no signal; answers their outbox items. */
async function keptOffline(server: ReturnType<typeof fakeServer>, ...notes: string[]): Promise<OutboxItem[]> {
  server.setOnline(false);
  for (const n of notes) {
    const outcome = await sendOrKeep(USER, log(n));
    expect(outcome).toHaveProperty('kept');
  }
  // A second entry starts a send of what waits; let it finish (it fails: no signal yet).
  await flushOutbox(USER);
  server.setOnline(true);
  return outboxOf(USER);
}

beforeEach(() => localStorage.clear());
afterEach(() => {
  vi.unstubAllGlobals();
  localStorage.clear();
});

describe('the outbox', () => {
  it('keeps entries made without signal and sends them in the order they were made', async () => {
    const server = fakeServer();
    const kept = await keptOffline(server, 'first', 'second', 'third');
    expect(kept.map((i) => [i.state, (i.body as { notes: string }).notes])).toEqual([
      ['waiting', 'first'],
      ['waiting', 'second'],
      ['waiting', 'third'],
    ]);

    expect(await flushOutbox(USER)).toBe(3);
    expect(server.sent.map((s) => s.body.notes)).toEqual(['first', 'second', 'third']);
    expect(outboxOf(USER)).toEqual([]);
  });

  it('never lets a new entry overtake one still waiting', async () => {
    const server = fakeServer();
    await keptOffline(server, 'older');
    server.answer('offline');
    // Signal is back but the older entry's send fails again: the newer one waits behind it.
    const outcome = await sendOrKeep(USER, log('newer'));
    expect(outcome).toHaveProperty('kept');
    // The send it started (the older one, lost again) is the one running now.
    expect(await flushOutbox(USER)).toBe(0);
    expect(outboxOf(USER).map((i) => (i.body as { notes: string }).notes)).toEqual(['older', 'newer']);
    expect(await flushOutbox(USER)).toBe(2);
    expect(server.sent.map((s) => s.body.notes)).toEqual(['older', 'newer']);
  });

  it('sends one entry with the same Idempotency-Key on every try, so the server stores it once', async () => {
    const server = fakeServer();
    server.setOnline(false);
    const outcome = await sendOrKeep(USER, log('one session'));
    const key = 'kept' in outcome ? outcome.kept.key : '';
    expect(key).toMatch(/^[0-9a-f-]{36}$/);
    server.setOnline(true);

    server.answer({ status: 503 }, 'offline', { status: 500 }, { status: 201 });
    for (let i = 0; i < 3; i++) {
      expect(await flushOutbox(USER)).toBe(0);
      expect(outboxOf(USER)).toMatchObject([{ key, state: 'waiting' }]);
    }
    expect(await flushOutbox(USER)).toBe(1);
    // Three answered tries (the lost one never reached the server), all with the first key.
    expect(server.sent.map((s) => s.key)).toEqual([key, key, key]);
  });

  it('stops at a server fault or a lost connection, so the order holds, and tries again later', async () => {
    const server = fakeServer();
    await keptOffline(server, 'A', 'B');
    server.answer({ status: 502 });
    expect(await flushOutbox(USER)).toBe(0);
    expect(server.sent.map((s) => s.body.notes)).toEqual(['A']);
    expect(outboxOf(USER).map((i) => i.state)).toEqual(['waiting', 'waiting']);

    expect(await flushOutbox(USER)).toBe(2);
    expect(server.sent.map((s) => s.body.notes)).toEqual(['A', 'A', 'B']);
  });

  it('keeps a refusal on arrival with its reason until the athlete acts; the rest go on', async () => {
    const server = fakeServer();
    await keptOffline(server, 'refused', 'fine');
    server.answer(refusal('Please check the form: date must not be in the future.', { date: ['must not be in the future'] }));
    expect(await flushOutbox(USER)).toBe(1);
    const [item] = outboxOf(USER);
    expect(item).toMatchObject({ state: 'rejected', reason: 'Please check the form: date must not be in the future.' });

    // Not sent again on its own, however often the outbox is flushed.
    expect(await flushOutbox(USER)).toBe(0);
    expect(server.sent).toHaveLength(2);
    expect(outboxOf(USER)).toHaveLength(1);

    discardOutboxItem(USER, item.key);
    expect(outboxOf(USER)).toEqual([]);
  });

  it('sends a refused entry again, with its own key, when the athlete asks', async () => {
    const server = fakeServer();
    const [item] = await keptOffline(server, 'again');
    server.answer({ status: 422, body: { error: { code: 'unprocessable', message: 'Not now.' } } });
    await flushOutbox(USER);
    retryOutboxItem(USER, item.key);
    expect(outboxOf(USER)).toMatchObject([{ key: item.key, state: 'waiting' }]);
    expect(outboxOf(USER)[0].reason).toBeUndefined();
    expect(await flushOutbox(USER)).toBe(1);
    expect(server.sent.map((s) => s.key)).toEqual([item.key, item.key]);
  });

  it('names a removed planned session in plain words and can send the log as a session of its own', async () => {
    const server = fakeServer();
    server.setOnline(false);
    await sendOrKeep(USER, log('planned', { sessionId: 'gone-session' }));
    server.setOnline(true);
    server.answer(
      refusal('Please check the form: sessionId is not a published session planned for this athlete.', {
        sessionId: ['must be a published session planned for this athlete'],
      }),
    );
    await flushOutbox(USER);
    const [item] = outboxOf(USER);
    expect(item.reason).toBe(
      'The planned session it was logged against is no longer in your program: your coach may have moved or removed it.',
    );
    expect(item.reason).not.toContain('sessionId');
    expect(canSendWithoutPlan(item)).toBe(true);

    retryOutboxItem(USER, item.key, { withoutPlan: true });
    const [again] = outboxOf(USER);
    expect(again.key).not.toBe(item.key);
    expect(again.body).toEqual({ notes: 'planned' });
    expect(await flushOutbox(USER)).toBe(1);
    expect(server.sent.at(-1)).toMatchObject({ key: again.key, body: { notes: 'planned' } });
  });

  it('sends nothing while signed out or signed in as someone else, and keeps it all', async () => {
    const server = fakeServer('someone-else');
    await keptOffline(server, 'mine');
    expect(await flushOutbox(USER)).toBe(0);
    expect(server.sent).toEqual([]);
    expect(outboxOf(USER)).toHaveLength(1);
  });

  it('throws a refusal of a write made with signal, for the form to show, and keeps nothing', async () => {
    const server = fakeServer();
    server.answer(refusal('Please check the form: duration must be at most 600.'));
    await expect(sendOrKeep(USER, log('bad'))).rejects.toBeInstanceOf(ApiError);
    expect(outboxOf(USER)).toEqual([]);
  });

  it('loses nothing on a reload: a fresh copy of the module reads the same entries, keys and reasons', async () => {
    const server = fakeServer();
    await keptOffline(server, 'refused', 'kept');
    server.answer(refusal('Not accepted.'), 'offline');
    await flushOutbox(USER);
    const before = outboxOf(USER);
    expect(before.map((i) => [i.state, i.reason])).toEqual([
      ['rejected', 'Not accepted.'],
      ['waiting', undefined],
    ]);

    vi.resetModules();
    const reloaded = await import('./offline-queue');
    expect(reloaded.outboxOf(USER)).toEqual(before);
    expect(await reloaded.flushOutbox(USER)).toBe(1);
    expect(reloaded.outboxOf(USER)).toEqual([before[0]]);
    expect(server.sent.map((s) => s.key)).toEqual([before[0].key, before[1].key]);
  });
});

describe('rejectionReason', () => {
  it("is the server's sentence for other refusals", () => {
    expect(rejectionReason({ kind: 'check_in' }, new ApiError({ status: 400, code: 'validation_failed', message: 'Too late.' }))).toBe(
      'Too late.',
    );
    expect(rejectionReason({ kind: 'pain_report' }, new Error('odd'))).toBe('Loadline did not accept it.');
  });
});
