import { randomUUID } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { useHarness } from '../test/harness';
import { logBody, trainingWorld } from '../test/worlds/training-world';

const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });
const { world } = trainingWorld(h);

const logsWithNotes = async (notes: string) =>
  ((await h.ds.query(`SELECT count(*)::int AS n FROM training_logs WHERE notes = $1`, [notes])) as { n: number }[])[0].n;

describe('Idempotency-Key on an organization write (the offline queue re-sends)', () => {
  it('the same log sent twice with one key is stored once, audited once, and the replay gets the first answer', async () => {
    const w = await world();
    const athlete = await w.as('athlete');
    const key = randomUUID();
    const notes = `offline ${key}`;
    const body = logBody(w.org.athlete.membershipId, { date: '2026-06-08', notes });
    const first = await athlete.post(`${w.base}/training-logs`, body).set('Idempotency-Key', key);
    expect(first.status, JSON.stringify(first.body)).toBe(201);
    expect(first.headers['idempotent-replayed']).toBeUndefined();
    const again = await athlete.post(`${w.base}/training-logs`, body).set('Idempotency-Key', key);
    expect(again.status).toBe(201);
    expect(again.headers['idempotent-replayed']).toBe('true');
    expect(again.body).toEqual(first.body);
    expect(await logsWithNotes(notes)).toBe(1);
    const audit = await h.ds.query(
      `SELECT count(*)::int AS n FROM audit_entries WHERE action = 'training_log.created' AND subject_id = $1`,
      [first.body.log.id],
    );
    expect(audit).toEqual([{ n: 1 }]);
  });

  it('the same key with a different body → 422, and nothing more is stored', async () => {
    const w = await world();
    const athlete = await w.as('athlete');
    const key = randomUUID();
    const notes = `mismatch ${key}`;
    const first = await athlete
      .post(`${w.base}/training-logs`, logBody(w.org.athlete.membershipId, { date: '2026-06-08', notes }))
      .set('Idempotency-Key', key);
    expect(first.status).toBe(201);
    const other = await athlete
      .post(`${w.base}/training-logs`, logBody(w.org.athlete.membershipId, { date: '2026-06-09', notes }))
      .set('Idempotency-Key', key);
    expect(other.status).toBe(422);
    expect(other.body.error).toMatchObject({ code: 'unprocessable', message: expect.stringMatching(/different request/) });
    expect(await logsWithNotes(notes)).toBe(1);
  });

  it('a key is per person: another athlete using the same key gets their own write, not the first answer', async () => {
    const w = await world();
    const key = randomUUID();
    const notes = `shared key ${key}`;
    const mine = await (
      await w.as('athlete')
    )
      .post(`${w.base}/training-logs`, logBody(w.org.athlete.membershipId, { date: '2026-06-08', notes }))
      .set('Idempotency-Key', key);
    const theirs = await (
      await w.as('otherAthlete')
    )
      .post(`${w.base}/training-logs`, logBody(w.org.otherAthlete.membershipId, { date: '2026-06-08', notes }))
      .set('Idempotency-Key', key);
    expect([mine.status, theirs.status]).toEqual([201, 201]);
    expect(theirs.headers['idempotent-replayed']).toBeUndefined();
    expect(theirs.body.log.id).not.toBe(mine.body.log.id);
    expect(await logsWithNotes(notes)).toBe(2);
  });

  it('a refused request keeps no key: sent again it runs again (and is refused again with its reason)', async () => {
    const w = await world();
    const athlete = await w.as('athlete');
    const key = randomUUID();
    const body = logBody(w.org.athlete.membershipId, { date: '2026-06-08', sessionId: randomUUID() });
    const first = await athlete.post(`${w.base}/training-logs`, body).set('Idempotency-Key', key);
    expect(first.status).toBeGreaterThanOrEqual(400);
    const again = await athlete.post(`${w.base}/training-logs`, body).set('Idempotency-Key', key);
    expect(again.status).toBe(first.status);
    expect(again.body.error.message).toBe(first.body.error.message);
    expect(await h.ds.query(`SELECT 1 FROM idempotency_keys WHERE key = $1`, [key])).toEqual([]);
  });

  it('a check-in replayed with its key is answered from the store', async () => {
    const w = await world();
    const athlete = await w.as('athlete');
    const key = randomUUID();
    const body = { athleteId: w.org.athlete.membershipId, date: '2026-06-10', sleepHours: 7.5, soreness: 2, readiness: 8, painNow: 1 };
    const first = await athlete.post(`${w.base}/check-ins`, body).set('Idempotency-Key', key);
    expect(first.status, JSON.stringify(first.body)).toBe(200);
    const again = await athlete.post(`${w.base}/check-ins`, body).set('Idempotency-Key', key);
    expect(again.headers['idempotent-replayed']).toBe('true');
    expect(again.body).toEqual(first.body);
  });

  it('a key that is not a UUID → 400 naming the header', async () => {
    const w = await world();
    const res = await (
      await w.as('athlete')
    )
      .post(`${w.base}/training-logs`, logBody(w.org.athlete.membershipId))
      .set('Idempotency-Key', 'not-a-uuid');
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty('Idempotency-Key');
  });
});
