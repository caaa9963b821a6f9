import { beforeAll, describe, expect, it } from 'vitest';
import type { GroupDto } from '../../../../policies/dto/teams';
import type { RosterRowDto } from '../../../../policies/dto';
import { Client, signedIn, useHarness } from '../../test/harness';
import { createMember, createOrg, TEST_PASSWORD, type MemberRef, type TestOrg } from '../../test/factories';
import { put } from '../../test/worlds/test-world';

/** Team programming, groups: who starts them, who keeps their membership, and that a group's coach sees its athletes. */
const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });

describe('groups', () => {
  let org: TestOrg;
  let orgB: TestOrg;
  let admin: Client, coach: Client, otherCoach: Client, clinician: Client, otherClinician: Client, athlete: Client, guardian: Client;
  let adminB: Client;
  let third: MemberRef;
  let base: string;

  beforeAll(async () => {
    org = await createOrg(h.ds);
    orgB = await createOrg(h.ds);
    third = await createMember(h.ds, org.id, ['athlete'], { name: 'Third Athlete' });
    base = `/api/orgs/${org.id}`;
    const sign = (m: MemberRef) => signedIn(h.app, m.email, TEST_PASSWORD);
    // One at a time: sign-in hashing is limited to a few at once (503 beyond).
    const clients: Client[] = [];
    for (const m of [org.admin, org.coach, org.otherCoach, org.clinician, org.otherClinician, org.athlete, org.guardian, orgB.admin])
      clients.push(await sign(m));
    [admin, coach, otherCoach, clinician, otherClinician, athlete, guardian, adminB] = clients;
  });

  let n = 0;
  const uniqueName = (stem: string) => `${stem} ${++n}`;
  const create = (c: Client, body: object) => c.post(`${base}/groups`, body);
  const audit = async (groupId: string) =>
    (
      (await h.ds.query(`SELECT action, before, after FROM audit_entries WHERE subject_type = 'Group' AND subject_id = $1 ORDER BY id`, [
        groupId,
      ])) as { action: string; before: unknown; after: unknown }[]
    ).map((r) => r.action);
  const freshPair = async () => {
    const coachRef = await createMember(h.ds, org.id, ['coach']);
    const loner = await createMember(h.ds, org.id, ['athlete']);
    return { coachRef, groupCoach: await signedIn(h.app, coachRef.email, TEST_PASSWORD), loner };
  };
  const ids = (people: { id: string }[]) => people.map((p) => p.id).sort();

  it('an admin creates a group with named coaches and athletes, and the change is audited', async () => {
    const res = await create(admin, {
      name: '  Sprinters  ',
      kind: 'position',
      coachIds: [org.otherCoach.membershipId],
      athleteIds: [org.otherAthlete.membershipId, third.membershipId],
    });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const g = res.body as GroupDto;
    expect(g).toMatchObject({ name: 'Sprinters', kind: 'position', canManage: true, canSetCoaches: true, archived: false, version: 1 });
    expect(ids(g.coaches)).toEqual([org.otherCoach.membershipId]);
    expect(ids(g.athletes)).toEqual([org.otherAthlete.membershipId, third.membershipId].sort());
    expect(g.athletes.map((a) => a.name)).toContain('Third Athlete');
    expect(await audit(g.id)).toEqual(['group.created']);
    const list = await admin.get(`${base}/groups`);
    expect(list.status).toBe(200);
    expect((list.body as GroupDto[]).map((x) => x.id)).toContain(g.id);
  });

  it('a coach who creates a group becomes its coach; naming another coach is for admins only', async () => {
    const res = await create(coach, { name: uniqueName('Infield'), kind: 'team', athleteIds: [org.athlete.membershipId] });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(ids(res.body.coaches)).toEqual([org.coach.membershipId]);
    expect(res.body).toMatchObject({ canManage: true, canSetCoaches: false });
    const refused = await create(coach, {
      name: uniqueName('Outfield'),
      kind: 'team',
      athleteIds: [],
      coachIds: [org.otherCoach.membershipId],
    });
    expect(refused.status).toBe(403);
    expect(refused.body.error.fields.coachIds).toEqual(['can only be set by an admin']);
  });

  it("a group's coach sees its athletes in the roster and the athletes list, as a care-team coach does; leaving the group ends it", async () => {
    // A coach and an athlete of their own, on nobody's care team and in no group yet.
    const { coachRef, groupCoach, loner } = await freshPair();
    const otherCoach = groupCoach;
    const third = loner;
    const before = await otherCoach.get(`${base}/roster`);
    expect(before.status).toBe(200);
    expect((before.body as RosterRowDto[]).map((r) => r.athleteId)).not.toContain(third.membershipId);
    const g = (
      await create(admin, {
        name: uniqueName('Block'),
        kind: 'block',
        coachIds: [coachRef.membershipId],
        athleteIds: [third.membershipId],
      })
    ).body as GroupDto;
    const roster = await otherCoach.get(`${base}/roster`);
    expect((roster.body as RosterRowDto[]).map((r) => r.athleteId)).toContain(third.membershipId);
    const athletes = await otherCoach.get(`${base}/athletes`);
    expect(athletes.status).toBe(200);
    expect(JSON.stringify(athletes.body)).toContain(third.membershipId);
    expect((await otherCoach.get(`${base}/athletes/${third.membershipId}`)).status).toBe(200);

    // The coach takes the athlete out of the group: their access ends on the next request.
    const out = await put(otherCoach, `${base}/groups/${g.id}/members`, {
      coachIds: [coachRef.membershipId],
      athleteIds: [],
      version: g.version,
    });
    expect(out.status, JSON.stringify(out.body)).toBe(200);
    expect(out.body.version).toBe(g.version + 1);
    expect((await otherCoach.get(`${base}/athletes/${third.membershipId}`)).status).toBe(404);
    expect(await audit(g.id)).toEqual(['group.created', 'group.members_changed']);
  });

  it('an archived group no longer gives its coach its athletes, and is no longer listed', async () => {
    const { coachRef, groupCoach: otherCoach, loner: third } = await freshPair();
    const g = (
      await create(admin, {
        name: uniqueName('Archive me'),
        kind: 'team',
        coachIds: [coachRef.membershipId],
        athleteIds: [third.membershipId],
      })
    ).body as GroupDto;
    expect((await otherCoach.get(`${base}/athletes/${third.membershipId}`)).status).toBe(200);
    const archived = await otherCoach.post(`${base}/groups/${g.id}/archive`, { version: g.version });
    expect(archived.status, JSON.stringify(archived.body)).toBe(200);
    expect(archived.body).toMatchObject({ archived: true, canManage: false });
    expect((await otherCoach.get(`${base}/athletes/${third.membershipId}`)).status).toBe(404);
    expect(((await otherCoach.get(`${base}/groups`)).body as GroupDto[]).map((x) => x.id)).not.toContain(g.id);
    expect(((await admin.get(`${base}/groups?archived=true`)).body as GroupDto[]).map((x) => x.id)).toContain(g.id);
    const again = await admin.patch(`${base}/groups/${g.id}`, { name: 'Revived', version: archived.body.version });
    expect(again.status).toBe(409);
    expect(await audit(g.id)).toEqual(['group.created', 'group.archived']);
  });

  it('a coach adds only athletes they already coach: naming any other id opens nobody to them', async () => {
    const res = await create(coach, { name: uniqueName('Grab'), kind: 'team', athleteIds: [org.otherAthlete.membershipId] });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.athleteIds).toEqual(['must all be athletes you coach; an admin can add others']);
    const g = (await create(coach, { name: uniqueName('Keep'), kind: 'team', athleteIds: [] })).body as GroupDto;
    const add = await put(coach, `${base}/groups/${g.id}/members`, {
      coachIds: [org.coach.membershipId],
      athleteIds: [org.otherAthlete.membershipId],
      version: g.version,
    });
    expect(add.status).toBe(400);
    expect((await coach.get(`${base}/athletes/${org.otherAthlete.membershipId}`)).status).toBe(404);
    // Their own care-team athlete is fine.
    const own = await put(coach, `${base}/groups/${g.id}/members`, {
      coachIds: [org.coach.membershipId],
      athleteIds: [org.athlete.membershipId],
      version: g.version,
    });
    expect(own.status, JSON.stringify(own.body)).toBe(200);
  });

  it('an athlete may be in several groups', async () => {
    const a = await create(admin, { name: uniqueName('Team'), kind: 'team', athleteIds: [org.otherAthlete.membershipId] });
    const b = await create(admin, { name: uniqueName('Position'), kind: 'position', athleteIds: [org.otherAthlete.membershipId] });
    expect([a.status, b.status]).toEqual([201, 201]);
    const holding = ((await admin.get(`${base}/groups`)).body as GroupDto[]).filter((g) =>
      g.athletes.some((x) => x.id === org.otherAthlete.membershipId),
    );
    expect(holding.map((g) => g.id)).toEqual(expect.arrayContaining([a.body.id, b.body.id]));
  });

  it('a coach of another group gets 404 for a group they do not coach, and cannot change it', async () => {
    const g = (await create(coach, { name: uniqueName('Mine'), kind: 'team', athleteIds: [org.athlete.membershipId] })).body as GroupDto;
    expect((await otherCoach.get(`${base}/groups/${g.id}`)).status).toBe(404);
    expect((await otherCoach.patch(`${base}/groups/${g.id}`, { name: 'Taken', version: 1 })).status).toBe(404);
    expect((await put(otherCoach, `${base}/groups/${g.id}/members`, { coachIds: [], athleteIds: [], version: 1 })).status).toBe(404);
    expect(((await otherCoach.get(`${base}/groups`)).body as GroupDto[]).map((x) => x.id)).not.toContain(g.id);
    // A coach of the group keeps its athletes but may not choose its coaches.
    const coaches = await put(coach, `${base}/groups/${g.id}/members`, {
      coachIds: [org.coach.membershipId, org.otherCoach.membershipId],
      athleteIds: [org.athlete.membershipId],
      version: g.version,
    });
    expect(coaches.status).toBe(403);
  });

  it('clinicians read the groups their athletes train in (not others), and change none; athletes and guardians are refused', async () => {
    const g = (await create(coach, { name: uniqueName('Care'), kind: 'team', athleteIds: [org.athlete.membershipId] })).body as GroupDto;
    const read = await clinician.get(`${base}/groups/${g.id}`);
    expect(read.status).toBe(200);
    expect(read.body.canManage).toBe(false);
    expect((await clinician.patch(`${base}/groups/${g.id}`, { name: 'No', version: g.version })).status).toBe(403);
    expect((await otherClinician.get(`${base}/groups/${g.id}`)).status).toBe(404);
    expect((await clinician.post(`${base}/groups`, { name: uniqueName('X'), kind: 'team', athleteIds: [] })).status).toBe(403);
    for (const c of [athlete, guardian]) {
      expect((await c.get(`${base}/groups`)).status).toBe(403);
      expect((await c.get(`${base}/groups/${g.id}`)).status).toBe(403);
      expect((await c.post(`${base}/groups`, { name: uniqueName('Y'), kind: 'team', athleteIds: [] })).status).toBe(403);
    }
  });

  it('bad input is a 400 naming the field', async () => {
    const res = await create(admin, { name: '   ', kind: 'squad', athleteIds: ['not-an-id'], extra: 1 });
    expect(res.status).toBe(400);
    const fields = Object.keys(res.body.error.fields);
    expect(fields).toEqual(expect.arrayContaining(['name', 'kind', 'athleteIds.0']));
    expect(res.body.error.fields.kind[0]).toMatch(/team, position, block/);
    const long = await create(admin, { name: 'x'.repeat(121), kind: 'team', athleteIds: [] });
    expect(long.status).toBe(400);
    expect(long.body.error.fields.name[0]).toMatch(/at most 120/);
    // A member of the organization who is not an athlete, named as an athlete.
    const wrongRole = await create(admin, { name: uniqueName('Role'), kind: 'team', athleteIds: [org.coach.membershipId] });
    expect(wrongRole.status).toBe(400);
    expect(wrongRole.body.error.fields.athleteIds).toEqual(['must all be athletes in this organization']);
    const dup = await create(admin, { name: 'SPRINTERS', kind: 'team', athleteIds: [] });
    expect(dup.status).toBe(409);
  });

  it('a stale version is refused with 409, and nothing changes', async () => {
    const g = (await create(admin, { name: uniqueName('Versioned'), kind: 'team', athleteIds: [] })).body as GroupDto;
    const renamed = await admin.patch(`${base}/groups/${g.id}`, { name: uniqueName('Renamed'), kind: 'block', version: g.version });
    expect(renamed.status, JSON.stringify(renamed.body)).toBe(200);
    expect(renamed.body).toMatchObject({ kind: 'block', version: g.version + 1 });
    const stale = await admin.patch(`${base}/groups/${g.id}`, { name: 'Stale', version: g.version });
    expect(stale.status).toBe(409);
    const staleMembers = await put(admin, `${base}/groups/${g.id}/members`, {
      coachIds: [],
      athleteIds: [org.athlete.membershipId],
      version: g.version,
    });
    expect(staleMembers.status).toBe(409);
    const now = await admin.get(`${base}/groups/${g.id}`);
    expect(now.body).toMatchObject({ name: renamed.body.name, athletes: [] });
    expect(await audit(g.id)).toEqual(['group.created', 'group.updated']);
  });

  it("another organization's ids are refused: its people cannot be named, its groups cannot be opened", async () => {
    const foreign = await create(admin, { name: uniqueName('Cross'), kind: 'team', athleteIds: [orgB.athlete.membershipId] });
    expect(foreign.status).toBe(400);
    expect(foreign.body.error.fields.athleteIds).toBeDefined();
    const foreignCoach = await create(admin, {
      name: uniqueName('Cross'),
      kind: 'team',
      athleteIds: [],
      coachIds: [orgB.coach.membershipId],
    });
    expect(foreignCoach.status).toBe(400);
    const g = (await create(admin, { name: uniqueName('Ours'), kind: 'team', athleteIds: [] })).body as GroupDto;
    // Org B's admin, through org B's path, naming our group: not found.
    expect((await adminB.get(`/api/orgs/${orgB.id}/groups/${g.id}`)).status).toBe(404);
    expect((await adminB.patch(`/api/orgs/${orgB.id}/groups/${g.id}`, { name: 'Mine now', version: 1 })).status).toBe(404);
    // …and through ours: not a member, not found.
    expect((await adminB.get(`${base}/groups/${g.id}`)).status).toBe(404);
  });
});
