import { afterEach, describe, expect, it, vi } from 'vitest';
import { signedIn, useHarness } from '../../test/harness';
import { createOrg, TEST_PASSWORD, type TestOrg } from '../../test/factories';
import { COUNTRY_MESSAGE } from '../../../../policies/schemas';

const ZONE_MESSAGE = 'must be an IANA time zone such as America/Chicago';

describe("the organization's time zone, in the admin's settings", () => {
  const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });
  const as = (m: TestOrg['admin']) => signedIn(h.app, m.email, TEST_PASSWORD);
  afterEach(() => {
    vi.useRealTimers();
  });

  it('GET /orgs/:id and GET /settings show it; an organization keeps UTC until an admin sets one', async () => {
    const org = await createOrg(h.ds);
    const coach = await as(org.coach);
    expect((await coach.get(`/api/orgs/${org.id}`)).body).toEqual({
      id: org.id,
      name: expect.any(String),
      emergencyNumber: '911',
      timeZone: 'UTC',
    });
    const settings = await (await as(org.admin)).get(`/api/orgs/${org.id}/settings`);
    expect(settings.status).toBe(200);
    expect(settings.body).toEqual({
      id: org.id,
      name: expect.any(String),
      emergencyNumber: '911',
      timeZone: 'UTC',
      guardiansSeeClips: false,
      letterPaper: null,
      letterPaperInUse: 'a4',
      country: null,
      emergencyNumberFollowsCountry: false,
      version: 1,
    });
  });

  it("an admin sets an IANA zone: version-checked, audited before and after, and every member's session shows it", async () => {
    const org = await createOrg(h.ds);
    const admin = await as(org.admin);
    const res = await admin.patch(`/api/orgs/${org.id}/settings`, { timeZone: 'America/Chicago', version: 1 });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body).toMatchObject({ timeZone: 'America/Chicago', version: 2 });

    const entries: { before: Record<string, unknown>; after: Record<string, unknown>; actor_user_id: string }[] = await h.ds.query(
      `SELECT before, after, actor_user_id FROM audit_entries WHERE action = 'organization.settings_changed' AND subject_id = $1`,
      [org.id],
    );
    expect(entries).toHaveLength(1);
    expect(entries[0].actor_user_id).toBe(org.admin.userId);
    expect(entries[0].before).toMatchObject({ timeZone: 'UTC', emergencyNumber: '911' });
    expect(entries[0].after).toMatchObject({ timeZone: 'America/Chicago', emergencyNumber: '911' });

    const stale = await admin.patch(`/api/orgs/${org.id}/settings`, { timeZone: 'Europe/Paris', version: 1 });
    expect(stale.status).toBe(409);
    expect(stale.body.error.code).toBe('version_conflict');

    const coach = await as(org.coach);
    expect((await coach.get(`/api/orgs/${org.id}`)).body.timeZone).toBe('America/Chicago');
    const session = await coach.get('/api/session');
    expect(session.body.memberships.map((m: { timeZone: string }) => m.timeZone)).toEqual(['America/Chicago']);
  });

  it('refuses a name that is not an IANA time zone, naming the field, and changes nothing', async () => {
    const org = await createOrg(h.ds);
    const admin = await as(org.admin);
    for (const timeZone of ['Mars/Olympus_Mons', 'Central Time', '', 'x'.repeat(80), 42]) {
      const res = await admin.patch(`/api/orgs/${org.id}/settings`, { timeZone, version: 1 });
      expect(res.status, String(timeZone)).toBe(400);
      expect(res.body.error.code).toBe('validation_failed');
      expect(res.body.error.fields).toEqual({ timeZone: [ZONE_MESSAGE] });
      expect(res.body.error.message).toContain(`timeZone ${ZONE_MESSAGE}`);
    }
    expect((await admin.get(`/api/orgs/${org.id}/settings`)).body).toMatchObject({ timeZone: 'UTC', version: 1 });
  });

  it('only an admin changes it', async () => {
    const org = await createOrg(h.ds);
    for (const member of [org.coach, org.clinician, org.athlete, org.guardian]) {
      const res = await (await as(member)).patch(`/api/orgs/${org.id}/settings`, { timeZone: 'Asia/Tokyo', version: 1 });
      expect(res.status, member.email).toBe(403);
    }
    expect((await (await as(org.admin)).get(`/api/orgs/${org.id}/settings`)).body.timeZone).toBe('UTC');
  });

  it("decides the organization's today: an athlete's birthday comes at local midnight, not UTC's", async () => {
    // 03:30 UTC on 14 March 2027 is still the evening of 13 March in Chicago (UTC−6 until 08:00 UTC that day).
    vi.useFakeTimers({ toFake: ['Date'] });
    vi.setSystemTime(new Date('2027-03-14T03:30:00Z'));
    const org = await createOrg(h.ds);
    const admin = await as(org.admin);
    const athletePath = `/api/orgs/${org.id}/athletes/${org.athlete.membershipId}`;
    const inUtc = await admin.get(athletePath);
    expect(inUtc.body).toMatchObject({ dateOfBirth: '2010-03-14', age: 17 });

    expect((await admin.patch(`/api/orgs/${org.id}/settings`, { timeZone: 'America/Chicago', version: 1 })).status).toBe(200);
    const inChicago = await admin.get(athletePath);
    expect(inChicago.body).toMatchObject({ dateOfBirth: '2010-03-14', age: 16 });
    const person = await admin.get(`/api/orgs/${org.id}/people/${org.athlete.membershipId}`);
    expect(person.body.athlete).toMatchObject({ age: 16 });
  });
});

