import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Express } from 'express';
import { QueryFailedError } from 'typeorm';
import { buildApp } from '../app';
import { createLogger } from '../logger';
import { signedIn, useHarness } from '../test/harness';
import { asOwner } from '../test/owner';
import { createOrg, TEST_PASSWORD } from '../test/factories';
import { caseBody, caseWorld } from '../test/worlds/case-world';

/** A logger as main.ts makes it, writing into an array instead of stdout. */
function capturedLogger() {
  const lines: string[] = [];
  const logger = createLogger('info', { write: (line: string) => void lines.push(line) });
  return { logger, text: () => lines.join('') };
}

const CANARY = 'CANARY-7f3a clinician note: disclosed self-harm, see safeguarding file';

describe('ASVS 5.0 V16.2.5: logs hold no health data (a failed write of a clinical note)', () => {
  const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });
  caseWorld(h);
  let app: Express;
  let log: ReturnType<typeof capturedLogger>;
  let close: () => Promise<void>;

  beforeAll(async () => {
    log = capturedLogger();
    ({ app, close } = buildApp({ ds: h.ds, config: h.config, logger: log.logger }));
    // A trigger that refuses the note and quotes it in its message and detail, as a real check or
    // trigger error would ("Failing row contains (…)"); and a CHECK constraint whose detail does.
    // Planted as the owner: the app's own role may not create triggers or constraints.
    await asOwner(async (c) => {
      await c.query(`
      CREATE FUNCTION canary_refuse() RETURNS trigger LANGUAGE plpgsql AS $$ BEGIN
        IF NEW.clinical_notes LIKE 'CANARY-7f3a%' THEN
          RAISE EXCEPTION 'refused note: %', NEW.clinical_notes USING DETAIL = 'Failing row contains ' || NEW.clinical_notes;
        END IF;
        RETURN NEW;
      END $$`);
      await c.query(`CREATE TRIGGER canary_refuse BEFORE INSERT ON cases FOR EACH ROW EXECUTE FUNCTION canary_refuse()`);
      await c.query(`ALTER TABLE cases ADD CONSTRAINT canary_check CHECK (clinical_notes NOT LIKE 'CANARY-9b1c%') NOT VALID`);
    });
  });
  afterAll(async () => {
    await asOwner(async (c) => {
      await c.query(`DROP TRIGGER IF EXISTS canary_refuse ON cases`);
      await c.query(`DROP FUNCTION IF EXISTS canary_refuse()`);
      await c.query(`ALTER TABLE cases DROP CONSTRAINT IF EXISTS canary_check`);
    });
    await close?.();
  });

  it('a write refused by the database logs its SQLSTATE, never the note (parameters, message, detail, stack)', async () => {
    const org = await createOrg(h.ds);
    const clinician = await signedIn(app, org.clinician.email, TEST_PASSWORD);
    const res = await clinician.post(`/api/orgs/${org.id}/cases`, caseBody(org.athlete.membershipId, { clinicalNotes: CANARY }));
    expect(res.status).toBe(500);
    expect(JSON.stringify(res.body)).not.toContain('CANARY');
    const text = log.text();
    expect(text).toContain('request failed');
    expect(text).toContain('P0001');
    expect(text).not.toContain('CANARY');
    expect(text).not.toContain('safeguarding');
  });

  it('a CHECK violation (whose detail is the whole failing row) logs the constraint, never the row', async () => {
    const org = await createOrg(h.ds);
    const clinician = await signedIn(app, org.clinician.email, TEST_PASSWORD);
    const note = CANARY.replace('7f3a', '9b1c');
    const res = await clinician.post(`/api/orgs/${org.id}/cases`, caseBody(org.athlete.membershipId, { clinicalNotes: note }));
    expect(res.status).toBeGreaterThanOrEqual(400);
    expect(log.text()).not.toContain('CANARY-9b1c');
    expect(log.text()).not.toContain('Tender L4-L5');
  });
});

describe('ASVS 5.0 V16.2.5: the process logger (jobs, mail worker) reduces database errors to their code', () => {
  it('a QueryFailedError logged by a worker keeps code, constraint and table only', () => {
    const { logger, text } = capturedLogger();
    const driverError = Object.assign(new Error(`duplicate key value violates unique constraint "x": ${CANARY}`), {
      code: '23505',
      constraint: 'email_deliveries_pkey',
      table: 'email_deliveries',
      routine: '_bt_check_unique',
      detail: `Key (body)=(${CANARY}) already exists.`,
    });
    const err = new QueryFailedError('INSERT INTO email_deliveries (body) VALUES ($1)', [CANARY], driverError);
    logger.warn({ err, deliveryId: 'd1' }, 'e-mail failed; will retry');
    logger.error(err);
    logger.error({ err: new Error('wrapped', { cause: err }) }, 'wrapped failure');
    logger.info({ body: { note: CANARY }, password: 'hunter2', user: { password: 'hunter2', token: 'secret-token' } }, 'a careless line');
    const out = text();
    expect(out).not.toContain('CANARY');
    expect(out).not.toContain('hunter2');
    expect(out).not.toContain('secret-token');
    const first = JSON.parse(out.split('\n')[0]);
    expect(first.err).toMatchObject({
      type: 'QueryFailedError',
      code: '23505',
      constraint: 'email_deliveries_pkey',
      table: 'email_deliveries',
    });
    expect(first.err).not.toHaveProperty('parameters');
    expect(first.err).not.toHaveProperty('query');
    expect(first.err).not.toHaveProperty('detail');
    expect(JSON.parse(out.split('\n')[2]).err.cause).toMatchObject({ code: '23505' });
  });
});
