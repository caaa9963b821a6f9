import { beforeAll, describe, expect, it } from 'vitest';
import pino from 'pino';
import type { RosterImportDto } from '../../../../policies/dto';
import { Client, signedIn, useHarness } from '../../test/harness';
import { createOrg, TEST_PASSWORD, type TestOrg } from '../../test/factories';
import { runRosterImport } from '../../services/roster-import-job';
import { createStorage } from '../../storage';
import { rosterCsv, upload, waitDone } from '../../test/worlds/roster-imports-fixtures';

/**
 * Bringing a large roster: a 2,000-row roster imports in the background with progress, and the server keeps
 * answering while it runs (batches of 25 rows, each its own transaction, the event loop free between).
 */
const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' }, { mail: true });

describe('a 2,000-row roster', () => {
  let org: TestOrg;
  let admin: Client;

  beforeAll(async () => {
    const deps = { ds: h.ds, config: h.config, logger: pino({ level: 'silent' }), jobs: h.jobs!, storage: createStorage(h.config) };
    await h.jobs!.workRosterImports((job) => runRosterImport(deps, job.importId));
    org = await createOrg(h.ds);
    admin = await signedIn(h.app, org.admin.email, TEST_PASSWORD);
  });

  it(
    'previews, imports with progress while other requests are answered, and a second import changes nothing',
    { timeout: 600_000 },
    async () => {
      const tag = Math.random().toString(36).slice(2, 8);
      const rows = Array.from({ length: 2000 }, (_, i) => ({
        name: `Athlete ${i}`,
        email: `a${i}-${tag}@big.example`,
        date_of_birth: i % 4 === 0 ? '2011-03-01' : '1999-03-01',
        sport: 'Athletics',
        groups: `Squad ${i % 20}`,
        ...(i % 4 === 0 ? { guardian1_name: `Parent ${i}`, guardian1_email: `p${i}-${tag}@big.example` } : {}),
        ...(i % 10 === 0 ? { coach_emails: org.coach.email } : {}),
      }));
      const csv = rosterCsv(rows);
      const preview = await upload(admin, org.id, csv, 'big.csv');
      expect(preview.status, JSON.stringify(preview.body).slice(0, 300)).toBe(201);
      expect(preview.body.counts).toEqual({ rows: 2000, create: 2000, update: 0, unchanged: 0, skip: 0 });
      const id = preview.body.import.id as string;
      expect((await admin.post(`/api/orgs/${org.id}/roster-imports/${id}/start`)).status).toBe(202);

      // Progress is seen part-way, and other requests are answered meanwhile.
      const seen = new Set<number>();
      let last: RosterImportDto | null = null;
      const end = Date.now() + 540_000;
      while (Date.now() < end) {
        const res = await admin.get(`/api/orgs/${org.id}/roster-imports/${id}`);
        expect(res.status).toBe(200);
        last = res.body;
        seen.add(last!.processed);
        if (last!.status === 'done' || last!.status === 'failed') break;
        expect((await admin.get(`/api/orgs/${org.id}/groups`)).status).toBe(200);
        await new Promise((r) => setTimeout(r, 500));
      }
      expect(last).toMatchObject({ status: 'done', processed: 2000, created: 2000, skipped: 0, invitations: 2500 });
      expect([...seen].some((n) => n > 0 && n < 2000)).toBe(true);
      const [{ n }] = await h.ds.query(`SELECT count(*) AS n FROM memberships WHERE organization_id = $1`, [org.id]);
      // 2,000 athletes and 500 guardians besides the nine people of createOrg.
      expect(Number(n)).toBe(2509);

      const again = await upload(admin, org.id, csv, 'big.csv');
      expect(again.body.counts).toEqual({ rows: 2000, create: 0, update: 0, unchanged: 2000, skip: 0 });
      expect((await admin.post(`/api/orgs/${org.id}/roster-imports/${again.body.import.id}/start`)).status).toBe(202);
      expect(await waitDone(admin, org.id, again.body.import.id, 300_000)).toMatchObject({
        status: 'done',
        unchanged: 2000,
        invitations: 0,
      });
    },
  );
});
