import { describe, expect, it } from 'vitest';
import { createStorage } from '../storage';
import { signedIn, useHarness } from '../test/harness';
import { DEMO_PASSWORD, loadDemo } from './demo';

describe('the demo scenario', () => {
  const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });

  it("loads once, with a referral note on Sam's case that his clinician can download and his coach cannot see", async () => {
    const storage = createStorage(h.config);
    const first = await loadDemo(h.ds, 4, storage);
    expect(first.created).toBe(true);
    const again = await loadDemo(h.ds, 4, storage);
    expect(again).toEqual({ created: false, organizationId: first.organizationId });

    const base = `/api/orgs/${first.organizationId}`;
    const marcus = await signedIn(h.app, 'marcus.bell@harborpoint.example', DEMO_PASSWORD);
    const cases = await marcus.get(`${base}/cases?state=open`);
    const samCase = cases.body.find((c: { athleteName: string }) => c.athleteName === 'Sam Whitfield');
    const docs = await marcus.get(`${base}/cases/${samCase.id}/documents`);
    expect(docs.status).toBe(200);
    expect(docs.body).toHaveLength(1);
    expect(docs.body[0]).toMatchObject({ title: 'Referral note (demo)', mediaType: 'application/pdf' });
    const file = await marcus.get(docs.body[0].downloadPath).buffer(true);
    expect(file.status).toBe(200);
    expect(Buffer.from(file.body).subarray(0, 5).toString('latin1')).toBe('%PDF-');

    const rosa = await signedIn(h.app, 'rosa.delgado@harborpoint.example', DEMO_PASSWORD);
    expect((await rosa.get(docs.body[0].downloadPath)).status).toBe(404);
  });
});
