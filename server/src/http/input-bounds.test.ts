import { describe, expect, it } from 'vitest';
import request from 'supertest';
import { Client, signedIn, useHarness } from '../test/harness';
import { expectNoStack } from '../test/no-stack';
import { createOrg, TEST_PASSWORD, type TestOrg } from '../test/factories';

/**
 * Each finding of the 10,000-request fuzz in the hardening issue, as the request that answered 500:
 * each must now be a 4xx naming what is wrong, without a stack.
 */
describe('input at the edges answers 4xx, never 5xx (ASVS 5.0 V2.2.1, V16.5.1)', () => {
  const h = useHarness({ SIGNIN_MAX_PER_IP: '10000' });
  let org: TestOrg;
  let admin: Client;
  const athletePath = () => `/api/orgs/${org.id}/athletes/${org.athlete.membershipId}`;

  const expect400 = (res: request.Response, field?: string) => {
    expect(res.status, res.text).toBe(400);
    expect(res.body.error.code).toBe('validation_failed');
    if (field) expect(Object.keys(res.body.error.fields ?? {})).toContain(field);
    expectNoStack(res.text);
  };

  it('RFC 3986 section 2.1: a malformed percent-escape in the path is 400, signed out or in, and is not echoed', async () => {
    org = await createOrg(h.ds);
    admin = await signedIn(h.app, org.admin.email, TEST_PASSWORD);
    for (const path of ['/api/orgs/%ZZ/people', `/api/orgs/${org.id}/people/%E0%A4%A`, '/api/orgs/%/athletes/%C0']) {
      const anon = await request(h.app).get(path);
      expect400(anon);
      expect(anon.text).not.toContain('%ZZ');
      expect400(await admin.get(path));
    }
    const anon = await Client.anonymous(h.app);
    expect400(await anon.post('/api/orgs/%ZZ/cases', {}));
  });

  it('ASVS 5.0 V2.2.1: U+0000 or an unpaired surrogate in stored text is 400 naming the field', async () => {
    expect400(await admin.patch('/api/me', { displayName: 'Ann\u0000Admin' }), 'displayName');
    expect400(await admin.patch('/api/me', { displayName: 'Ann \uD800' }), 'displayName');
    const version = (await admin.get(athletePath())).body.version;
    expect400(await admin.patch(athletePath(), { sport: 'rowing\u0000', version }), 'sport');
    // The same text with a paired surrogate (an emoji) is stored.
    const ok = await admin.patch(athletePath(), { sport: 'rowing 🚣', version });
    expect(ok.status, ok.text).toBe(200);
  });

  it('ASVS 5.0 V2.2.1: a version of 2^31 or more (past PostgreSQL integer) is 400 naming the field', async () => {
    for (const version of [2 ** 31, 2 ** 53, -1]) {
      expect400(await admin.patch(athletePath(), { sport: 'rowing', version }), 'version');
    }
    const clinician = await signedIn(h.app, org.clinician.email, TEST_PASSWORD);
    expect400(await clinician.get(`/api/orgs/${org.id}/plans/${org.athlete.membershipId}/versions/2147483648`), 'version');
  });

  it('ASVS 5.0 V2.2.1: a date in year 0000, or outside 1900–2100, is 400 naming the field', async () => {
    const version = (await admin.get(athletePath())).body.version;
    for (const dateOfBirth of ['0000-01-01', '1899-12-31', '9999-12-31']) {
      expect400(await admin.patch(athletePath(), { dateOfBirth, version }), 'dateOfBirth');
    }
    const coach = await signedIn(h.app, org.coach.email, TEST_PASSWORD);
    expect400(await coach.get(`${athletePath()}/today?date=0000-01-01`), 'date');
  });

  it('ASVS 5.0 V2.2.1: an unknown query key on a GET route is 400 naming the key', async () => {
    expect400(await admin.get(`/api/orgs/${org.id}/people?debug=1`), 'debug');
    expect400(await admin.get(`/api/orgs/${org.id}?__proto__[x]=1`));
    expect400(await request(h.app).get('/api/health?x=1'), 'x');
  });

  it('ASVS 5.0 V2.2.1: a body sent to a route that takes none is 400 naming the key', async () => {
    expect400(await admin.post(`/api/orgs/${org.id}/notifications/read-all`, { all: true }), 'all');
    const none = await admin.post(`/api/orgs/${org.id}/notifications/read-all`);
    expect(none.status, none.text).toBe(204);
  });
});
