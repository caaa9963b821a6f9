import { createHash } from 'node:crypto';
import type { Request, Response } from 'express';
import type { DataSource } from 'typeorm';
import { AppError } from '../core/errors';

/**
 * `Idempotency-Key` on an organization's write (the offline queue sends one with every pain report,
 * check-in and session log): the first request with a key claims it, runs, and stores its status and
 * answer; the same request again gets that stored answer (marked `Idempotent-Replayed: true`) and
 * writes nothing; the same key with another method, path or body is a 422. A request that fails
 * releases its key, so a retry runs afresh: the command's transaction rolled back, nothing was stored.
 *
 * The key is claimed in its own statement before the command's transaction, so two copies arriving at
 * once cannot both run: the second gets a 409 and is sent again later. A claim left without an answer
 * (the process died mid-request) is taken over after CLAIM_STALE_SECONDS. Keys are kept KEEP_DAYS,
 * far longer than a phone waits before re-sending; old ones are swept now and then by new claims.
 */
export const IDEMPOTENCY_HEADER = 'idempotency-key';
const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
const CLAIM_STALE_SECONDS = 120;
const KEEP_DAYS = 30;
const SWEEP_ONE_IN = 100;

export interface IdempotencyScope {
  ds: DataSource;
  organizationId: string;
  userId: string;
}

/** The key of this request, or null when it sent none; a key that is not a UUID is a 400. */
export function idempotencyKeyOf(req: Request): string | null {
  const raw = req.headers[IDEMPOTENCY_HEADER];
  if (raw === undefined) return null;
  if (typeof raw !== 'string' || !UUID.test(raw)) {
    throw new AppError('validation_failed', 'The Idempotency-Key header must be a UUID.', {
      'Idempotency-Key': ['must be a UUID, such as 3f0c2a9e-7b1d-4c55-9e0a-2d6f8b1c4e7a'],
    });
  }
  return raw.toLowerCase();
}

/** Method, path and body: what "the same request" means for a key. */
function fingerprintOf(req: Request): string {
  return createHash('sha256')
    .update(`${req.method} ${req.originalUrl}\n${JSON.stringify(req.body ?? null)}`)
    .digest('hex');
}

interface Stored {
  fingerprint: string;
  status: number | null;
  response: unknown;
  stale: boolean;
}

async function claim(s: IdempotencyScope, key: string, fingerprint: string): Promise<boolean> {
  const inserted: unknown[] = await s.ds.query(
    `INSERT INTO idempotency_keys (organization_id, user_id, key, fingerprint) VALUES ($1, $2, $3, $4)
     ON CONFLICT (organization_id, user_id, key) DO NOTHING RETURNING key`,
    [s.organizationId, s.userId, key, fingerprint],
  );
  if (inserted.length > 0 && Math.random() * SWEEP_ONE_IN < 1) {
    await s.ds.query(`DELETE FROM idempotency_keys WHERE created_at < now() - make_interval(days => $1)`, [KEEP_DAYS]);
  }
  return inserted.length > 0;
}

async function stored(s: IdempotencyScope, key: string): Promise<Stored | null> {
  const rows: Stored[] = await s.ds.query(
    `SELECT fingerprint, status, response, created_at < now() - make_interval(secs => $4) AS stale
       FROM idempotency_keys WHERE organization_id = $1 AND user_id = $2 AND key = $3`,
    [s.organizationId, s.userId, key, CLAIM_STALE_SECONDS],
  );
  return rows[0] ?? null;
}

async function takeOverStale(s: IdempotencyScope, key: string): Promise<boolean> {
  const taken: unknown[] = await s.ds.query(
    `UPDATE idempotency_keys SET created_at = now()
      WHERE organization_id = $1 AND user_id = $2 AND key = $3 AND status IS NULL
        AND created_at < now() - make_interval(secs => $4)
      RETURNING key`,
    [s.organizationId, s.userId, key, CLAIM_STALE_SECONDS],
  );
  return taken.length > 0;
}

async function release(s: IdempotencyScope, key: string): Promise<void> {
  await s.ds.query(`DELETE FROM idempotency_keys WHERE organization_id = $1 AND user_id = $2 AND key = $3 AND status IS NULL`, [
    s.organizationId,
    s.userId,
    key,
  ]);
}

async function complete(s: IdempotencyScope, key: string, status: number, response: unknown): Promise<void> {
  await s.ds.query(
    `UPDATE idempotency_keys SET status = $4, response = $5::jsonb, completed_at = now()
      WHERE organization_id = $1 AND user_id = $2 AND key = $3`,
    [s.organizationId, s.userId, key, status, response === undefined ? null : JSON.stringify(response)],
  );
}

function send(res: Response, status: number, body: unknown): void {
  if (body === undefined || body === null) res.status(status).end();
  else res.status(status).json(body);
}

/**
 * Runs `handle` at most once per key: `handle` returns the status and body to send (undefined body for
 * no content) and must not write to `res` itself.
 */
export async function runIdempotent(
  s: IdempotencyScope,
  key: string,
  req: Request,
  res: Response,
  handle: () => Promise<{ status: number; body: unknown }>,
): Promise<void> {
  const fingerprint = fingerprintOf(req);
  if (!(await claim(s, key, fingerprint))) {
    const before = await stored(s, key);
    if (before && before.fingerprint !== fingerprint) {
      throw new AppError(
        'unprocessable',
        'This Idempotency-Key was already used for a different request. Send a new key with a new request.',
      );
    }
    if (before && before.status !== null) {
      res.setHeader('Idempotent-Replayed', 'true');
      send(res, before.status, before.response);
      return;
    }
    // Gone (released by a failure a moment ago) or stale: claim it again; otherwise it is still running.
    const again = before ? before.stale && (await takeOverStale(s, key)) : await claim(s, key, fingerprint);
    if (!again) throw new AppError('conflict', 'This request is still being processed. Try again in a moment.');
  }
  let outcome: { status: number; body: unknown };
  try {
    outcome = await handle();
  } catch (error) {
    await release(s, key);
    throw error;
  }
  await complete(s, key, outcome.status, outcome.body);
  send(res, outcome.status, outcome.body);
}
