import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { RED_FLAG_ITEMS } from '../../../policies/red-flags';
import { EMAIL_CAUTION } from '../../../templates/email/layout';
import { emails } from '../../../templates/email/messages';
import { setNoticeQueue } from '../jobs/queue';
import { signedIn, useHarness } from '../test/harness';
import { createOrg, TEST_PASSWORD, type TestOrg } from '../test/factories';
import { enqueueEmail } from './deliveries';
import { deliveriesWhere, jobsFor, mailTo, sample, waitFor } from './mail-fixtures';

/**
 * E-mail through the durable queue: the real fake SMTP server, the real pg-boss queue and worker,
 * the real database; nothing of ours is mocked. A delivery and its job commit with the change that
 * caused them (the transactional outbox), and CR or LF never reaches a header field (ASVS 5.0
 * V1.3.11). Letters are in letter-mail.test.ts; a crash between commit and send in
 * delivery-crash.test.ts.
 */
describe('with the worker running', () => {
  const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' }, { mail: true });
  let org: TestOrg;
  beforeAll(async () => {
    // Notices go out by e-mail through the process-wide queue, as server.ts wires it.
    setNoticeQueue(h.jobs!);
    org = await createOrg(h.ds);
  });
  afterAll(() => setNoticeQueue(null));

  it('the delivery row and its job commit with the change, or not at all', async () => {
    let rolledBack: string | null = null;
    await expect(
      h.ds.transaction(async (m) => {
        rolledBack = await enqueueEmail(m, h.jobs!, sample(`rollback-${randomUUID()}@test.example`));
        throw new Error('the change failed after the e-mail was queued');
      }),
    ).rejects.toThrow('the change failed');
    expect(rolledBack).toMatch(/^[0-9a-f-]{36}$/);
    expect(await deliveriesWhere(h.ds, 'id = $1', [rolledBack])).toEqual([]);
    expect(await jobsFor(h.ds, [rolledBack!])).toEqual([]);

    // The same, committed: both are there (so the queries above could have found them).
    const to = `commit-${randomUUID()}@test.example`;
    const committed = await h.ds.transaction((m) => enqueueEmail(m, h.jobs!, sample(to)));
    expect(await deliveriesWhere(h.ds, 'id = $1', [committed])).toHaveLength(1);
    expect(await jobsFor(h.ds, [committed!])).toHaveLength(1);
    await waitFor('the committed e-mail', async () => (await mailTo(h.ds, [to])).length === 1);
  });

  it('a batch queued at once (a squad notice) goes out concurrently, each message exactly once', async () => {
    const tag = randomUUID();
    const to = Array.from({ length: 30 }, (_, i) => `batch-${i}-${tag}@test.example`);
    const ids = await h.ds.transaction(async (m) => {
      const out: string[] = [];
      for (const address of to) out.push((await enqueueEmail(m, h.jobs!, sample(address)))!);
      return out;
    });
    await waitFor('the whole batch', async () => (await deliveriesWhere(h.ds, `id = ANY($1) AND status = 'sent'`, [ids])).length === 30);
    const mail = await mailTo(h.ds, to);
    expect(mail.map((x) => x.envelope_to[0]).sort()).toEqual([...to].sort());
    expect((await deliveriesWhere(h.ds, 'id = ANY($1)', [ids])).every((r) => r.attempts === 1)).toBe(true);
    await waitFor('their jobs completed', async () => (await jobsFor(h.ds, ids)).every((j) => j.state === 'completed'));
  });

  it('CR or LF in a recipient address or subject is refused, and nothing is queued', async () => {
    const tag = randomUUID();
    for (const input of [
      sample(`victim-${tag}@test.example\r\nBcc: attacker-${tag}@test.example`),
      sample(`victim-${tag}@test.example\nBcc: attacker-${tag}@test.example`),
      sample(`victim-${tag}@test.example`, { content: { ...emails.notice(), subject: `Hello\r\nBcc: attacker-${tag}@test.example` } }),
    ]) {
      await expect(h.ds.transaction((m) => enqueueEmail(m, h.jobs!, input))).rejects.toThrow(/line break/);
    }
    expect(await deliveriesWhere(h.ds, 'to_address LIKE $1', [`%${tag}%`])).toEqual([]);
    // Through the API, such an address never gets that far.
    const admin = await signedIn(h.app, org.admin.email, TEST_PASSWORD);
    const res = await admin.post(`/api/orgs/${org.id}/invitations`, {
      email: `victim-${tag}@test.example\r\nBcc: attacker-${tag}@test.example`,
      roles: ['coach'],
    });
    expect(res.status).toBe(400);
    expect(await deliveriesWhere(h.ds, 'to_address LIKE $1', [`%${tag}%`])).toEqual([]);
  });

  it('an invitation e-mails its one-time link to the invited address; the link is not kept once sent', async () => {
    const admin = await signedIn(h.app, org.admin.email, TEST_PASSWORD);
    const email = `invited-${randomUUID()}@test.example`;
    const res = await admin.post(`/api/orgs/${org.id}/invitations`, { email, roles: ['coach'] });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const link = res.body.link as string;
    const token = new URL(link).hash.slice(1);
    expect(token.length).toBeGreaterThanOrEqual(20);
    const [mail] = await waitFor('the invitation e-mail', async () => {
      const m = await mailTo(h.ds, [email]);
      return m.length ? m : null;
    });
    expect(mail.envelope_to).toEqual([email]);
    expect(mail.text_body).toContain('/invite#');
    expect(mail.text_body).toContain(`Accept the invitation: ${link}`);
    expect(mail.html_body).toContain(`href="${link}"`);
    expect(mail.subject).toMatch(/^You're invited to .+ on Loadline$/);
    const [row] = await waitFor('the invitation delivery marked sent', async () => {
      const r = await deliveriesWhere(h.ds, 'to_address = $1', [email]);
      return r[0]?.status === 'sent' ? r : null;
    });
    expect(row).toMatchObject({ kind: 'invitation', body_text: null, body_html: null });
    const [stored] = await h.ds.query(`SELECT to_jsonb(d) AS r FROM email_deliveries d WHERE id = $1`, [row.id]);
    expect(JSON.stringify(stored.r)).not.toContain(token);
    expect(await mailTo(h.ds, [email])).toHaveLength(1);
  });

  it("an emergency red-flag report e-mails the athlete's clinicians and guardian (the guardian without the answers or narrative)", async () => {
    const athlete = await signedIn(h.app, org.athlete.email, TEST_PASSWORD);
    const NOTE = `Narrative ${randomUUID()}`;
    const saddle = RED_FLAG_ITEMS.find((i) => i.id === 'saddle_numbness')!;
    const res = await athlete.post(`/api/orgs/${org.id}/pain-reports`, {
      athleteId: org.athlete.membershipId,
      bodyRegions: ['lower_back'],
      painNow: 2,
      painWorst24h: 3,
      onsetDate: '2026-01-12',
      aggravatingPatterns: ['hinge'],
      startedInTraining: true,
      note: NOTE,
      redFlags: { ...Object.fromEntries(RED_FLAG_ITEMS.map((i) => [i.id, false])), saddle_numbness: true },
    });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.route).toBe('emergency');
    const byTo = await waitFor('the clinician and guardian e-mails', async () => {
      const m = await mailTo(h.ds, [org.clinician.email, org.guardian.email]);
      const notices = m.filter((x) => !x.subject?.startsWith('Clearance letter'));
      return notices.length >= 2 ? new Map(notices.map((x) => [x.envelope_to[0], x])) : null;
    });
    const clin = byTo.get(org.clinician.email)!;
    expect(clin.subject).toBe(`Emergency warning sign: ${org.athlete.name}`);
    expect(clin.text_body).toContain(saddle.question);
    const guardian = byTo.get(org.guardian.email)!;
    expect(guardian.subject).toBe(`${org.athlete.name} has been told to get urgent medical care`);
    expect(guardian.text_body).toContain('get urgent medical care now');
    expect(guardian.text_body).not.toContain(saddle.question);
    for (const m of byTo.values()) {
      expect(m.text_body).not.toContain(NOTE);
      expect(m.text_body).toContain(EMAIL_CAUTION);
    }
    // Only the athlete's own circle: the clinician of nobody here gets nothing.
    expect((await mailTo(h.ds, [org.otherClinician.email])).length).toBe(0);
    const notices = await deliveriesWhere(h.ds, `kind LIKE 'notice:%' AND recipient_id = ANY($1)`, [
      [org.clinician.membershipId, org.guardian.membershipId],
    ]);
    expect(notices.map((n) => n.kind).sort()).toEqual(['notice:red_flag_emergency', 'notice:red_flag_emergency_guardian']);
  });
});
