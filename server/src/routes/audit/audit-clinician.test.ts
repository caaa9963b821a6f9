import { spawn } from 'node:child_process';
import { randomUUID } from 'node:crypto';
import { fileURLToPath } from 'node:url';
import { beforeAll, describe, expect, inject, it } from 'vitest';
import type { AuditEntryDto } from '../../../../policies/dto';
import { CareTeamAssignment } from '../../entities';
import { appendAudit, verifyChain } from '../../services/audit';
import { signedIn, useHarness, type Client } from '../../test/harness';
import { createOrg, TEST_PASSWORD, type TestOrg } from '../../test/factories';
import { asOwner, tamperAuditEntry } from '../../test/owner';

const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });
const ROOT = fileURLToPath(new URL('../../../../', import.meta.url));

/** RFC 4180 CSV (quoted fields, doubled quotes, CRLF or LF rows): enough to read our own export. */
function parseCsv(text: string): string[][] {
  const rows: string[][] = [];
  let row: string[] = [];
  let field = '';
  let quoted = false;
  for (let i = 0; i < text.length; i++) {
    const ch = text[i];
    if (quoted) {
      if (ch === '"' && text[i + 1] === '"') {
        field += '"';
        i++;
      } else if (ch === '"') quoted = false;
      else field += ch;
    } else if (ch === '"') quoted = true;
    else if (ch === ',') {
      row.push(field);
      field = '';
    } else if (ch === '\n' || ch === '\r') {
      if (ch === '\r' && text[i + 1] === '\n') i++;
      row.push(field);
      rows.push(row);
      row = [];
      field = '';
    } else field += ch;
  }
  if (field || row.length) {
    row.push(field);
    rows.push(row);
  }
  return rows;
}

interface World {
  org: TestOrg;
  base: string;
  clinician: Client;
  otherClinician: Client;
  caseId: string;
  otherCaseId: string;
}

/**
 * Two care teams in one organization, each clinician with an athlete and a case of their own, so the
 * trail holds entries about both athletes (and sign-ins about neither).
 */
async function makeWorld(): Promise<World> {
  const org = await createOrg(h.ds);
  await h.ds.getRepository(CareTeamAssignment).save({
    organizationId: org.id,
    athleteId: org.otherAthlete.membershipId,
    memberId: org.otherClinician.membershipId,
    role: 'clinician',
  });
  const base = `/api/orgs/${org.id}`;
  const [clinician, otherClinician] = await Promise.all([
    signedIn(h.app, org.clinician.email, TEST_PASSWORD),
    signedIn(h.app, org.otherClinician.email, TEST_PASSWORD),
  ]);
  const open = async (c: Client, athleteId: string, diagnosis: string) => {
    const res = await c.post(`${base}/cases`, {
      athleteId,
      bodyRegions: ['lower_back'],
      onsetDate: '2026-01-02',
      diagnosis,
      status: 'limited',
      statusEffectiveFrom: '2026-01-03',
    });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    return res.body.id as string;
  };
  const caseId = await open(clinician, org.athlete.membershipId, 'Lumbar strain');
  const otherCaseId = await open(otherClinician, org.otherAthlete.membershipId, 'Ankle sprain');
  expect((await clinician.patch(`${base}/cases/${caseId}`, { reviewDate: '2026-02-01', version: 1 })).status).toBe(200);
  expect((await otherClinician.patch(`${base}/cases/${otherCaseId}`, { reviewDate: '2026-02-02', version: 1 })).status).toBe(200);
  return { org, base, clinician, otherClinician, caseId, otherCaseId };
}

