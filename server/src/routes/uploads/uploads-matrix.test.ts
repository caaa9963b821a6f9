import { beforeAll, describe, expect, it } from 'vitest';
import type { Role } from '../../../../policies/roles';
import { allows, MATRIX_ROLES, type Outcome, type Relation } from '../../../../policies/access/matrix';
import { CaseDocument, Clip } from '../../entities';
import { signedIn, useHarness, type Client } from '../../test/harness';
import { createOrg, TEST_PASSWORD, type MemberRef, type TestOrg } from '../../test/factories';
import { createCase, createLog } from '../../test/worlds/uploads-fixtures';

/**
 * The access matrix (policies/access/matrix.ts) drives these HTTP checks, so the table and the
 * routes cannot drift apart. Rows are inserted directly: the upload path has its own tests.
 */
const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });
const STATUS: Record<Outcome, number> = { allowed: 200, forbidden: 403, not_found: 404 };
const WHICH = ['athlete', 'otherAthlete'] as const;

const playerOf = (org: TestOrg, role: Role): MemberRef =>
  ({ athlete: org.athlete, coach: org.coach, clinician: org.clinician, guardian: org.guardian, admin: org.admin })[role];

function relationTo(role: Role, which: (typeof WHICH)[number]): Relation {
  if (which === 'otherAthlete' || role === 'admin') return 'other-athlete';
  return role === 'athlete' ? 'self' : 'own-care-team';
}

describe('uploads against the access matrix', () => {
  let org: TestOrg;
  const as = {} as Record<Role, Client>;
  const docs = {} as Record<(typeof WHICH)[number], string>;
  const clips = {} as Record<(typeof WHICH)[number], string>;

  beforeAll(async () => {
    org = await createOrg(h.ds);
    for (const which of WHICH) {
      const athleteId = org[which].membershipId;
      const kase = await createCase(h.ds, org.id, athleteId);
      const log = await createLog(h.ds, org.id, athleteId);
      const common = {
        organizationId: org.id,
        athleteId,
        mediaType: 'application/pdf',
        sizeBytes: '1',
        sha256: '0'.repeat(64),
        uploadedByUserId: org.admin.userId,
        uploadedByName: 'x',
      };
      // No stored file: a reader the matrix allows gets past the checks and fails at storage (5xx is
      // never expected), so the allowed case is judged on the list and the one-clip routes instead.
      docs[which] = (
        await h.ds.getRepository(CaseDocument).save({
          ...common,
          caseId: kase.id,
          title: 'Report',
          documentDate: '2026-11-01',
          issuedBy: 'Clinic',
          storageKey: `${org.id}/documents/${crypto.randomUUID()}`,
        })
      ).id;
      clips[which] = (
        await h.ds.getRepository(Clip).save({
          ...common,
          mediaType: 'video/webm',
          trainingLogId: log.id,
          exercise: 'Back squat',
          caption: null,
          storageKey: `${org.id}/clips/${crypto.randomUUID()}`,
        })
      ).id;
    }
    for (const role of MATRIX_ROLES) as[role] = await signedIn(h.app, playerOf(org, role).email, TEST_PASSWORD);
  });

  it.each(MATRIX_ROLES)('case documents as %s: listed and hidden exactly as the matrix says', async (role) => {
    for (const which of WHICH) {
      const allowed = allows(role, 'CaseDocument', 'read', relationTo(role, which));
      const kase = (await h.ds.getRepository(CaseDocument).findOneByOrFail({ id: docs[which] })).caseId;
      const list = await as[role].get(`/api/orgs/${org.id}/cases/${kase}/documents`);
      // The route admits everyone who reads cases; a reader of the case but not its documents gets 404.
      expect(list.status, `${role} listing ${which}'s documents`).toBe(allowed ? 200 : 404);
      if (allowed) expect(list.body.map((d: { id: string }) => d.id)).toEqual([docs[which]]);
      if (!allowed)
        expect((await as[role].get(`/api/orgs/${org.id}/documents/${docs[which]}/file`)).status, `${role} downloading`).toBe(404);
    }
  });

  it.each(MATRIX_ROLES)(
    'clips as %s: answered as the matrix says (guardians with the setting off); a hidden clip is 404 for every role',
    async (role) => {
      for (const which of WHICH) {
        // The matrix shows guardians with the setting off (never allowed). A clip one may not watch answers
        // 404 as any hidden record, never a 403 that confirms it (ASVS 5.0 V8.2.2): also for a role with
        // no clip rule at all (admins), which the matrix's "refused outright" would make a 403.
        const outcome: Outcome = allows(role, 'Clip', 'read', relationTo(role, which)) ? 'allowed' : 'not_found';
        const one = await as[role].get(`/api/orgs/${org.id}/clips/${clips[which]}`);
        expect(one.status, `${role} reading ${which}'s clip`).toBe(STATUS[outcome]);
        if (outcome !== 'allowed')
          expect((await as[role].get(`/api/orgs/${org.id}/clips/${clips[which]}/video`)).status).toBe(STATUS[outcome]);
      }
    },
  );
});
