import { spawn } from 'node:child_process';
import { randomUUID } from 'node:crypto';
import { mkdtempSync, readFileSync, rmSync, statSync, writeFileSync, mkdirSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import pg from 'pg';
import { todayIso } from '../policies/roles';
import { signedIn, useHarness } from '../server/src/test/harness';
import { createOrg, TEST_PASSWORD, type TestOrg } from '../server/src/test/factories';
import { ownerUrl, tamperAuditEntry } from '../server/src/test/owner';
import { backupDatabase, restoreBackup, type BackupResult } from './backup';
import { ROOT } from './pg-cluster';

const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });

const work = mkdtempSync(path.join(tmpdir(), 'loadline-backup-'));
/** Scratch databases this file makes; all dropped at the end. */
const scratch = new Set<string>();

/** Backups and restores are the owner's work: the app's own role may not create databases. */
const dbUrl = (name: string): string => ownerUrl(name);

const runtimeRole = decodeURIComponent(new URL(inject('databaseUrl')).username);

/** The same database as the app's own role. */
function appUrl(name: string): string {
  const u = new URL(inject('databaseUrl'));
  u.pathname = `/${name}`;
  return u.toString();
}

function scratchName(): string {
  const name = `loadline_rs_${process.pid}_${randomUUID().slice(0, 8)}`;
  scratch.add(name);
  return name;
}

async function query<T>(url: string, sql: string, params: unknown[] = []): Promise<T[]> {
  const c = new pg.Client({ connectionString: url });
  await c.connect();
  try {
    return (await c.query(sql, params)).rows as T[];
  } finally {
    await c.end();
  }
}

afterAll(async () => {
  // With the copies a replacing restore sets aside (`<name>_restoring_…`, `<name>_before_restore_…`).
  const names = await query<{ datname: string }>(dbUrl('postgres'), 'SELECT datname FROM pg_database WHERE datname LIKE ANY ($1)', [
    [...scratch].map((n) => `${n}%`),
  ]);
  for (const { datname } of names) await query(dbUrl('postgres'), `DROP DATABASE IF EXISTS ${pg.escapeIdentifier(datname)} WITH (FORCE)`);
  rmSync(work, { recursive: true, force: true });
});

const day = (n: number) => {
  const d = new Date(`${todayIso()}T00:00:00Z`);
  d.setUTCDate(d.getUTCDate() + n);
  return d.toISOString().slice(0, 10);
};