describe('a clinician reads the audit entries of their own athletes only (ASVS 5.0 V8.2.2, V8.4.1; policies/access/audit.ts)', () => {
  let w: World;
  beforeAll(async () => {
    w = await makeWorld();
  });

  it('GET /audit: only entries about athletes in their care, none of the other care team, no sign-ins', async () => {
    const res = await w.clinician.get(`${w.base}/audit`);
    expect(res.status).toBe(200);
    const entries: AuditEntryDto[] = res.body.entries;
    // Opening a case writes its first status through the one status command, with an entry of its own.
    const show = (e: AuditEntryDto) => [e.action, e.subjectType === 'Case' ? e.subjectId : e.subjectType];
    expect(entries.map(show)).toEqual([
      ['case.updated', w.caseId],
      ['status.changed', 'ParticipationStatus'],
      ['case.opened', w.caseId],
    ]);
    for (const e of entries) expect(e.athleteId).toBe(w.org.athlete.membershipId);
    expect(JSON.stringify(res.body)).not.toContain(w.otherCaseId);

    // The other clinician's view is the mirror image.
    const other = await w.otherClinician.get(`${w.base}/audit`);
    expect(other.body.entries.map(show)).toEqual([
      ['case.updated', w.otherCaseId],
      ['status.changed', 'ParticipationStatus'],
      ['case.opened', w.otherCaseId],
    ]);
  });

  it('filters cannot reach past the rules: asking for the other athlete, their case or their clinician gives nothing', async () => {
    for (const q of [
      `athleteId=${w.org.otherAthlete.membershipId}`,
      `subjectId=${w.otherCaseId}`,
      `actorId=${w.org.otherClinician.userId}`,
    ]) {
      const res = await w.clinician.get(`${w.base}/audit?${q}`);
      expect(res.status, q).toBe(200);
      expect(res.body.entries, q).toEqual([]);
    }
  });

  it('the entries exist: an admin sees both athletes in the same trail', async () => {
    const admin = await signedIn(h.app, w.org.admin.email, TEST_PASSWORD);
    const res = await admin.get(`${w.base}/audit?action=case.`);
    expect(res.status).toBe(200);
    expect(new Set(res.body.entries.map((e: AuditEntryDto) => e.subjectId))).toEqual(new Set([w.caseId, w.otherCaseId]));
  });

  it('a coach → 403 on the trail and its export; a clinician → 403 on the chain check (admins only)', async () => {
    const coach = await signedIn(h.app, w.org.coach.email, TEST_PASSWORD);
    for (const path of ['/audit', '/audit/export']) {
      const res = await coach.get(`${w.base}${path}`);
      expect(res.status, path).toBe(403);
      expect(res.body.error.code).toBe('forbidden');
    }
    expect((await w.clinician.get(`${w.base}/audit/verify`)).status).toBe(403);
  });

  it("CSV export: text/csv attachment, a header row, the filtered rows only, and written down as 'audit.exported' (ASVS 5.0 V16.2.1)", async () => {
    const rid = `test-export-${Date.now()}`;
    const res = await w.clinician
      .get(`${w.base}/audit/export?action=case.opened`)
      .set('x-request-id', rid)
      .buffer(true)
      .parse((r, cb) => {
        let data = '';
        r.setEncoding('utf8');
        r.on('data', (chunk: string) => (data += chunk));
        r.on('end', () => cb(null, data));
      });
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^text\/csv/);
    expect(res.headers['content-disposition']).toMatch(/^attachment; filename="loadline-audit-\d{4}-\d{2}-\d{2}\.csv"$/);
    const [header, ...rows] = parseCsv(res.body as string).filter((r) => r.length > 1);
    expect(header).toEqual([
      'id',
      'occurred_at_utc',
      'actor',
      'actor_id',
      'action',
      'subject_type',
      'subject_id',
      'athlete',
      'before',
      'after',
      'request_id',
    ]);
    expect(rows).toHaveLength(1);
    const row = Object.fromEntries(header.map((k, i) => [k, rows[0][i]]));
    expect(row).toMatchObject({
      action: 'case.opened',
      subject_id: w.caseId,
      actor: w.org.clinician.name,
      actor_id: w.org.clinician.userId,
      athlete: w.org.athlete.name,
    });
    expect(JSON.parse(row.after)).toMatchObject({
      athleteId: w.org.athlete.membershipId,
      status: 'limited',
      diagnosis: expect.stringMatching(/^\[redacted/),
    });
    expect(res.body).not.toContain(w.otherCaseId);

    const logged = await h.ds.query(`SELECT action, actor_user_id, organization_id, after FROM audit_entries WHERE request_id = $1`, [rid]);
    expect(logged).toEqual([
      {
        action: 'audit.exported',
        actor_user_id: w.org.clinician.userId,
        organization_id: w.org.id,
        after: { filters: expect.objectContaining({ action: 'case.opened' }), rows: 1 },
      },
    ]);
  });
});

/** Runs `npm run audit:verify`'s command against the test database; resolves with its exit code and output. */
function runAuditVerify(): Promise<{ code: number | null; stdout: string; stderr: string }> {
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, ['--import', 'tsx', 'scripts/db.ts', 'audit-verify'], {
      cwd: ROOT,
      env: { ...process.env, DATABASE_URL: inject('databaseUrl'), MIGRATION_DATABASE_URL: inject('ownerDatabaseUrl') },
    });
    let stdout = '';
    let stderr = '';
    child.stdout.on('data', (d) => (stdout += d));
    child.stderr.on('data', (d) => (stderr += d));
    child.on('error', reject);
    child.on('close', (code) => resolve({ code, stdout, stderr }));
  });
}

describe('a tampered entry is named by the chain check (ASVS 5.0 V16.4.2, V16.4.3)', () => {
  it('`audit-verify` prints BROKEN with the first broken entry and exits 1; GET /audit/verify names the same entry', async () => {
    // An organization of its own, so tampering with its chain touches no other test's.
    const org = await createOrg(h.ds);
    const admin = await signedIn(h.app, org.admin.email, TEST_PASSWORD);
    for (const n of [1, 2, 3]) {
      await h.ds.transaction((m) =>
        appendAudit(m, {
          organizationId: org.id,
          actorUserId: org.clinician.userId,
          action: 'case.updated',
          subjectType: 'Case',
          subjectId: randomUUID(),
          athleteId: org.athlete.membershipId,
          before: { reviewDate: null },
          after: { reviewDate: `2026-02-0${n}` },
          requestId: `test-chain-${n}`,
        }),
      );
    }
    expect((await verifyChain(h.ds.manager, org.id)).intact).toBe(true);

    // Tamper with the second of the three — not the first of the chain (the admin's sign-in came first).
    const [target] = await h.ds.query(`SELECT id FROM audit_entries WHERE organization_id = $1 AND request_id = 'test-chain-2'`, [org.id]);
    const id = String(target.id);
    // As the owner, in one transaction: the append-only trigger is off only inside it, so no other session ever sees it off.
    await tamperAuditEntry(id, { reviewDate: '2026-03-01' });
    // The trigger is back on: a plain UPDATE is refused again, even to the owner (ASVS 5.0 V16.4.2).
    await expect(asOwner((c) => c.query(`UPDATE audit_entries SET after = '{}' WHERE id = $1`, [id]))).rejects.toThrow(/append-only/);

    const run = await runAuditVerify();
    expect(run.stdout, run.stderr).toContain(`BROKEN   ${org.id}  first broken entry #${id}`);
    expect(run.code).toBe(1);

    const res = await admin.get(`/api/orgs/${org.id}/audit/verify`);
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({
      organizationId: org.id,
      intact: false,
      firstBrokenId: id,
      reason: 'contents do not match the stored hash',
    });
  });
});
