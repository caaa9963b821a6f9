import { existsSync } from 'node:fs';
import { readdir, rm, stat } from 'node:fs/promises';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { describe, expect, it, vi } from 'vitest';
import { AuditEntry, CaseDocument, CareTeamAssignment } from '../../entities';
import { signedIn, useHarness, type Client } from '../../test/harness';
import { createOrg, TEST_PASSWORD, type MemberRef, type TestOrg } from '../../test/factories';
import { createCase, filesUnder, HEIC, HTML, PDF, PNG } from '../../test/worlds/uploads-fixtures';

// A small limit (about 51 kB) so oversize uploads stay quick; the default is 20 MB.
const LIMIT_MB = 0.05;
const LIMIT = Math.floor(LIMIT_MB * 1024 * 1024);
const h = useHarness({ SIGNIN_MAX_PER_IP: '1000', UPLOAD_MAX_DOCUMENT_MB: String(LIMIT_MB) });

type Who = 'admin' | 'coach' | 'clinician' | 'athlete' | 'guardian' | 'otherClinician' | 'otherAthlete';

async function world() {
  const org = await createOrg(h.ds);
  const kase = await createCase(h.ds, org.id, org.athlete.membershipId);
  const clients = new Map<Who, Promise<Client>>();
  const as = (who: Who) => {
    if (!clients.has(who)) clients.set(who, signedIn(h.app, (org[who] as MemberRef).email, TEST_PASSWORD));
    return clients.get(who)!;
  };
  return { org, kase, base: `/api/orgs/${org.id}`, as };
}
let shared: ReturnType<typeof world> | null = null;
const w = () => (shared ??= world());

function upload(c: Client, url: string, fields: Record<string, string>, file?: { data: Buffer; name: string; type?: string }) {
  let req = c.agent.post(url).set('x-csrf-token', c.csrf);
  for (const [k, v] of Object.entries(fields)) req = req.field(k, v);
  if (file) req = req.attach('file', file.data, { filename: file.name, contentType: file.type ?? 'application/pdf' });
  return req;
}
const FIELDS = { title: 'Knee MRI report', documentDate: '2026-11-20', issuedBy: 'Dr. A. Example, City Imaging' };

async function rowsFor(org: TestOrg) {
  return h.ds.getRepository(CaseDocument).count({ where: { organizationId: org.id } });
}

