import { describe, expect, it } from 'vitest';
import { useHarness, signedIn } from '../../test/harness';
import { createOrg, TEST_PASSWORD } from '../../test/factories';

describe('GET /api/orgs/:orgId/deliveries', () => {
  const h = useHarness();
  it("shows the admin the organization's e-mails with a failure's reason, and nothing of another organization", async () => {
    const a = await createOrg(h.ds);
    const b = await createOrg(h.ds);
    await h.ds.query(
      `INSERT INTO email_deliveries (organization_id, kind, to_address, subject, status, attempts, last_error) VALUES
        ($1, 'invitation', 'x@test.example', 'Invited', 'failed', 6, 'connect ECONNREFUSED 127.0.0.1:1'),
        ($2, 'invitation', 'y@test.example', 'Other org', 'sent', 1, NULL)`,
      [a.id, b.id],
    );
    const admin = await signedIn(h.app, a.admin.email, TEST_PASSWORD);
    const res = await admin.get(`/api/orgs/${a.id}/deliveries`);
    expect(res.status).toBe(200);
    expect(res.body).toHaveLength(1);
    expect(res.body[0]).toMatchObject({
      to: 'x@test.example',
      status: 'failed',
      attempts: 6,
      lastError: 'connect ECONNREFUSED 127.0.0.1:1',
    });
    const coach = await signedIn(h.app, a.coach.email, TEST_PASSWORD);
    expect((await coach.get(`/api/orgs/${a.id}/deliveries`)).status).toBe(403);
    expect((await admin.get(`/api/orgs/${b.id}/deliveries`)).status).toBe(404);
  });
});
