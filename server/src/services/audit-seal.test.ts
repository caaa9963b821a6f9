import { spawn } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, inject, it } from 'vitest';
import pino from 'pino';
import { loadConfig } from '../config';
import { AUDIT_SEAL_QUEUE } from '../jobs/queue';
import { mailTo, waitFor } from '../mail/mail-fixtures';
import { TEST_SECRET, useHarness } from '../test/harness';
import { createOrg, type TestOrg } from '../test/factories';
import { asOwner, ownerUrl, rewriteChainAsOwner } from '../test/owner';
import { appendAudit, verifyChain } from './audit';
import { checkSeals, macValid, readSeals, sealFile, signSeal, type AuditSeal } from './audit-seal';
import { sealAll, type SealOutcome } from './audit-seal-job';

const ROOT = path.resolve(import.meta.dirname, '../../..');
const KEY = 'audit-seal-key-for-tests-only-0123456789';
const dir = mkdtempSync(path.join(tmpdir(), 'loadline-seals-'));
const h = useHarness({ AUDIT_SEAL_KEY: KEY, AUDIT_SEAL_DIR: dir }, { mail: true });
const logger = pino({ level: 'silent' });
const deps = () => ({ ds: h.ds, key: KEY, dir, queue: h.jobs!, logger });

afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** Appends n entries, as routes would, and returns their ids (oldest first). */
async function append(orgId: string, n: number): Promise<string[]> {
  for (let i = 0; i < n; i++) {
    await h.ds.transaction((m) =>
      appendAudit(m, {
        organizationId: orgId,
        actorUserId: null,
        action: 'membership.roles_changed',
        subjectType: 'Membership',
        after: { i },
      }),
    );
  }
  const rows: { id: string }[] = await h.ds.query(
    'SELECT a.id::text AS id FROM audit_entries a WHERE a.organization_id = $1 ORDER BY a.id',
    [orgId],
  );
  return rows.map((r) => r.id);
}

async function sealOne(org: TestOrg): Promise<SealOutcome> {
  const [outcome] = await sealAll(deps(), [org.id]);
  return outcome;
}

function sealed(o: SealOutcome): AuditSeal {
  if (o.status !== 'sealed') throw new Error(`expected a seal, got ${JSON.stringify(o)}`);
  return o.seal;
}

/** `npm run audit:verify` against the test database, with this file's key and seal folder. */
function auditVerify(): Promise<{ code: number | null; stdout: string; stderr: string }> {
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, ['--import', 'tsx', 'scripts/db.ts', 'audit-verify'], {
      cwd: ROOT,
      env: {
        ...process.env,
        DATABASE_URL: inject('databaseUrl'),
        MIGRATION_DATABASE_URL: ownerUrl(),
        AUDIT_SEAL_KEY: KEY,
        AUDIT_SEAL_DIR: dir,
      },
    });
    let stdout = '';
    let stderr = '';
    child.stdout.on('data', (d) => (stdout += d));
    child.stderr.on('data', (d) => (stderr += d));
    child.on('error', reject);
    child.on('close', (code) => resolve({ code, stdout, stderr }));
  });
}

