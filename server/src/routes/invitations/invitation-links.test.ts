import { describe, expect, it } from 'vitest';
import type { DataSource } from 'typeorm';
import { dayIn } from '../../../../policies/today';
import { signedIn, useHarness } from '../../test/harness';
import { createOrg, TEST_PASSWORD } from '../../test/factories';
import { uniqueEmail } from '../../test/worlds/invitations-fixtures';

/**
 * Links in invitation e-mails come from configuration, never from the request's Host header: a
 * forged Host would otherwise put a live invitation token in a link to the attacker's site (OWASP
 * WSTG-INPV-17, Host header injection; "password reset poisoning").
 */
const inviteMail = async (ds: DataSource, to: string, waitMs = 20_000): Promise<string | null> => {
  const end = Date.now() + waitMs;
  for (;;) {
    const rows: { text_body: string }[] = await ds.query(
      `SELECT text_body FROM fake_mailbox WHERE envelope_to && $1 AND subject LIKE 'You''re invited to %' ORDER BY id`,
      [[to]],
    );
    if (rows.length) return rows[0].text_body;
    if (Date.now() > end) return null;
    await new Promise((r) => setTimeout(r, 100));
  }
};

describe('invitation links with PUBLIC_URL configured', () => {
  const h = useHarness({ PUBLIC_URL: 'https://club.loadline.example/' }, { mail: true });

  it('a request with a forged Host (or X-Forwarded-Host) is refused and e-mails nothing; links are on the configured address', async () => {
    const org = await createOrg(h.ds);
    const admin = await signedIn(h.app, org.admin.email, TEST_PASSWORD);
    const forged = uniqueEmail('forged');
    const res = await admin.agent
      .post(`/api/orgs/${org.id}/invitations`)
      .set('x-csrf-token', admin.csrf)
      .set('Host', 'attacker.example')
      .send({ email: forged, roles: ['coach'] });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty('host');

    const email = uniqueEmail('configured');
    const ok = await admin.post(`/api/orgs/${org.id}/invitations`, { email, roles: ['coach'] });
    expect(ok.status, JSON.stringify(ok.body)).toBe(201);
    expect(ok.body.link).toMatch(/^https:\/\/club\.loadline\.example\/invite#[A-Za-z0-9_-]{43}$/);
    const mail = await inviteMail(h.ds, email);
    expect(mail).toContain(ok.body.link);
    // Delivered after the refused ones would have been: none of them reached an e-mail.
    expect(await inviteMail(h.ds, forged, 0)).toBeNull();
  });

  it("the e-mail's last day of the link is a day on the organization's calendar", async () => {
    const org = await createOrg(h.ds);
    // One of these two zones is on another calendar day than UTC at any instant (UTC+14 from 10:00 UTC, UTC−11 before 11:00).
    const zone = new Date().getUTCHours() >= 10 ? 'Pacific/Kiritimati' : 'Pacific/Pago_Pago';
    await h.ds.query(`UPDATE organizations SET time_zone = $1 WHERE id = $2`, [zone, org.id]);
    const admin = await signedIn(h.app, org.admin.email, TEST_PASSWORD);
    const email = uniqueEmail('zone');
    const res = await admin.post(`/api/orgs/${org.id}/invitations`, { email, roles: ['guardian'] });
    expect(res.status).toBe(201);
    const expires = new Date(res.body.expiresAt);
    expect(dayIn(zone, expires)).not.toBe(res.body.expiresAt.slice(0, 10));
    expect(await inviteMail(h.ds, email)).toContain(`until ${dayIn(zone, expires)}.`);
  });
});

describe('invitation links without PUBLIC_URL', () => {
  const h = useHarness();

  it("use the server's own configured address, whatever loopback name the request uses", async () => {
    const org = await createOrg(h.ds);
    const admin = await signedIn(h.app, org.admin.email, TEST_PASSWORD);
    const res = await admin.agent
      .post(`/api/orgs/${org.id}/invitations`)
      .set('x-csrf-token', admin.csrf)
      .set('Host', 'localhost:5173')
      .send({ email: uniqueEmail('fallback'), roles: ['coach'] });
    expect(res.status).toBe(201);
    expect(res.body.link.startsWith(`http://${h.config.HOST}:${h.config.PORT}/invite#`)).toBe(true);
  });
});
