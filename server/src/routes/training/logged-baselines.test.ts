import { describe, expect, it } from 'vitest';
import { useHarness, signedIn } from '../../test/harness';
import { createOrg, TEST_PASSWORD } from '../../test/factories';

describe('logged sets feed the strength history', () => {
  const h = useHarness();
  it('a logged set of a library exercise becomes a logged baseline (Epley, from memory: 100 kg × 5 → 116.67)', async () => {
    const org = await createOrg(h.ds);
    const base = `/api/orgs/${org.id}`;
    const me = await signedIn(h.app, org.athlete.email, TEST_PASSWORD);
    const logged = await me.post(`${base}/training-logs`, {
      athleteId: org.athlete.membershipId,
      date: '2026-11-30',
      durationMinutes: 45,
      sessionRpe: 5,
      painBefore: 1,
      painDuring: 2,
      sets: [
        { exercise: 'back squat', loadKg: 100, reps: 5 },
        { exercise: 'Something not in the library', loadKg: 50, reps: 5 },
      ],
    });
    expect(logged.status).toBe(201);
    const coach = await signedIn(h.app, org.coach.email, TEST_PASSWORD);
    const history = await coach.get(`${base}/athletes/${org.athlete.membershipId}/baselines`);
    expect(history.body).toHaveLength(1);
    expect(history.body[0]).toMatchObject({ kind: 'logged', exerciseName: 'Back squat', e1rmKg: 116.67 });
  });
});
