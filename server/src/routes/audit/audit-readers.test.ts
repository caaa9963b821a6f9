import { beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import type { Role } from '../../../../policies/roles';
import { allows, expectedOutcome, MATRIX_ROLES, roleMay, type Relation } from '../../../../policies/access/matrix';
import type { AuditEntryDto } from '../../../../policies/dto';
import { signedIn, useHarness, type Client } from '../../test/harness';
import { createOrg, TEST_PASSWORD, type TestOrg } from '../../test/factories';
import { auditProbes, newRequestId, playerOf } from '../../test/worlds/audit-fixtures';

const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });
const { entriesFor, orgEntryIds, append } = auditProbes(h);

describe('who may read the audit trail, as the matrix says', () => {
  let org: TestOrg;
  let as: Record<Role, Client>;
  /** Three marker entries: about the linked athlete, about the other athlete, about no athlete. */
  const markers = {} as Record<'linked' | 'other' | 'none', string>;

  beforeAll(async () => {
    org = await createOrg(h.ds);
    as = {} as Record<Role, Client>;
    for (const role of MATRIX_ROLES) as[role] = await signedIn(h.app, playerOf(org, role).email, TEST_PASSWORD);
    const targets = { linked: org.athlete.membershipId, other: org.otherAthlete.membershipId, none: null };
    for (const [key, athleteId] of Object.entries(targets) as [keyof typeof markers, string | null][]) {
      const requestId = newRequestId();
      await append(org.id, { action: `test.marker_${key}`, athleteId, requestId });
      markers[key] = String((await entriesFor(requestId))[0].id);
    }
  });

  /** How each marker entry stands to the person playing `role`. */
  const relationOf = (role: Role, key: keyof typeof markers): Relation =>
    key === 'none' ? 'same-org' : key === 'other' || role === 'admin' ? 'other-athlete' : role === 'athlete' ? 'self' : 'own-care-team';

  it.each(MATRIX_ROLES)('GET /audit as %s lists exactly the entries the matrix lets them read, or refuses (403)', async (role) => {
    const res = await as[role].get(`/api/orgs/${org.id}/audit?limit=500`);
    if (!roleMay(role, 'AuditEntry', 'read')) {
      expect(res.status).toBe(403);
      expect(res.body.error.message).toBe(
        'Your role does not allow you to see the audit trail. Ask an admin of your organization if you need this.',
      );
      return;
    }
    expect(res.status).toBe(200);
    const ids = (res.body.entries as AuditEntryDto[]).map((e) => e.id);
    const keys = Object.keys(markers) as (keyof typeof markers)[];
    const expected = keys.filter((k) => allows(role, 'AuditEntry', 'read', relationOf(role, k)));
    expect(keys.filter((k) => ids.includes(markers[k]))).toEqual(expected);
    // A reader without the whole trail sees only entries about athletes they may follow.
    if (!allows(role, 'AuditEntry', 'read', 'same-org')) expect(ids).toEqual(expected.map((k) => markers[k]));
  });

  it.each(MATRIX_ROLES)('GET /audit/verify and /audit/export as %s answer as the matrix says', async (role) => {
    const verify = await as[role].get(`/api/orgs/${org.id}/audit/verify`);
    const outcome = expectedOutcome(role, 'AuditChain', 'read', 'same-org');
    expect(verify.status).toBe(outcome === 'allowed' ? 200 : 403);
    if (outcome === 'allowed') expect(verify.body).toMatchObject({ organizationId: org.id, intact: true });

    const csv = await as[role].get(`/api/orgs/${org.id}/audit/export?action=test.marker_`);
    if (!roleMay(role, 'AuditEntry', 'read')) {
      expect(csv.status).toBe(403);
      return;
    }
    expect(csv.status).toBe(200);
    expect(csv.headers['content-disposition']).toMatch(/^attachment;/);
    const keys = (Object.keys(markers) as (keyof typeof markers)[]).filter((k) => csv.text.includes(`test.marker_${k}`));
    expect(keys).toEqual(
      (Object.keys(markers) as (keyof typeof markers)[]).filter((k) => allows(role, 'AuditEntry', 'read', relationOf(role, k))),
    );
  });

  it('an admin of another organization gets 404 on list, export and verify; signed out gets 401', async () => {
    const orgB = await createOrg(h.ds);
    const adminB = await signedIn(h.app, orgB.admin.email, TEST_PASSWORD);
    for (const path of [`/api/orgs/${org.id}/audit`, `/api/orgs/${org.id}/audit/export`, `/api/orgs/${org.id}/audit/verify`]) {
      const res = await adminB.get(path);
      expect(res.status, path).toBe(404);
      expect(res.body.error.code).toBe('not_found');
      expect((await request(h.app).get(path)).status).toBe(401);
    }
    // Their own trail holds none of this organization's entries.
    const theirs = (await adminB.get(`/api/orgs/${orgB.id}/audit?limit=500`)).body.entries as AuditEntryDto[];
    expect(theirs.map((e) => e.id)).toEqual(await orgEntryIds(orgB.id));
    expect(theirs.map((e) => e.id)).not.toContain(markers.none);
  });
});