describe('ASVS 5.0 V16.4.3: each chain head is sealed outside the database', () => {
  it('the seal job appends the seal to the organization’s file (0600) and e-mails it to its admins only', async () => {
    const org = await createOrg(h.ds);
    const ids = await append(org.id, 3);
    const seal = sealed(await sealOne(org));
    expect(seal).toMatchObject({ organizationId: org.id, lastEntryId: ids[2], entries: 3 });
    const [{ hash }] = await h.ds.query('SELECT hash FROM audit_entries WHERE id = $1', [ids[2]]);
    expect(seal.headHash).toBe(hash);
    expect(macValid(KEY, seal)).toBe(true);

    const file = sealFile(dir, org.id);
    expect(statSync(file).mode & 0o777).toBe(0o600);
    expect(readFileSync(file, 'utf8')).toBe(`${JSON.stringify(seal)}\n`);
    expect(await readSeals(dir, org.id)).toEqual([{ line: 1, seal }]);

    const mail = await waitFor('the seal e-mail', async () => {
      const rows = await mailTo(h.ds, [org.admin.email]);
      return rows.length ? rows : null;
    });
    expect(mail).toHaveLength(1);
    expect(mail[0].subject).toMatch(/^Audit seal for /);
    expect(mail[0].text_body).toContain(`up to entry #${ids[2]}`);
    expect(mail[0].text_body).toContain(`Seal: ${JSON.stringify(seal)}`);
    const others = [org.coach.email, org.clinician.email, org.athlete.email, org.guardian.email];
    expect(await mailTo(h.ds, others)).toEqual([]);
  });

  it('a rewrite done as the owner with hashes recomputed passes the chain check, but not the seal check, which names the entry', async () => {
    const org = await createOrg(h.ds);
    const first = await append(org.id, 2);
    const early = sealed(await sealOne(org));
    const ids = [...first, ...(await append(org.id, 3)).slice(2)];
    const late = sealed(await sealOne(org));
    expect(late.lastEntryId).toBe(ids[4]);

    // Entry 4 of 5 is rewritten; 4 and 5 get new hashes that link up, so the chain alone looks whole.
    await rewriteChainAsOwner(h.ds, org.id, ids[3], { i: 'forged' });
    expect(await verifyChain(h.ds.manager, org.id)).toMatchObject({ intact: true, entries: 5 });

    const report = await checkSeals(h.ds.manager, org.id, KEY, await readSeals(dir, org.id));
    expect(report).toMatchObject({ intact: false, firstBrokenId: ids[4] });
    expect(report.reason).toBe(
      `no longer matches the seal of ${late.sealedAt}: the trail was rewritten up to here; entry #${early.lastEntryId} (sealed ${early.sealedAt}) still matches`,
    );

    const run = await auditVerify();
    expect(run.stdout, run.stderr).toContain(
      `BROKEN   ${org.id}  first broken entry #${ids[4]}: no longer matches the seal of ${late.sealedAt}`,
    );
    expect(run.code).toBe(1);

    // The next seal refuses to anchor the rewrite, and tells the admins instead.
    const refused = await sealOne(org);
    expect(refused).toMatchObject({ status: 'refused', firstBrokenId: ids[4], emailed: 1 });
    expect(await readSeals(dir, org.id)).toHaveLength(2);
    await waitFor('the warning e-mail', async () =>
      (await mailTo(h.ds, [org.admin.email])).find((m) => m.subject?.startsWith('Audit trail check failed for ')),
    );
  });

  it('deleting the newest entries as the owner is caught: the sealed entry is gone', async () => {
    const org = await createOrg(h.ds);
    const ids = await append(org.id, 3);
    sealed(await sealOne(org));
    await asOwner(async (c) => {
      await c.query('ALTER TABLE audit_entries DISABLE TRIGGER audit_entries_no_update_delete');
      await c.query('DELETE FROM audit_entries WHERE id = $1', [ids[2]]);
      await c.query('ALTER TABLE audit_entries ENABLE TRIGGER audit_entries_no_update_delete');
    });
    expect(await verifyChain(h.ds.manager, org.id)).toMatchObject({ intact: true, entries: 2 });
    const report = await checkSeals(h.ds.manager, org.id, KEY, await readSeals(dir, org.id));
    expect(report).toMatchObject({ intact: false, firstBrokenId: ids[2] });
    expect(report.reason).toMatch(new RegExp(`^entry #${ids[2]}, sealed at .*, is gone$`));
  });

  it('a seal edited in its file fails its MAC; one signed with another key is named as such', async () => {
    const org = await createOrg(h.ds);
    await append(org.id, 2);
    const seal = sealed(await sealOne(org));
    const file = sealFile(dir, org.id);
    writeFileSync(file, `${JSON.stringify({ ...seal, entries: 1 })}\n`);
    let report = await checkSeals(h.ds.manager, org.id, KEY, await readSeals(dir, org.id));
    expect(report).toMatchObject({ intact: false, firstBrokenId: null });
    expect(report.reason).toBe(`seal of ${seal.sealedAt} (line 1) cannot be trusted: its MAC does not match: the seal was altered`);

    const other = signSeal('another-key-another-key-another-key!', seal);
    writeFileSync(file, `${JSON.stringify(other)}\n`);
    report = await checkSeals(h.ds.manager, org.id, KEY, await readSeals(dir, org.id));
    expect(report.reason).toBe(`seal of ${seal.sealedAt} (line 1) cannot be trusted: it was made with another key (key id ${other.keyId})`);

    writeFileSync(file, 'not a seal\n');
    report = await checkSeals(h.ds.manager, org.id, KEY, await readSeals(dir, org.id));
    expect(report.reason).toBe('seal file line 1 is not a readable seal');
  });

  it('the daily seal is a pg-boss schedule whose job runs the seal', async () => {
    let ran = 0;
    await h.jobs!.scheduleAuditSeal('0 2 * * *', async () => void ran++);
    try {
      const schedules = await h.jobs!.boss.getSchedules();
      expect(schedules.find((s) => s.name === AUDIT_SEAL_QUEUE)).toMatchObject({ cron: '0 2 * * *', timezone: 'UTC' });
      await h.jobs!.boss.send(AUDIT_SEAL_QUEUE, {});
      await waitFor('the seal job', async () => ran > 0);
    } finally {
      await h.jobs!.boss.unschedule(AUDIT_SEAL_QUEUE);
    }
  });

  it('AUDIT_SEAL_KEY must be at least 32 bytes', () => {
    expect(() => loadConfig({ DATABASE_URL: 'postgres://x/y', SESSION_SECRET: TEST_SECRET, AUDIT_SEAL_KEY: 'short' })).toThrow(
      'AUDIT_SEAL_KEY: AUDIT_SEAL_KEY must be at least 32 bytes',
    );
  });
});
