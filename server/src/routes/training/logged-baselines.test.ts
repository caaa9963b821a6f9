import { randomUUID } from 'node:crypto';
import { afterEach, describe, expect, it } from 'vitest';
import { useHarness, signedIn } from '../../test/harness';
import { createOrg, TEST_PASSWORD } from '../../test/factories';
import { heldSessions, pinClock, unpinClock, zonedWorld } from '../../test/worlds/clock-world';

describe('logged sets feed the strength history', () => {
  const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });
  afterEach(unpinClock);

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

  // Why logging a session is not a "limits changed" command: the engine's 1RM is the latest tested or
  // estimated baseline, so a light logged set cannot lower a % cap and make a published session breach.
  it('a light logged set does not become the 1RM a % cap is measured against: nothing is held', async () => {
    pinClock('2026-06-10T12:00:00Z');
    const w = await zonedWorld(h.ds, h.app, 'UTC');
    const athleteId = w.org.athlete.membershipId;
    const [coach, clinician] = [await w.as(w.org.coach), await w.as(w.org.clinician)];
    const deadlift = ((await coach.get(`${w.base}/exercises`)).body as { id: string; name: string }[]).find((e) => e.name === 'Deadlift')!;
    const tested = await coach.post(`${w.base}/athletes/${athleteId}/baselines`, {
      exerciseId: deadlift.id,
      kind: 'tested',
      loadKg: 140,
      reps: 1,
      testedOn: '2026-06-01',
    });
    expect(tested.status, JSON.stringify(tested.body)).toBe(201);
    const opened = await clinician.post(`${w.base}/cases`, {
      athleteId,
      bodyRegions: ['lower_back'],
      onsetDate: '2026-06-01',
      status: 'limited',
      statusEffectiveFrom: '2026-06-01',
    });
    const stages = [
      {
        id: randomUUID(),
        startDate: '2026-06-01',
        endDate: '2026-07-31',
        patterns: { hinge: { mode: 'capped', caps: { maxPercent1RM: 60 } } },
      },
    ];
    expect((await clinician.post(`${w.base}/cases/${opened.body.id}/plan`, { stages, guidance: '' })).status).toBe(201);
    const program = await coach.post(`${w.base}/programs`, { name: 'Block', athleteIds: [athleteId] });
    const content = {
      exercises: [
        {
          id: randomUUID(),
          exerciseId: deadlift.id,
          sets: [{ id: randomUUID(), reps: 5, load: { kind: 'kg', value: 82.5 }, targetRpe: 6 }],
        },
      ],
    };
    const s = await coach.post(`${w.base}/programs/${program.body.id}/sessions`, { date: '2026-06-12', title: 'Pull', content });
    const published = await coach.post(`${w.base}/sessions/${s.body.id}/publish`, { version: s.body.version });
    expect(published.status, JSON.stringify(published.body)).toBe(200); // 82.5 kg ≤ 60% of 140 kg = 84 kg

    const logged = await (
      await w.as(w.org.athlete)
    ).post(`${w.base}/training-logs`, {
      athleteId,
      date: '2026-06-10',
      durationMinutes: 30,
      sessionRpe: 4,
      painBefore: 0,
      painDuring: 1,
      sets: [{ exercise: 'Deadlift', loadKg: 60, reps: 5 }], // Epley 70 kg: 60% of it would be 42 kg
    });
    expect(logged.status, JSON.stringify(logged.body)).toBe(201);
    expect(await heldSessions(h.ds, athleteId)).toEqual([]);
    // The engine, asked again, still measures the cap against the tested 140 kg.
    const check = await coach.post(`${w.base}/sessions/${s.body.id}/check`);
    expect(check.status, JSON.stringify(check.body)).toBe(200);
    expect(check.body.results).toEqual([{ athleteId, breaches: [] }]);
  });
});
