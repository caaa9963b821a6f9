import { describe, expect, it } from 'vitest';
import { Client, signedIn, useHarness } from '../../test/harness';
import { createOrg, TEST_PASSWORD } from '../../test/factories';
import { NEW_PASSWORD, uniqueEmail, unknownToken } from '../../test/worlds/invitations-fixtures';

describe('invitation rate limits are per link, not one bucket for everyone', () => {
  const h = useHarness();

  it('a stranger’s failed tries with made-up links do not block a real invitation', async () => {
    const org = await createOrg(h.ds);
    const admin = await signedIn(h.app, org.admin.email, TEST_PASSWORD);
    const res = await admin.post(`/api/orgs/${org.id}/invitations`, { email: uniqueEmail('real'), roles: ['coach'] });
    expect(res.status).toBe(201);
    const token = new URL(res.body.link).hash.slice(1);

    const stranger = await Client.anonymous(h.app);
    const tries = h.config.SIGNIN_MAX_FAILURES_PER_ACCOUNT + 2;
    for (let i = 0; i < tries; i++) {
      expect((await stranger.post('/api/invitations/preview', { token: unknownToken() })).status).toBe(404);
      expect(
        (await stranger.post('/api/invitations/accept', { token: unknownToken(), displayName: 'X', password: NEW_PASSWORD })).status,
      ).toBe(404);
    }

    const newcomer = await Client.anonymous(h.app);
    expect((await newcomer.post('/api/invitations/preview', { token })).status).toBe(200);
    const accepted = await newcomer.post('/api/invitations/accept', { token, displayName: 'Real Person', password: NEW_PASSWORD });
    expect(accepted.status).toBe(200);
  });

  it('repeated failures on one link are still limited', async () => {
    const org = await createOrg(h.ds);
    const admin = await signedIn(h.app, org.admin.email, TEST_PASSWORD);
    const res = await admin.post(`/api/orgs/${org.id}/invitations`, { email: uniqueEmail('typo'), roles: ['coach'] });
    const token = new URL(res.body.link).hash.slice(1);
    const guesser = await Client.anonymous(h.app);
    const statuses: number[] = [];
    for (let i = 0; i <= h.config.SIGNIN_MAX_FAILURES_PER_ACCOUNT; i++) {
      const r = await guesser.post('/api/invitations/accept', { token, displayName: 'X', password: `short${i}` });
      statuses.push(r.status);
    }
    expect(statuses).toEqual([...Array(h.config.SIGNIN_MAX_FAILURES_PER_ACCOUNT).fill(400), 429]);
  });
});