describe('db:backup and db:restore (45 CFR 164.308(a)(7)(ii)(A) data backup, (B) disaster recovery)', () => {
  let org: TestOrg;
  let tampered: { org: TestOrg; entryId: string };
  let backup: BackupResult;
  const uploads = path.join(work, 'uploads');

  beforeAll(async () => {
    // Data made through the real app: a case opened and its status changed by the clinician, both audited.
    org = await createOrg(h.ds);
    const clinician = await signedIn(h.app, org.clinician.email, TEST_PASSWORD);
    const base = `/api/orgs/${org.id}`;
    const opened = await clinician.post(`${base}/cases`, {
      athleteId: org.athlete.membershipId,
      bodyRegions: ['lower_back'],
      onsetDate: day(-10),
      diagnosis: 'Lumbar strain',
      clinicalNotes: 'Tender L4-L5',
      status: 'limited',
      statusEffectiveFrom: day(-9),
      statusNote: 'Light work only',
      reviewDate: day(14),
    });
    expect(opened.status, JSON.stringify(opened.body)).toBe(201);
    const updated = await clinician.patch(`${base}/cases/${opened.body.id}`, { version: opened.body.version, reviewDate: day(21) });
    expect(updated.status, JSON.stringify(updated.body)).toBe(200);

    // A second organization whose trail was tampered with before the backup: the restore must report it.
    const other = await createOrg(h.ds);
    const admin = await signedIn(h.app, other.admin.email, TEST_PASSWORD);
    const invited = await admin.post(`/api/orgs/${other.id}/invitations`, {
      email: `new-${randomUUID().slice(0, 8)}@test.example`,
      roles: ['coach'],
    });
    expect(invited.status, JSON.stringify(invited.body)).toBe(201);
    const [entry]: { id: string }[] = await h.ds.query('SELECT id FROM audit_entries WHERE organization_id = $1 ORDER BY id DESC LIMIT 1', [
      other.id,
    ]);
    // As the audit tests do: as the owner, the append-only trigger off only inside one transaction.
    await tamperAuditEntry(String(entry.id), { roles: ['admin'] });
    tampered = { org: other, entryId: String(entry.id) };

    mkdirSync(path.join(uploads, 'documents'), { recursive: true });
    writeFileSync(path.join(uploads, 'documents', 'scan.pdf'), '%PDF-1.7 test');
    writeFileSync(path.join(uploads, 'documents', 'half.pdf.partial'), 'unfinished');

    backup = await backupDatabase({ url: ownerUrl(), file: path.join(work, 'run.dump'), uploadsDir: uploads, counts: true });
  });

  it('writes a custom-format dump only its owner can read, and a tar of the uploads folder beside it', async () => {
    expect(backup.file).toBe(path.join(work, 'run.dump'));
    expect(statSync(backup.file).mode & 0o777).toBe(0o600);
    expect(backup.bytes).toBe(statSync(backup.file).size);
    expect(readFileSync(backup.file).subarray(0, 5).toString('latin1')).toBe('PGDMP');

    expect(backup.uploads?.file).toBe(path.join(work, 'run.uploads.tar'));
    expect(statSync(backup.uploads!.file).mode & 0o777).toBe(0o600);
    const listing = await new Promise<string>((resolve, reject) => {
      const child = spawn('tar', ['-tf', backup.uploads!.file]);
      let out = '';
      child.stdout.on('data', (d) => (out += d));
      child.on('error', reject);
      child.on('close', () => resolve(out));
    });
    expect(listing).toContain('./documents/scan.pdf');
    expect(listing).not.toContain('.partial');
  });

  it('an existing file is never overwritten', async () => {
    await expect(backupDatabase({ url: ownerUrl(), file: backup.file })).rejects.toThrow(/already exists/);
    expect(statSync(backup.file).size).toBe(backup.bytes);
  });

  it('restores into a fresh database with the same row counts, and verifies every audit chain there', async () => {
    const name = scratchName();
    const restored = await restoreBackup({ file: backup.file, url: dbUrl(name), runtimeRole });
    expect(restored).toMatchObject({ database: name, previous: null });
    // The counts were taken in the snapshot pg_dump used, so other test files writing meanwhile do not matter.
    expect(restored.counts).toEqual(backup.counts);
    expect(backup.counts!.audit_entries).toBeGreaterThan(0);
    expect(backup.counts!.cases).toBeGreaterThan(0);

    const entries: { n: string }[] = await h.ds.query('SELECT count(*) AS n FROM audit_entries WHERE organization_id = $1', [org.id]);
    expect(restored.chains.find((r) => r.organizationId === org.id)).toMatchObject({ intact: true, entries: Number(entries[0].n) });
    expect(restored.chains.find((r) => r.organizationId === tampered.org.id)).toMatchObject({
      intact: false,
      firstBrokenId: tampered.entryId,
      reason: 'contents do not match the stored hash',
    });
    expect(restored.intact).toBe(false);

    // The case itself is there, its notes intact, and the restored trail is still append-only.
    const url = dbUrl(name);
    const cases = await query<{ clinical_notes: string }>(url, 'SELECT clinical_notes FROM cases WHERE organization_id = $1', [org.id]);
    expect(cases).toEqual([{ clinical_notes: 'Tender L4-L5' }]);
    await expect(query(url, 'DELETE FROM audit_entries WHERE organization_id = $1', [org.id])).rejects.toThrow(/append-only/);

    // The app's own role is granted again on the restored copy: it reads, and may not rewrite the trail (ASVS 5.0 V16.4.2).
    const app = appUrl(name);
    expect(await query(app, 'SELECT count(*)::int AS n FROM cases WHERE organization_id = $1', [org.id])).toEqual([{ n: 1 }]);
    await expect(query(app, `UPDATE audit_entries SET action = 'forged' WHERE organization_id = $1`, [org.id])).rejects.toMatchObject({
      code: '42501',
    });
    expect(
      await query(app, `SELECT count(*)::int AS n FROM pg_class WHERE relowner = (SELECT oid FROM pg_roles WHERE rolname = current_user)`),
    ).toEqual([{ n: 0 }]);
  });

  it('refuses a database that holds tables unless told to replace it; then the old one is kept aside', async () => {
    const name = scratchName();
    await restoreBackup({ file: backup.file, url: dbUrl(name) });
    await expect(restoreBackup({ file: backup.file, url: dbUrl(name) })).rejects.toThrow(`database "${name}" already exists and holds`);

    // Mark the current copy, so we can tell which database ends up under which name.
    await query(dbUrl(name), `INSERT INTO organizations (name, emergency_number) VALUES ('Only in the old copy', '911')`);
    const replaced = await restoreBackup({ file: backup.file, url: dbUrl(name), yes: true, runtimeRole });
    expect(replaced.database).toBe(name);
    expect(replaced.previous).toMatch(new RegExp(`^${name}_before_restore_\\d{8}t\\d{6}z$`));
    expect(replaced.counts).toEqual(backup.counts);
    const marker = `SELECT count(*)::int AS n FROM organizations WHERE name = 'Only in the old copy'`;
    expect(await query(dbUrl(name), marker)).toEqual([{ n: 0 }]);
    expect(await query(dbUrl(replaced.previous!), marker)).toEqual([{ n: 1 }]);
  });

  it('names the problem with a missing file or one that is not an archive, and creates no database', async () => {
    const name = scratchName();
    await expect(restoreBackup({ file: path.join(work, 'nope.dump'), url: dbUrl(name) })).rejects.toThrow(/nope\.dump: no such file/);
    const plain = path.join(work, 'plain.sql');
    writeFileSync(plain, 'CREATE TABLE t (id int);\n');
    await expect(restoreBackup({ file: plain, url: dbUrl(name) })).rejects.toThrow(/is not a pg_dump custom-format archive/);
    const truncated = path.join(work, 'truncated.dump');
    writeFileSync(truncated, readFileSync(backup.file).subarray(0, 40));
    await expect(restoreBackup({ file: truncated, url: dbUrl(name) })).rejects.toThrow(/could not be read as an archive/);
    expect(await query(dbUrl('postgres'), 'SELECT 1 FROM pg_database WHERE datname = $1', [name])).toEqual([]);
  });

  it('the command line prints the refusal as a sentence and exits 1', async () => {
    const run = await new Promise<{ code: number | null; out: string; err: string }>((resolve, reject) => {
      const child = spawn(
        process.execPath,
        ['--import', 'tsx', 'scripts/db.ts', 'restore', path.join(work, 'nope.dump'), '--into', scratchName()],
        {
          cwd: ROOT,
          env: { ...process.env, DATABASE_URL: inject('databaseUrl'), MIGRATION_DATABASE_URL: ownerUrl() },
        },
      );
      let out = '';
      let err = '';
      child.stdout.on('data', (d) => (out += d));
      child.stderr.on('data', (d) => (err += d));
      child.on('error', reject);
      child.on('close', (code) => resolve({ code, out, err }));
    });
    expect(run.err.trim()).toBe(`${path.join(work, 'nope.dump')}: no such file`);
    expect(run.code).toBe(1);
  });
});
