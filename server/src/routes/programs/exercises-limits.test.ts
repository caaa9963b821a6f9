import { describe, expect, it } from 'vitest';
import { useHarness } from '../../test/harness';
import { addDays, content, pinClock, programWorld, TODAY } from '../../test/worlds/test-world';
import { humanDate } from '../../../../policies/words/dates';

/**
 * An exercise's movement patterns and impact flag decide which limits its sets count toward. Editing
 * them re-checks every published session using the exercise (the one "limits changed" path, as a
 * plan change does); archiving or restoring it changes nothing about them.
 */

/** Squats blocked; hinge work allowed but without impact. */
const PLAN = { squat: { mode: 'blocked' }, hinge: { mode: 'capped', caps: { impactAllowed: false } } };
const DATE = addDays(TODAY, 7);

describe('library edits and the limits of the athletes whose sessions use the exercise', () => {
  const h = useHarness();
  pinClock();

  async function world() {
    const w = await programWorld(h);
    await w.plan(w.athlete, PLAN);
    const patch = async (id: string, changes: object) => {
      const version = ((await w.coach.get(`${w.base}/exercises`)).body as { id: string; version: number }[]).find(
        (e) => e.id === id,
      )!.version;
      const res = await w.coach.patch(`${w.base}/exercises/${id}`, { ...changes, version });
      expect(res.status, JSON.stringify(res.body)).toBe(200);
      return res.body as { id: string; patterns: string[]; ballistic: boolean; archived: boolean; version: number };
    };
    return { ...w, patch };
  }

  it('archiving or restoring an exercise keeps its patterns, so its sets stay blocked (archive used to write patterns: [])', async () => {
    const w = await world();
    const squat = w.lib.find((e) => e.name === 'Back squat')!;
    expect(squat.patterns).toEqual(['squat']);
    const archived = await w.patch(squat.id, { archived: true });
    expect(archived).toMatchObject({ archived: true, patterns: ['squat'], version: squat.version + 1 });
    const [entry] = await w.audit('exercise.updated', squat.id);
    expect(entry).toMatchObject({ before: { archived: false }, after: { archived: true } });
    // An old session still naming the archived exercise is checked with its patterns: squats are blocked.
    const p = await w.program();
    const s = await w.session(p.id, DATE, content(squat.id, [{ kg: 60 }]));
    const refused = await w.publish(s.id, s.version);
    expect(refused.status).toBe(422);
    expect(refused.body.error.details.breaches[0].breaches.map((b: { rule: string; pattern: string }) => [b.rule, b.pattern])).toEqual([
      ['blocked', 'squat'],
    ]);
    const restored = await w.patch(squat.id, { archived: false });
    expect(restored).toMatchObject({ archived: false, patterns: ['squat'] });
    const inLibrary = ((await w.coach.get(`${w.base}/exercises`)).body as { id: string; patterns: string[] }[]).find(
      (e) => e.id === squat.id,
    );
    expect(inLibrary!.patterns).toEqual(['squat']);
    // Archiving changed no limit: nobody was told anything.
    expect(await w.notices()).toEqual([]);
  });

  it('a change of patterns into a blocked one holds the published sessions using it and tells the coach; changing it back releases them', async () => {
    const w = await world();
    const created = await w.coach.post(`${w.base}/exercises`, {
      name: 'Sled drag',
      patterns: ['carry'],
      equipment: 'sled',
      ballistic: false,
      steps: { kind: 'increment', step: 5, unit: 'kg' },
    });
    expect(created.status).toBe(201);
    const sled = created.body.id as string;
    const p = await w.program();
    const published = await w.session(p.id, DATE, content(sled, [{ kg: 40 }]), 'Sled day');
    expect((await w.publish(published.id, published.version)).status).toBe(200);
    const past = await w.session(p.id, addDays(TODAY, -7), content(sled, [{ kg: 40 }]), 'Last week');
    expect((await w.publish(past.id, past.version)).status).toBe(200);
    await w.session(p.id, addDays(DATE, 1), content(sled, [{ kg: 40 }]), 'Draft');
    expect(await w.held()).toEqual([]);

    await w.patch(sled, { patterns: ['carry', 'squat'] });
    // From today on only: last week's session and the draft are not held.
    expect(await w.held()).toEqual([published.id]);
    const notices = await w.notices();
    expect(notices).toEqual([
      {
        recipient_id: w.org.coach.membershipId,
        athlete_id: w.athlete,
        severity: 'urgent',
        title: `${w.org.athlete.name}: 1 session on hold`,
        body: `The exercise Sled drag changed in the library (movement patterns). These published sessions now go past a limit and are on hold until you update them: ${w.org.athlete.name}: ${humanDate(DATE)}.`,
      },
    ]);
    const [hold] = await h.ds.query(`SELECT breaches FROM session_holds WHERE session_id = $1`, [published.id]);
    expect(hold.breaches.map((b: { rule: string; pattern: string }) => [b.rule, b.pattern])).toEqual([['blocked', 'squat']]);

    // A rename changes no limit: still held, nobody told again.
    await w.patch(sled, { name: 'Heavy sled drag' });
    expect(await w.held()).toEqual([published.id]);
    expect(await w.notices()).toHaveLength(1);

    await w.patch(sled, { patterns: ['carry'] });
    expect(await w.held()).toEqual([]);
    expect(await w.notices()).toHaveLength(1);
  });

  it('marking an exercise as impact work holds its sessions where impact is off; unmarking releases them', async () => {
    const w = await world();
    const rdl = w.lib.find((e) => e.name === 'Romanian deadlift')!;
    const p = await w.program();
    const s = await w.session(p.id, DATE, content(rdl.id, [{ kg: 40 }]));
    expect((await w.publish(s.id, s.version)).status).toBe(200);
    await w.patch(rdl.id, { ballistic: true });
    expect(await w.held()).toEqual([s.id]);
    const [n] = await w.notices();
    expect(n.body).toMatch(/^The exercise Romanian deadlift changed in the library \(impact\)\. /);
    await w.patch(rdl.id, { ballistic: false });
    expect(await w.held()).toEqual([]);
  });

  it('an athlete with no session using the exercise is not touched, and the same patterns sent again change nothing', async () => {
    const w = await world();
    const squat = w.lib.find((e) => e.name === 'Back squat')!;
    const p = await w.program();
    const s = await w.session(p.id, DATE, content(w.ex('Deadlift'), [{ kg: 40 }]));
    expect((await w.publish(s.id, s.version)).status).toBe(200);
    await w.patch(squat.id, { patterns: ['squat'] });
    await w.patch(squat.id, { patterns: ['squat', 'lunge'] });
    expect(await w.held()).toEqual([]);
    expect(await w.notices()).toEqual([]);
  });
});
