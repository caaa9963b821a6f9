import { beforeAll, describe, expect, it } from 'vitest';
import { strFromU8, unzipSync } from 'fflate';
import type { RecordExportsDto } from '../../../../policies/dto';
import { CaseDocument, CaseRecord, GuardianLink } from '../../entities';
import { deliveriesWhere, mailTo, signLetter, waitFor } from '../../mail/mail-fixtures';
import { NO_LONGER_ALLOWED, buildRecordExport, sweepExpiredCopies } from '../../services/record-export-job';
import { createStorage } from '../../storage';
import { Client, signedIn, useHarness } from '../../test/harness';
import { createMember, createOrg, TEST_PASSWORD, type MemberRef, type TestOrg } from '../../test/factories';
import { PDF } from '../../test/worlds/uploads-fixtures';
import pino from 'pino';
import { CLINICAL_NOTE, DIAGNOSIS, OTHER_PERSON, PAIN_NARRATIVE, plantRecord } from '../../test/worlds/record-export-fixtures';

/**
 * A person's whole record, exported on request (GDPR Art. 15 and 20): asked for over HTTP, built by
 * the real pg-boss worker, e-mailed through the real fake SMTP server, downloaded with the e-mailed
 * code and unpacked here.
 */
const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' }, { mail: true });
const logger = pino({ level: 'silent' });

let org: TestOrg;
let orgB: TestOrg;
let athlete: Client;
let guardian: Client;

let planted: Awaited<ReturnType<typeof plantRecord>>;

beforeAll(async () => {
  const storage = createStorage(h.config);
  await h.jobs!.workRecordExports((job, lastTry) =>
    buildRecordExport({ ds: h.ds, config: h.config, logger, jobs: h.jobs!, storage }, job.exportId, lastTry),
  );
  org = await createOrg(h.ds);
  orgB = await createOrg(h.ds);
  planted = await plantRecord(h.ds, h.config, org);
  await signLetter(h.app, org);
  athlete = await signedIn(h.app, org.athlete.email, TEST_PASSWORD);
  guardian = await signedIn(h.app, org.guardian.email, TEST_PASSWORD);
  // Two organizations, a signed letter and three sign-ins at bcrypt's cost: slow on a busy machine.
}, 180_000);

const base = () => `/api/orgs/${org.id}/record-exports`;

/** Asks, waits for the e-mail, and answers the link's code from it. */
async function askAndReceive(c: Client, who: MemberRef, athleteId: string): Promise<{ id: string; token: string; text: string }> {
  const recordMail = async () => (await mailTo(h.ds, [who.email])).filter((m) => m.subject?.endsWith('record is ready'));
  const before = (await recordMail()).length;
  const res = await c.post(base(), { athleteId });
  expect(res.status, JSON.stringify(res.body)).toBe(202);
  expect(res.body.state).toBe('preparing');
  const mail = await waitFor('the record e-mail', async () => (await recordMail())[before]);
  const match = /record-download\?org=([0-9a-f-]+)#([A-Za-z0-9_-]{43})/.exec(mail.text_body ?? '');
  expect(match?.[1]).toBe(org.id);
  return { id: res.body.id, token: match![2], text: mail.text_body! };
}

async function download(c: Client, token: string) {
  const res = await c.agent
    .post(`${base()}/download`)
    .set('x-csrf-token', c.csrf)
    .send({ token })
    .buffer(true)
    .parse((r, cb) => {
      const chunks: Buffer[] = [];
      r.on('data', (d: Buffer) => chunks.push(d));
      r.on('end', () => cb(null, Buffer.concat(chunks)));
    });
  return res;
}

const auditActions = async (subjectId: string): Promise<string[]> =>
  (await h.ds.query(`SELECT action FROM audit_entries WHERE subject_id = $1 ORDER BY id`, [subjectId])).map(
    (r: { action: string }) => r.action,
  );

