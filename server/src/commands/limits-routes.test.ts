import pino from 'pino';
import { describe, expect, it } from 'vitest';
import { defineAbilityFor } from '../../../policies/access';
import type { CoreDeps } from '../core/command';
import { orgCommand } from '../core/command';
import { ROUTE_TABLE } from '../http/route';
import { loadActor } from '../services/actor';
import { useHarness } from '../test/harness';
import { createOrg } from '../test/factories';
import { LimitsNotReported, runOrgCommand } from './run';

/**
 * One path for every change to limits, proven from the route table: every route that can change what an
 * athlete may do runs a command declared as changing limits (marked `!`), and the runner refuses to commit
 * such a command unless it reported through the one path (commands/limits.ts). A new route that changes
 * limits without declaring it shows here as a diff to review.
 */
describe('the one "limits changed" path', () => {
  const h = useHarness();

  it('the routes that change limits are exactly the ones whose commands declare it', () => {
    const rows = ROUTE_TABLE.filter((r) => r.commands.some((c) => c.endsWith('!'))).map(
      (r) => `${r.method.padEnd(6)} ${r.path}  ⇒  ${r.commands.join(', ')}`,
    );
    expect(rows).toMatchInlineSnapshot(`
      [
        "POST   /api/orgs/:orgId/care-team  ⇒  assignCareTeam!",
        "DELETE /api/orgs/:orgId/care-team/:id  ⇒  unassignCareTeam!",
        "POST   /api/orgs/:orgId/cases  ⇒  openCase!",
        "POST   /api/orgs/:orgId/cases/:id/status  ⇒  changeStatus!",
        "POST   /api/orgs/:orgId/cases/:id/close  ⇒  closeCase!",
        "POST   /api/orgs/:orgId/cases/:id/plan  ⇒  createPlan!",
        "PUT    /api/orgs/:orgId/plans/:id  ⇒  revisePlan!",
        "POST   /api/orgs/:orgId/plans/:id/advance  ⇒  advanceStage!",
        "POST   /api/orgs/:orgId/pain-reports  ⇒  reportPain!",
        "PATCH  /api/orgs/:orgId/exercises/:id  ⇒  exercises.edit!",
        "POST   /api/orgs/:orgId/athletes/:id/baselines  ⇒  baselines.record!",
        "PUT    /api/orgs/:orgId/sessions/:id  ⇒  sessions.update!",
        "DELETE /api/orgs/:orgId/sessions/:id  ⇒  sessions.delete!",
        "POST   /api/orgs/:orgId/sessions/:id/unpublish  ⇒  sessions.unpublish!",
        "POST   /api/orgs/:orgId/exceptions/:id/decide  ⇒  exceptions.decide!",
        "PATCH  /api/orgs/:orgId/team-sessions/:id  ⇒  team_sessions.update!",
        "DELETE /api/orgs/:orgId/team-sessions/:id  ⇒  team_sessions.delete!",
        "POST   /api/orgs/:orgId/groups  ⇒  groups.create!",
        "PUT    /api/orgs/:orgId/groups/:id/members  ⇒  groups.set_members!",
        "POST   /api/orgs/:orgId/groups/:id/archive  ⇒  groups.archive!",
      ]
    `);
  });

  it('every write route declares its commands (the registry refuses one that does not)', () => {
    const bare = ROUTE_TABLE.filter((r) => r.method !== 'GET' && r.commands.length === 0).map((r) => `${r.method} ${r.path}`);
    // Four POSTs write nothing: each is a POST only so a secret or a draft travels in the body.
    expect(bare.sort()).toEqual([
      'POST /api/check',
      'POST /api/invitations/preview',
      'POST /api/orgs/:orgId/record-exports/link',
      'POST /api/orgs/:orgId/sessions/:id/check',
    ]);
  });

  it('a command declared as changing limits that reports nothing is rolled back, not committed', async () => {
    const org = await createOrg(h.ds);
    const actor = (await loadActor(h.ds, org.clinician.userId, org.id))!;
    const deps: CoreDeps = { ds: h.ds, config: h.config, logger: pino({ level: 'silent' }), jobs: null, storage: null as never };
    const forgetful = orgCommand({
      name: 'test.forgetful',
      changesLimits: true,
      async run(ctx) {
        await ctx.audit({ action: 'test.forgetful', subjectType: 'Organization', subjectId: org.id });
      },
    });
    const caller = { deps, requestId: 'limits-test', userId: actor.userId, actor, ability: defineAbilityFor(actor) };
    await expect(runOrgCommand(forgetful, caller, undefined)).rejects.toBeInstanceOf(LimitsNotReported);
    const rows = await h.ds.query(`SELECT 1 FROM audit_entries WHERE organization_id = $1 AND action = 'test.forgetful'`, [org.id]);
    expect(rows).toEqual([]);

    const careful = orgCommand({
      name: 'test.careful',
      changesLimits: true,
      async run(ctx) {
        await ctx.audit({ action: 'test.careful', subjectType: 'Organization', subjectId: org.id });
        await ctx.limitsChanged({ athleteIds: [org.athlete.membershipId], reason: 'A test changed nothing real.' });
      },
    });
    await runOrgCommand(careful, caller, undefined);
    const kept = await h.ds.query(`SELECT 1 FROM audit_entries WHERE organization_id = $1 AND action = 'test.careful'`, [org.id]);
    expect(kept).toHaveLength(1);
  });
});
