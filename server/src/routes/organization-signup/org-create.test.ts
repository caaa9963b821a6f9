import { describe, expect, it } from 'vitest';
import pino from 'pino';
import { OrganizationCreateSchema } from '../../../../policies/schemas';
import { Client, signedIn, useHarness } from '../../test/harness';
import { runPublicCommand } from '../../commands/run';
import { createOrganizationByOperator } from '../../commands/organizations';
import { createStorage } from '../../storage';
import { GENESIS_HASH, verifyChain } from '../../services/audit';
import { uniqueEmail } from '../../test/worlds/account-security-fixtures';

/** `npm run org:create` (scripts/org-create.ts) runs this command: an organization and its admin's one-time invitation. */
describe('an operator creates an organization', () => {
  const h = useHarness({ SIGNIN_MAX_PER_IP: '1000', PUBLIC_URL: 'https://loadline.example.org' });
  const create = (args: Record<string, unknown>) =>
    runPublicCommand(
      createOrganizationByOperator,
      {
        deps: { ds: h.ds, config: h.config, logger: pino({ level: 'silent' }), jobs: null, storage: createStorage(h.config) },
        requestId: 'org:create',
        userId: null,
      },
      OrganizationCreateSchema.parse(args),
    );

  it('prints a one-time link that makes the invited person its admin; the organization’s chain starts with its creation', async () => {
    const email = uniqueEmail('operator-admin');
    const made = await create({ name: 'Harbour Athletics', adminEmail: email, country: 'gb', timeZone: 'Europe/London' });
    expect(made.link).toMatch(/^https:\/\/loadline\.example\.org\/invite#[A-Za-z0-9_-]{43}$/);
    const [org] = await h.ds.query(`SELECT name, country, time_zone, emergency_number FROM organizations WHERE id = $1`, [
      made.organizationId,
    ]);
    expect(org).toEqual({ name: 'Harbour Athletics', country: 'GB', time_zone: 'Europe/London', emergency_number: '999' });

    const token = made.link.split('#')[1];
    const c = await Client.anonymous(h.app);
    const preview = await c.post('/api/invitations/preview', { token });
    expect(preview.status, JSON.stringify(preview.body)).toBe(200);
    const accepted = await c.post('/api/invitations/accept', { token, displayName: 'Owen Price', password: 'harbour lights at dusk' });
    expect(accepted.status, JSON.stringify(accepted.body)).toBe(200);
    const admin = await signedIn(h.app, email, 'harbour lights at dusk');
    expect((await admin.get('/api/session')).body.memberships).toEqual([
      expect.objectContaining({ organizationId: made.organizationId, roles: ['admin'] }),
    ]);
    // Once only.
    const again = await (
      await Client.anonymous(h.app)
    ).post('/api/invitations/accept', { token, displayName: 'X', password: 'another long passphrase' });
    expect(again.status).toBe(404);

    const chain: { action: string; prev_hash: string; actor_user_id: string | null; after: Record<string, unknown> }[] = await h.ds.query(
      `SELECT action, prev_hash, actor_user_id, after FROM audit_entries WHERE organization_id = $1 ORDER BY id`,
      [made.organizationId],
    );
    expect(chain.slice(0, 2).map((e) => [e.action, e.actor_user_id])).toEqual([
      ['organization.created', null],
      ['invitation.created', null],
    ]);
    expect(chain[0].prev_hash).toBe(GENESIS_HASH);
    expect(chain[0].after).toMatchObject({ via: 'operator' });
    expect(chain.map((e) => e.action)).toContain('invitation.accepted');
    expect(await h.ds.transaction((m) => verifyChain(m, made.organizationId))).toMatchObject({ intact: true });
  });

  it('refuses bad arguments before touching the database, naming each', () => {
    const r = OrganizationCreateSchema.safeParse({ name: '', adminEmail: 'nope', country: 'ZZ', timeZone: 'Nowhere/Town' });
    expect(r.success).toBe(false);
    expect(r.error!.issues.map((i) => i.path[0]).sort()).toEqual(['adminEmail', 'country', 'name', 'timeZone']);
    expect(OrganizationCreateSchema.parse({ name: 'A', adminEmail: 'a@example.org' }).timeZone).toBe('UTC');
  });
});
