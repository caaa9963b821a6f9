import { describe, expect, it } from 'vitest';
import { Client, signedIn, useHarness } from '../../test/harness';
import { createOrg, TEST_PASSWORD } from '../../test/factories';
import { invitationToken, uniqueEmail } from '../../test/worlds/session-fixtures';

describe('passwords (through the invitation-accept flow)', () => {
  const h = useHarness();

  it('stores a bcrypt hash at cost 12 or more', async () => {
    const org = await createOrg(h.ds);
    const admin = await signedIn(h.app, org.admin.email, TEST_PASSWORD);
    const email = uniqueEmail('cost');
    const token = await invitationToken(admin, org.id, { email, roles: ['coach'] });
    const newcomer = await Client.anonymous(h.app);
    const password = 'a fine long passphrase for cost';
    const res = await newcomer.post('/api/invitations/accept', { token, displayName: 'Cost Check', password });
    expect(res.status).toBe(200);
    const rows: { password_hash: string }[] = await h.ds.query('SELECT password_hash FROM users WHERE email = $1', [email]);
    expect(rows).toHaveLength(1);
    const match = /^\$2[ab]\$(\d\d)\$/.exec(rows[0].password_hash);
    expect(match).not.toBeNull();
    expect(Number(match![1])).toBeGreaterThanOrEqual(12);
    expect(rows[0].password_hash).not.toContain(password);
  });

  it('refuses a 73-byte password with a message naming password (bcrypt would cut it silently)', async () => {
    const org = await createOrg(h.ds);
    const admin = await signedIn(h.app, org.admin.email, TEST_PASSWORD);
    const email = uniqueEmail('long');
    const token = await invitationToken(admin, org.id, { email, roles: ['coach'] });
    const newcomer = await Client.anonymous(h.app);
    const res = await newcomer.post('/api/invitations/accept', { token, displayName: 'Too Long', password: 'x'.repeat(73) });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation_failed');
    expect(res.body.error.fields.password[0]).toMatch(/72 bytes/);
    expect(res.body.error.message).toMatch(/password/);
    const rows: { n: number }[] = await h.ds.query('SELECT count(*)::int AS n FROM users WHERE email = $1', [email]);
    expect(rows[0].n).toBe(0);
  });

  it('applies the password policy: length in characters and bytes, no common passwords', async () => {
    const org = await createOrg(h.ds);
    const admin = await signedIn(h.app, org.admin.email, TEST_PASSWORD);
    const cases: { label: string; password: string; ok: boolean }[] = [
      { label: '7 characters', password: 'Zq7#mK2', ok: false },
      { label: '8 characters', password: 'Zq7#mK2p', ok: true },
      { label: 'common: password1', password: 'password1', ok: false },
      { label: 'common: qwertyuiop', password: 'qwertyuiop', ok: false },
      { label: 'common, other case: PASSWORD1', password: 'PASSWORD1', ok: false },
      { label: '72 bytes', password: 'k'.repeat(60) + 'Zq7#mK2p0123', ok: true },
      { label: "'é' × 37 = 74 bytes in 37 characters", password: 'é'.repeat(37), ok: false },
    ];
    expect(new TextEncoder().encode(cases[5].password).length).toBe(72);

    const outcomes: { label: string; status: number; fields: string[] }[] = [];
    for (const { label, password } of cases) {
      const email = uniqueEmail('policy');
      const token = await invitationToken(admin, org.id, { email, roles: ['guardian'] });
      const res = await (await Client.anonymous(h.app)).post('/api/invitations/accept', { token, displayName: label, password });
      outcomes.push({ label, status: res.status, fields: Object.keys(res.body.error?.fields ?? {}) });
    }
    expect(outcomes).toEqual(cases.map(({ label, ok }) => ({ label, status: ok ? 200 : 400, fields: ok ? [] : ['password'] })));
  });
});