describe("the organization's country, in the admin's settings", () => {
  const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });
  const as = (m: TestOrg['admin']) => signedIn(h.app, m.email, TEST_PASSWORD);
  const inUs = async (emergencyNumber: string) => {
    const org = await createOrg(h.ds);
    await h.ds.query(`UPDATE organizations SET country = 'US', emergency_number = $2 WHERE id = $1`, [org.id, emergencyNumber]);
    return org;
  };
  const entries = (orgId: string): Promise<{ before: Record<string, unknown>; after: Record<string, unknown> }[]> =>
    h.ds.query(
      `SELECT before, after FROM audit_entries WHERE action = 'organization.settings_changed' AND subject_id = $1 ORDER BY occurred_at`,
      [orgId],
    );

  it('a new country brings its emergency number (GB 999), which the stop-and-get-care screen shows; audited before and after', async () => {
    const org = await inUs('911');
    const admin = await as(org.admin);
    expect((await admin.get(`/api/orgs/${org.id}/settings`)).body).toMatchObject({ country: 'US', emergencyNumberFollowsCountry: true });
    const res = await admin.patch(`/api/orgs/${org.id}/settings`, { country: 'gb', emergencyNumber: '911', version: 1 });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body).toMatchObject({ country: 'GB', emergencyNumber: '999', emergencyNumberFollowsCountry: true, version: 2 });
    expect((await (await as(org.athlete)).get(`/api/orgs/${org.id}`)).body.emergencyNumber).toBe('999');
    const [entry] = await entries(org.id);
    expect(entry.before).toMatchObject({ country: 'US', emergencyNumber: '911' });
    expect(entry.after).toMatchObject({ country: 'GB', emergencyNumber: '999' });
  });

  it('a number set by hand stays when the country changes; a number typed in the same edit wins', async () => {
    const org = await inUs('+1 555 0100');
    const admin = await as(org.admin);
    const kept = await admin.patch(`/api/orgs/${org.id}/settings`, { country: 'NO', version: 1 });
    expect(kept.body).toMatchObject({ country: 'NO', emergencyNumber: '+1 555 0100', emergencyNumberFollowsCountry: false });
    const typed = await admin.patch(`/api/orgs/${org.id}/settings`, { country: 'AU', emergencyNumber: '000', version: 2 });
    expect(typed.body).toMatchObject({ country: 'AU', emergencyNumber: '000', emergencyNumberFollowsCountry: true, version: 3 });
  });

  it('refuses a code that is not ISO 3166-1 alpha-2, naming the field, and changes nothing; a stale version is a 409', async () => {
    const org = await inUs('911');
    const admin = await as(org.admin);
    for (const country of ['XX', 'USA', '', 'Norway', 7]) {
      const res = await admin.patch(`/api/orgs/${org.id}/settings`, { country, version: 1 });
      expect(res.status, String(country)).toBe(400);
      expect(res.body.error.fields).toEqual({ country: [COUNTRY_MESSAGE] });
      expect(res.body.error.message).toContain(`country ${COUNTRY_MESSAGE}`);
    }
    expect((await admin.patch(`/api/orgs/${org.id}/settings`, { country: 'CA', version: 1 })).status).toBe(200);
    const stale = await admin.patch(`/api/orgs/${org.id}/settings`, { country: 'GB', version: 1 });
    expect(stale.status).toBe(409);
    expect((await admin.get(`/api/orgs/${org.id}/settings`)).body).toMatchObject({ country: 'CA', emergencyNumber: '911', version: 2 });
    expect(await entries(org.id)).toHaveLength(1);
  });

  it('only an admin changes it', async () => {
    const org = await inUs('911');
    const res = await (await as(org.coach)).patch(`/api/orgs/${org.id}/settings`, { country: 'GB', version: 1 });
    expect(res.status).toBe(403);
  });
});