describe('case documents', () => {
  it('a clinician on the care team uploads a PDF; it lists and downloads as an attachment, never cached, audited', async () => {
    const { org, kase, base, as } = await w();
    const clinician = await as('clinician');
    const res = await upload(clinician, `${base}/cases/${kase.id}/documents`, FIELDS, { data: PDF, name: 'scan.pdf' });
    expect(res.status, res.text).toBe(201);
    expect(res.body).toMatchObject({
      caseId: kase.id,
      athleteId: org.athlete.membershipId,
      title: FIELDS.title,
      documentDate: '2026-11-20',
      mediaType: 'application/pdf',
      sizeBytes: PDF.length,
    });
    expect(res.body.sha256).toMatch(/^[0-9a-f]{64}$/);

    const list = await clinician.get(`${base}/cases/${kase.id}/documents`);
    expect(list.status).toBe(200);
    expect(list.body.map((d: { id: string }) => d.id)).toContain(res.body.id);

    const file = await clinician.get(res.body.downloadPath).buffer(true);
    expect(file.status).toBe(200);
    expect(file.headers['content-disposition']).toBe('attachment; filename="knee-mri-report-2026-11-20.pdf"');
    expect(file.headers['cache-control']).toBe('no-store');
    expect(file.headers['content-type']).toBe('application/pdf');
    expect(file.headers['x-content-type-options']).toBe('nosniff');
    expect(Buffer.compare(file.body as Buffer, PDF)).toBe(0);

    const actions = (await h.ds.getRepository(AuditEntry).find({ where: { subjectId: res.body.id } })).map((a) => a.action);
    expect(actions).toEqual(['case_document.uploaded', 'case_document.downloaded']);
  });

  it(
    'the athlete uploads to their own case and reads it; another athlete, a coach, a guardian, an admin and an off-team clinician get 404',
    { timeout: 90_000 },
    async () => {
      const { kase, base, as } = await w();
      const athlete = await as('athlete');
      const res = await upload(
        athlete,
        `${base}/cases/${kase.id}/documents`,
        { ...FIELDS, title: 'Referral' },
        { data: PNG, name: 'photo.png', type: 'image/png' },
      );
      expect(res.status, res.text).toBe(201);
      expect(res.body.mediaType).toBe('image/png');
      expect((await athlete.get(res.body.downloadPath)).status).toBe(200);
      expect((await athlete.get(`${base}/cases/${kase.id}/documents`)).status).toBe(200);

      for (const who of ['coach', 'guardian', 'admin', 'otherClinician', 'otherAthlete'] as const) {
        const c = await as(who);
        const file = await c.get(res.body.downloadPath);
        expect(file.status, `${who} file`).toBe(404);
        expect(file.body.error.code).toBe('not_found');
        expect((await c.get(`${base}/cases/${kase.id}/documents`)).status, `${who} list`).toBe(404);
        expect((await c.delete(`${base}/documents/${res.body.id}`)).status, `${who} delete`).toBe(404);
        const up = await upload(c, `${base}/cases/${kase.id}/documents`, FIELDS, { data: PDF, name: 'x.pdf' });
        expect(up.status, `${who} upload`).toBe(404);
      }
    },
  );

  it('a coach asking for a case document gets 404, not 403 (its existence is not revealed)', async () => {
    const { kase, base, as } = await w();
    const doc = await upload(await as('clinician'), `${base}/cases/${kase.id}/documents`, FIELDS, { data: PDF, name: 'a.pdf' });
    expect(doc.status).toBe(201);
    const coach = await as('coach');
    const res = await coach.get(doc.body.downloadPath);
    expect(res.status).toBe(404);
    expect(res.text).not.toContain('%PDF');
  });

  it('another organization cannot reach a document by id', async () => {
    const { kase, base, as } = await w();
    const doc = await upload(await as('clinician'), `${base}/cases/${kase.id}/documents`, FIELDS, { data: PDF, name: 'a.pdf' });
    const other = await createOrg(h.ds);
    const stranger = await signedIn(h.app, other.clinician.email, TEST_PASSWORD);
    expect((await stranger.get(`/api/orgs/${other.id}/documents/${doc.body.id}/file`)).status).toBe(404);
    expect((await stranger.get(doc.body.downloadPath)).status).toBe(404);
  });

  it('lists only the documents of that case, newest document date first', async () => {
    const { org, base, as } = await w();
    const clinician = await as('clinician');
    const caseA = await createCase(h.ds, org.id, org.athlete.membershipId);
    const caseB = await createCase(h.ds, org.id, org.athlete.membershipId);
    const url = (c: { id: string }) => `${base}/cases/${c.id}/documents`;
    await upload(clinician, url(caseA), { ...FIELDS, title: 'Older', documentDate: '2026-10-01' }, { data: PDF, name: 'a.pdf' });
    await upload(clinician, url(caseA), { ...FIELDS, title: 'Newer', documentDate: '2026-11-01' }, { data: PDF, name: 'b.pdf' });
    await upload(clinician, url(caseB), { ...FIELDS, title: 'Other case' }, { data: PDF, name: 'c.pdf' });
    const list = await clinician.get(url(caseA));
    expect(list.body.map((d: { title: string }) => d.title)).toEqual(['Newer', 'Older']);
  });

  it('accepts a HEIC photo of a document (named .jpg by the phone): the type comes from its bytes', async () => {
    const { kase, base, as } = await w();
    const res = await upload(await as('clinician'), `${base}/cases/${kase.id}/documents`, FIELDS, {
      data: HEIC,
      name: 'IMG_1234.jpg',
      type: 'image/jpeg',
    });
    expect(res.status, res.text).toBe(201);
    expect(res.body.mediaType).toBe('image/heic');
    const file = await (await as('clinician')).get(res.body.downloadPath);
    expect(file.headers['content-disposition']).toBe('attachment; filename="knee-mri-report-2026-11-20.heic"');
  });

  it('refuses an HTML file renamed .pdf with 415 and a sentence, keeping nothing', async () => {
    const { org, kase, base, as } = await w();
    const before = await rowsFor(org);
    const res = await upload(await as('clinician'), `${base}/cases/${kase.id}/documents`, FIELDS, {
      data: HTML,
      name: 'report.pdf',
      type: 'application/pdf',
    });
    expect(res.status).toBe(415);
    expect(res.body.error.code).toBe('unsupported_media_type');
    expect(res.body.error.message).toBe('This file is not a PDF, JPEG, PNG or HEIC image (its contents were checked, not its name).');
    expect(await rowsFor(org)).toBe(before);
    expect((await filesUnder(h.storageDir)).filter((f) => f.includes(org.id) && f.endsWith('.partial'))).toEqual([]);
  });

  it('refuses an oversize file with 413 (declared size, and a size only the parser finds), leaving no file and no row', async () => {
    const { org, kase, base, as } = await w();
    const clinician = await as('clinician');
    const filesBefore = await filesUnder(path.join(h.storageDir, org.id));
    const rowsBefore = await rowsFor(org);
    // Far above the limit: refused from Content-Length, before reading the body.
    const huge = Buffer.concat([PDF, Buffer.alloc(LIMIT * 3, 0x20)]);
    // Just above it (within the allowance for fields): only counting the bytes finds it.
    const justOver = Buffer.concat([PDF, Buffer.alloc(LIMIT + 1 - PDF.length, 0x20)]);
    for (const data of [huge, justOver]) {
      const res = await upload(clinician, `${base}/cases/${kase.id}/documents`, FIELDS, { data, name: 'big.pdf' });
      expect(res.status).toBe(413);
      expect(res.body.error.code).toBe('payload_too_large');
      expect(res.body.error.message).toBe('The file is larger than the 0.05 MB limit for documents.');
    }
    // Exactly at the limit is accepted.
    const atLimit = Buffer.concat([PDF, Buffer.alloc(LIMIT - PDF.length, 0x20)]);
    const ok = await upload(clinician, `${base}/cases/${kase.id}/documents`, FIELDS, { data: atLimit, name: 'limit.pdf' });
    expect(ok.status, ok.text).toBe(201);
    expect(await rowsFor(org)).toBe(rowsBefore + 1);
    expect((await filesUnder(path.join(h.storageDir, org.id))).length).toBe(filesBefore.length + 1);
    // The session still works after the refusals (the body was drained, the connection kept).
    expect((await clinician.get(`${base}/cases/${kase.id}/documents`)).status).toBe(200);
  });

  it('an upload the client abandons part-way leaves no temporary file, no stored file and no row', async () => {
    const { org, kase, base, as } = await w();
    const clinician = await as('clinician');
    const rowsBefore = await rowsFor(org);
    const started = Date.now();
    const server = h.app.listen(0, '127.0.0.1');
    await new Promise((resolve) => server.once('listening', resolve));
    try {
      const { port } = server.address() as AddressInfo;
      const cookie = (await clinician.agent.jar.getCookies({ domain: '127.0.0.1', path: '/', secure: false, script: false }))
        .map((c: { name: string; value: string }) => `${c.name}=${c.value}`)
        .join('; ');
      const boundary = 'loadline-test-boundary';
      const head = Buffer.from(
        Object.entries(FIELDS)
          .map(([k, v]) => `--${boundary}\r\nContent-Disposition: form-data; name="${k}"\r\n\r\n${v}\r\n`)
          .join('') +
          `--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="a.pdf"\r\nContent-Type: application/pdf\r\n\r\n`,
      );
      const req = http.request({
        host: '127.0.0.1',
        port,
        method: 'POST',
        path: `${base}/cases/${kase.id}/documents`,
        headers: {
          cookie,
          'x-csrf-token': clinician.csrf,
          'content-type': `multipart/form-data; boundary=${boundary}`,
          'content-length': String(head.length + LIMIT - 100),
        },
      });
      req.on('error', () => undefined);
      req.write(head);
      req.write(Buffer.concat([PDF, Buffer.alloc(8000, 0x20)]));
      await new Promise((resolve) => setTimeout(resolve, 200));
      req.destroy();
      const leftovers = async () => {
        const dirs = (await readdir(os.tmpdir())).filter((d) => d.startsWith('loadline-upload-'));
        const recent = [];
        for (const d of dirs) {
          const st = await stat(path.join(os.tmpdir(), d)).catch(() => null);
          if (st && st.birthtimeMs >= started - 1000) recent.push(d);
        }
        return recent;
      };
      await vi.waitFor(async () => expect(await leftovers()).toEqual([]), { timeout: 5000, interval: 100 });
      expect(await rowsFor(org)).toBe(rowsBefore);
      expect((await filesUnder(path.join(h.storageDir, org.id))).filter((f) => f.endsWith('.partial'))).toEqual([]);
    } finally {
      await new Promise((resolve) => server.close(resolve));
    }
  });

  it("ignores a path in the file name: the stored key and the download name are the server's own", async () => {
    const { org, kase, base, as } = await w();
    const res = await upload(
      await as('clinician'),
      `${base}/cases/${kase.id}/documents`,
      { ...FIELDS, title: 'Passwd?' },
      { data: PDF, name: '../../etc/passwd.pdf' },
    );
    expect(res.status, res.text).toBe(201);
    const row = await h.ds.getRepository(CaseDocument).findOneByOrFail({ id: res.body.id });
    expect(row.storageKey).toMatch(new RegExp(`^${org.id}/documents/[0-9a-f-]{36}$`));
    expect(row.storageKey).not.toContain('passwd');
    expect(existsSync(path.join(h.storageDir, row.storageKey))).toBe(true);
    expect(existsSync(path.resolve(h.storageDir, '..', '..', 'etc', 'passwd.pdf'))).toBe(false);
    const file = await (await as('clinician')).get(res.body.downloadPath);
    expect(file.headers['content-disposition']).toBe('attachment; filename="passwd-2026-11-20.pdf"');
  });

  it('names each missing or bad field with 400; a JSON body or a missing file is refused clearly', async () => {
    const { kase, base, as } = await w();
    const clinician = await as('clinician');
    const url = `${base}/cases/${kase.id}/documents`;
    const noFile = await upload(clinician, url, FIELDS);
    expect(noFile.status).toBe(400);
    expect(noFile.body.error.fields).toEqual({ file: ['is required'] });
    const badFields = await upload(clinician, url, { title: '', documentDate: '2026-02-30' }, { data: PDF, name: 'a.pdf' });
    expect(badFields.status).toBe(400);
    expect(Object.keys(badFields.body.error.fields).sort()).toEqual(['documentDate', 'issuedBy', 'title']);
    const extra = await upload(clinician, url, { ...FIELDS, organizationId: 'x' }, { data: PDF, name: 'a.pdf' });
    expect(extra.status).toBe(400);
    expect(extra.body.error.fields).toHaveProperty('organizationId');
    const fieldAfterFile = await clinician.agent
      .post(url)
      .set('x-csrf-token', clinician.csrf)
      .field('title', FIELDS.title)
      .field('documentDate', FIELDS.documentDate)
      .attach('file', PDF, 'a.pdf')
      .field('issuedBy', FIELDS.issuedBy);
    expect(fieldAfterFile.status).toBe(400);
    expect(fieldAfterFile.body.error.fields).toHaveProperty('issuedBy');
    const twoFiles = await upload(clinician, url, FIELDS, { data: PDF, name: 'a.pdf' }).attach('file', PDF, 'b.pdf');
    expect(twoFiles.status).toBe(400);
    expect(twoFiles.body.error.fields).toEqual({ file: ['must be a single file'] });
    const otherName = await clinician.agent
      .post(url)
      .set('x-csrf-token', clinician.csrf)
      .field('title', FIELDS.title)
      .field('documentDate', FIELDS.documentDate)
      .field('issuedBy', FIELDS.issuedBy)
      .attach('document', PDF, 'a.pdf');
    expect(otherName.status).toBe(400);
    expect(otherName.body.error.fields).toHaveProperty('document');
    const json = await clinician.post(url, FIELDS);
    expect(json.status).toBe(415);
    expect(json.body.error.code).toBe('unsupported_media_type');
    const csrf = await clinician.agent.post(url).field('title', 'x').attach('file', PDF, 'a.pdf');
    expect(csrf.status).toBe(403);
    expect(csrf.body.error.code).toBe('csrf_failed');
  });

  it('delete removes the row and the stored file, audited; a coach cannot, the uploader athlete can remove their own', async () => {
    const { org, kase, base, as } = await w();
    const clinician = await as('clinician');
    const doc = await upload(clinician, `${base}/cases/${kase.id}/documents`, FIELDS, { data: PDF, name: 'a.pdf' });
    const row = await h.ds.getRepository(CaseDocument).findOneByOrFail({ id: doc.body.id });
    const stored = path.join(h.storageDir, row.storageKey);
    expect(existsSync(stored)).toBe(true);

    // The athlete sees it but did not upload it: 403 with a sentence.
    const athleteTry = await (await as('athlete')).delete(`${base}/documents/${doc.body.id}`);
    expect(athleteTry.status).toBe(403);

    const del = await clinician.delete(`${base}/documents/${doc.body.id}`);
    expect(del.status).toBe(204);
    expect(await h.ds.getRepository(CaseDocument).findOneBy({ id: doc.body.id })).toBeNull();
    expect(existsSync(stored)).toBe(false);
    const audit = await h.ds.getRepository(AuditEntry).findOneByOrFail({ subjectId: doc.body.id, action: 'case_document.deleted' });
    expect(audit.before).toMatchObject({ title: FIELDS.title, caseId: kase.id });
    expect((await clinician.get(doc.body.downloadPath)).status).toBe(404);

    const own = await upload(await as('athlete'), `${base}/cases/${kase.id}/documents`, FIELDS, { data: PDF, name: 'a.pdf' });
    expect((await (await as('athlete')).delete(`${base}/documents/${own.body.id}`)).status).toBe(204);
    void org;
  });

  it('a document whose file has gone missing answers a plain JSON error, not an empty attachment', async () => {
    const { kase, base, as } = await w();
    const clinician = await as('clinician');
    const doc = await upload(clinician, `${base}/cases/${kase.id}/documents`, FIELDS, { data: PDF, name: 'a.pdf' });
    const row = await h.ds.getRepository(CaseDocument).findOneByOrFail({ id: doc.body.id });
    await rm(path.join(h.storageDir, row.storageKey));
    const res = await clinician.get(doc.body.downloadPath);
    expect(res.status).toBe(500);
    expect(res.headers['content-type']).toMatch(/application\/json/);
    expect(res.headers['content-disposition']).toBeUndefined();
    expect(res.body.error.code).toBe('internal');
  });

  it('a clinician removed from the care team loses access at once', async () => {
    const { org, base } = await w();
    const kase = await createCase(h.ds, org.id, org.athlete.membershipId);
    const second = await h.ds
      .getRepository(CareTeamAssignment)
      .save({ organizationId: org.id, athleteId: org.athlete.membershipId, memberId: org.otherClinician.membershipId, role: 'clinician' });
    const c = await signedIn(h.app, org.otherClinician.email, TEST_PASSWORD);
    const doc = await upload(c, `${base}/cases/${kase.id}/documents`, FIELDS, { data: PDF, name: 'a.pdf' });
    expect(doc.status).toBe(201);
    await h.ds.getRepository(CareTeamAssignment).delete({ id: second.id });
    expect((await c.get(doc.body.downloadPath)).status).toBe(404);
  });
});