describe('the athlete asks for their own record', () => {
  let files: Record<string, Uint8Array>;
  let exportId: string;
  let token: string;

  beforeAll(async () => {
    const got = await askAndReceive(athlete, org.athlete, org.athlete.membershipId);
    exportId = got.id;
    token = got.token;
    const res = await download(athlete, token);
    expect(res.status, String(res.body)).toBe(200);
    expect(res.headers['content-type']).toBe('application/zip');
    expect(res.headers['content-disposition']).toMatch(
      /^attachment; filename="loadline-record-athlete-[a-z0-9-]+-\d{4}-\d{2}-\d{2}\.zip"$/,
    );
    expect(res.headers['cache-control']).toBe('no-store');
    files = unzipSync(new Uint8Array(res.body as Buffer));
  }, 120_000);

  const json = (name: string) => JSON.parse(strFromU8(files[name])) as unknown;

  it('holds a read-me, ten JSON files, the signed letter, the document and the clip', () => {
    const names = Object.keys(files).sort();
    expect(names.filter((n) => n.startsWith('data/'))).toEqual(
      ['audit-entries', 'cases', 'check-ins', 'clips', 'documents', 'letters', 'pain-reports', 'profile', 'programs', 'training-logs'].map(
        (n) => `data/${n}.json`,
      ),
    );
    expect(names).toContain('README.txt');
    expect(names.filter((n) => n.startsWith('letters/'))).toEqual([
      expect.stringMatching(/^letters\/clearance-letter-2026-12-01-[0-9a-f]{8}\.pdf$/),
    ]);
    expect(names.filter((n) => n.startsWith('documents/'))).toEqual([
      expect.stringMatching(/^documents\/2026-11-05-mri-report-[0-9a-f]{8}\.pdf$/),
    ]);
    expect(names.filter((n) => n.startsWith('clips/'))).toEqual([
      expect.stringMatching(/^clips\/2026-11-30-back-squat-[0-9a-f]{8}\.webm$/),
    ]);
    const letter = names.find((n) => n.startsWith('letters/'))!;
    expect(strFromU8(files[letter].slice(0, 5))).toBe('%PDF-');
    expect(Buffer.from(files[names.find((n) => n.startsWith('documents/'))!])).toEqual(PDF);
    expect(Buffer.from(files[names.find((n) => n.startsWith('clips/'))!])).toEqual(planted.video);
    expect(strFromU8(files['README.txt'])).toContain(`The record Loadline holds about ${org.athlete.name}`);
  });

  it('parses as the athlete may see it: their diagnosis and pain narrative, never the clinical notes', () => {
    expect(json('data/profile.json')).toMatchObject({ id: org.athlete.membershipId, displayName: org.athlete.name, isMinor: true });
    const cases = json('data/cases.json') as Record<string, unknown>[];
    expect(cases).toHaveLength(1);
    expect(cases[0]).toMatchObject({ id: planted.caseId, diagnosis: DIAGNOSIS });
    expect(cases[0]).not.toHaveProperty('clinicalNotes');
    expect(json('data/pain-reports.json')).toEqual([expect.objectContaining({ note: PAIN_NARRATIVE, painNow: 3 })]);
    expect(json('data/check-ins.json')).toEqual([expect.objectContaining({ date: '2026-11-20', readiness: 4 })]);
    expect(json('data/training-logs.json')).toEqual([expect.objectContaining({ date: '2026-11-30', notes: 'felt fine' })]);
    expect(json('data/letters.json')).toEqual([
      expect.objectContaining({ decision: 'full', effectiveFrom: '2026-12-01', file: expect.any(String) }),
    ]);
    expect(json('data/documents.json')).toEqual([expect.objectContaining({ title: 'MRI report', file: expect.any(String) })]);
    expect(json('data/clips.json')).toEqual([expect.objectContaining({ exercise: 'Back squat', file: expect.any(String) })]);
    // Athletes do not read the audit trail (policies/access/audit.ts), so none of it is theirs to take.
    expect(json('data/audit-entries.json')).toEqual([]);
  });

  it('holds no other person’s data and no clinical note anywhere', () => {
    const all = Object.values(files)
      .map((f) => Buffer.from(f).toString('latin1'))
      .join('\n');
    expect(all).not.toContain(CLINICAL_NOTE);
    expect(all).not.toContain(OTHER_PERSON);
    expect(all).not.toContain(org.otherAthlete.name);
    expect(all).not.toContain(org.otherAthlete.membershipId);
  });

  it('is audited: asked, ready (by Loadline), downloaded; the request shows it was downloaded', async () => {
    expect(await auditActions(exportId)).toEqual(['record_export.requested', 'record_export.ready', 'record_export.downloaded']);
    const [ready] = await h.ds.query(`SELECT actor_user_id FROM audit_entries WHERE subject_id = $1 AND action = 'record_export.ready'`, [
      exportId,
    ]);
    expect(ready.actor_user_id).toBeNull();
    const list = await athlete.get(base());
    expect(list.status).toBe(200);
    const dto = list.body as RecordExportsDto;
    expect(dto.people).toEqual([{ athleteId: org.athlete.membershipId, athleteName: org.athlete.name, self: true }]);
    expect(dto.requests[0]).toMatchObject({
      id: exportId,
      state: 'ready',
      downloadedAt: expect.any(String),
      sizeBytes: expect.any(Number),
    });
  });

  it('the link opens only for the person who asked: the guardian with the athlete’s code gets "unknown" and a 404', async () => {
    expect((await athlete.post(`${base()}/link`, { token })).body).toMatchObject({ state: 'ready', athleteName: org.athlete.name });
    expect((await guardian.post(`${base()}/link`, { token })).body).toEqual({ state: 'unknown' });
    const res = await download(guardian, token);
    expect(res.status).toBe(404);
    const stranger = await signedIn(h.app, orgB.athlete.email, TEST_PASSWORD);
    expect((await stranger.post(`${base()}/link`, { token })).status).toBe(404);
  });

  it('a wrong or malformed code: 400 naming the field, or "unknown"', async () => {
    const bad = await athlete.post(`${base()}/download`, { token: 'short' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toEqual({ token: ['must be the code from the e-mailed link'] });
    expect((await athlete.post(`${base()}/link`, { token: 'A'.repeat(43) })).body).toEqual({ state: 'unknown' });
  });

  it('expired: the link says so with its date, and the file is not served', async () => {
    await h.ds.query(`UPDATE record_exports SET expires_at = now() - interval '1 minute' WHERE id = $1`, [exportId]);
    expect((await athlete.post(`${base()}/link`, { token })).body).toMatchObject({ state: 'expired', athleteName: org.athlete.name });
    const res = await download(athlete, token);
    expect(res.status).toBe(404);
    expect(JSON.parse(String(res.body)).error.message).toMatch(/^This link expired on .+\. Ask for a new copy on your account page\.$/);
    expect((await athlete.get(base())).body.requests[0]).toMatchObject({ id: exportId, state: 'expired' });
  });

  it('an expired copy is removed from storage; the request and its trail stay', async () => {
    const storage = createStorage(h.config);
    const [before] = await h.ds.query(`SELECT storage_key FROM record_exports WHERE id = $1`, [exportId]);
    expect(await storage.exists(before.storage_key)).toBe(true);
    expect(await sweepExpiredCopies({ ds: h.ds, config: h.config, logger, jobs: h.jobs!, storage })).toBeGreaterThanOrEqual(1);
    expect(await storage.exists(before.storage_key)).toBe(false);
    expect((await h.ds.query(`SELECT storage_key FROM record_exports WHERE id = $1`, [exportId]))[0].storage_key).toBeNull();
    expect((await athlete.get(base())).body.requests[0]).toMatchObject({ id: exportId, state: 'expired' });
    expect(await auditActions(exportId)).toEqual(['record_export.requested', 'record_export.ready', 'record_export.downloaded']);
  });
});

describe('a guardian', () => {
  it('of a minor gets the record as a guardian sees it: status and letters, no diagnosis, pain narrative or documents', async () => {
    const got = await askAndReceive(guardian, org.guardian, org.athlete.membershipId);
    const res = await download(guardian, got.token);
    expect(res.status).toBe(200);
    const files = unzipSync(new Uint8Array(res.body as Buffer));
    const json = (name: string) => JSON.parse(strFromU8(files[name])) as unknown;
    const cases = json('data/cases.json') as Record<string, unknown>[];
    expect(cases[0]).toMatchObject({ id: planted.caseId, status: expect.any(String) });
    expect(cases[0]).not.toHaveProperty('diagnosis');
    expect(json('data/pain-reports.json')).toEqual([]);
    expect(json('data/documents.json')).toEqual([]);
    expect(Object.keys(files).filter((n) => n.startsWith('documents/') || n.startsWith('clips/'))).toEqual([]);
    expect(Object.keys(files).filter((n) => n.startsWith('letters/'))).toHaveLength(1);
    const all = Object.values(files)
      .map((f) => Buffer.from(f).toString('latin1'))
      .join('\n');
    for (const secret of [CLINICAL_NOTE, DIAGNOSIS, PAIN_NARRATIVE, OTHER_PERSON]) expect(all).not.toContain(secret);
  });

  it('of an adult is refused with a reason, and is not offered the adult’s record', async () => {
    const adult = await createMember(h.ds, org.id, ['athlete'], { dateOfBirth: '2000-01-01' });
    await h.ds
      .getRepository(GuardianLink)
      .save({ organizationId: org.id, athleteId: adult.membershipId, guardianId: org.guardian.membershipId });
    const res = await guardian.post(base(), { athleteId: adult.membershipId });
    expect(res.status).toBe(403);
    expect(res.body.error.message).toBe(`${adult.name} is an adult now, so only ${adult.name} can ask for a copy of their own record.`);
    const list = (await guardian.get(base())).body as RecordExportsDto;
    expect(list.people.map((p) => p.athleteId)).toEqual([org.athlete.membershipId]);
    expect(await h.ds.query(`SELECT id FROM record_exports WHERE athlete_id = $1`, [adult.membershipId])).toEqual([]);
  });

  it('unlinked after asking gets no copy: the request fails with a sentence', async () => {
    const o = await createOrg(h.ds);
    const [row] = await h.ds.query(
      `INSERT INTO record_exports (organization_id, athlete_id, requested_by) VALUES ($1, $2, $3) RETURNING id`,
      [o.id, o.athlete.membershipId, o.guardian.userId],
    );
    await h.ds.getRepository(GuardianLink).delete({ guardianId: o.guardian.membershipId });
    await buildRecordExport({ ds: h.ds, config: h.config, logger, jobs: h.jobs!, storage: createStorage(h.config) }, row.id);
    const [after] = await h.ds.query(`SELECT status, problem, storage_key FROM record_exports WHERE id = $1`, [row.id]);
    expect(after).toEqual({ status: 'failed', problem: NO_LONGER_ALLOWED, storage_key: null });
    expect(await auditActions(row.id)).toEqual(['record_export.failed']);
  });
});

describe('a file gone from storage', () => {
  it('is named in MISSING.txt, and the rest of the record is still made', async () => {
    const o = await createOrg(h.ds);
    const c = await h.ds.getRepository(CaseRecord).save({
      organizationId: o.id,
      athleteId: o.athlete.membershipId,
      bodyRegions: ['knee_left'],
      onsetDate: '2026-11-01',
      diagnosis: null,
      clinicalNotes: null,
      reviewDate: null,
      openedBy: null,
    });
    await h.ds.getRepository(CaseDocument).save({
      organizationId: o.id,
      athleteId: o.athlete.membershipId,
      caseId: c.id,
      title: 'Lost scan',
      documentDate: '2026-11-06',
      issuedBy: 'Clinic',
      mediaType: 'application/pdf',
      sizeBytes: '10',
      sha256: 'c'.repeat(64),
      storageKey: `test-record/${c.id}/never-stored`,
      uploadedByUserId: o.athlete.userId,
      uploadedByName: o.athlete.name,
    });
    const [row] = await h.ds.query(
      `INSERT INTO record_exports (organization_id, athlete_id, requested_by) VALUES ($1, $2, $3) RETURNING id`,
      [o.id, o.athlete.membershipId, o.athlete.userId],
    );
    const storage = createStorage(h.config);
    await buildRecordExport({ ds: h.ds, config: h.config, logger, jobs: h.jobs!, storage }, row.id);
    const [after] = await h.ds.query(`SELECT status, storage_key FROM record_exports WHERE id = $1`, [row.id]);
    expect(after.status).toBe('ready');
    const chunks: Buffer[] = [];
    for await (const chunk of await storage.get(after.storage_key)) chunks.push(chunk as Buffer);
    const files = unzipSync(new Uint8Array(Buffer.concat(chunks)));
    expect(Object.keys(files).filter((n) => n.startsWith('documents/'))).toEqual([]);
    expect(strFromU8(files['MISSING.txt'])).toMatch(/^These files are listed .+\n- documents\/2026-11-06-lost-scan-[0-9a-f]{8}\.pdf\n/);
    expect(JSON.parse(strFromU8(files['data/documents.json']))).toEqual([expect.objectContaining({ title: 'Lost scan' })]);
  });
});

describe('who may not ask', () => {
  it.each(['coach', 'clinician', 'admin'] as const)('asked by the %s → 403 with a sentence, nothing recorded', async (role) => {
    const c = await signedIn(h.app, org[role].email, TEST_PASSWORD);
    const res = await c.post(base(), { athleteId: org.athlete.membershipId });
    expect(res.status).toBe(403);
    expect(res.body.error.message).toMatch(/^Your role does not allow you to add to downloads of a whole record\./);
    expect((await c.get(base())).status).toBe(403);
  });

  it('an athlete for another athlete → 404; another organization → 404; signed out → 401', async () => {
    expect((await athlete.post(base(), { athleteId: org.otherAthlete.membershipId })).status).toBe(404);
    const b = await signedIn(h.app, orgB.athlete.email, TEST_PASSWORD);
    expect((await b.post(base(), { athleteId: org.athlete.membershipId })).status).toBe(404);
    expect((await b.post(`/api/orgs/${orgB.id}/record-exports`, { athleteId: org.athlete.membershipId })).status).toBe(404);
    const anon = await Client.anonymous(h.app);
    expect((await anon.post(base(), { athleteId: org.athlete.membershipId })).status).toBe(401);
  });

  it('a bad athlete id → 400 naming the field', async () => {
    const res = await athlete.post(base(), { athleteId: 'nope' });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual({ athleteId: ['must be a valid id'] });
  });
});

describe('rate limit and repeats', () => {
  it('a copy still being prepared is answered again, not started twice; a fourth in a day → 429', async () => {
    const o = await createOrg(h.ds);
    const a = await signedIn(h.app, o.otherAthlete.email, TEST_PASSWORD);
    for (let i = 0; i < 3; i++) {
      await h.ds.query(`INSERT INTO record_exports (organization_id, athlete_id, requested_by, status) VALUES ($1, $2, $3, 'failed')`, [
        o.id,
        o.otherAthlete.membershipId,
        o.otherAthlete.userId,
      ]);
    }
    const res = await a.post(`/api/orgs/${o.id}/record-exports`, { athleteId: o.otherAthlete.membershipId });
    expect(res.status).toBe(429);
    expect(res.body.error.message).toBe(
      'You have asked for 3 copies in the last day. Use the link already e-mailed, or ask again tomorrow.',
    );

    const b = await signedIn(h.app, o.athlete.email, TEST_PASSWORD);
    const [first, second] = await Promise.all([
      b.post(`/api/orgs/${o.id}/record-exports`, { athleteId: o.athlete.membershipId }),
      b.post(`/api/orgs/${o.id}/record-exports`, { athleteId: o.athlete.membershipId }),
    ]);
    expect([first.status, second.status]).toEqual([202, 202]);
    expect(first.body.id).toBe(second.body.id);
    await waitFor(
      'the copy e-mailed',
      async () => (await deliveriesWhere(h.ds, `kind = 'record_export' AND to_address = $1`, [o.athlete.email]))[0],
    );
    expect(await h.ds.query(`SELECT id FROM record_exports WHERE requested_by = $1`, [o.athlete.userId])).toHaveLength(1);
  });
});
