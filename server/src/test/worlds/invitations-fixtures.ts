import { createHash, randomBytes } from 'node:crypto';
import { expect } from 'vitest';
import { Client, signedIn, type Harness } from '../harness';
import { TEST_PASSWORD, type TestOrg } from '../factories';

/** Shared by the invitation test files. */
export const NEW_PASSWORD = 'a brand new passphrase of mine';

export const uniqueEmail = (tag: string) => `${tag}-${randomBytes(5).toString('hex')}@test.example`;
export const sha256 = (s: string) => createHash('sha256').update(s).digest('hex');
/** A well-formed token that no invitation has. */
export const unknownToken = () => randomBytes(32).toString('base64url');

export interface Created {
  id: string;
  token: string;
  body: Record<string, unknown>;
}

/** Helpers bound to one test file's harness. */
export function invitationHelpers(h: Harness) {
  async function adminOf(org: TestOrg) {
    return signedIn(h.app, org.admin.email, TEST_PASSWORD);
  }

  async function invite(admin: Client, orgId: string, body: Record<string, unknown>): Promise<Created> {
    const res = await admin.post(`/api/orgs/${orgId}/invitations`, body);
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    return { id: res.body.id, token: new URL(res.body.link).hash.slice(1), body: res.body };
  }

  async function accept(body: Record<string, unknown>) {
    const c = await Client.anonymous(h.app);
    const res = await c.post('/api/invitations/accept', body);
    return { c, res };
  }

  async function preview(token: string) {
    return (await Client.anonymous(h.app)).post('/api/invitations/preview', { token });
  }

  async function invitationRow(id: string) {
    const rows: { token_hash: string; accepted_at: Date | null; revoked_at: Date | null; row: string }[] = await h.ds.query(
      'SELECT token_hash, accepted_at, revoked_at, row_to_json(i)::text AS row FROM invitations i WHERE id = $1',
      [id],
    );
    return rows[0];
  }

  async function countUsers(email: string): Promise<number> {
    const rows: { n: number }[] = await h.ds.query('SELECT count(*)::int AS n FROM users WHERE email = $1', [email]);
    return rows[0].n;
  }
  return { adminOf, invite, accept, preview, invitationRow, countUsers };
}
