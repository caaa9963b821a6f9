import { describe, expect, it } from 'vitest';
import { useHarness } from '../../test/harness';
import { addDays, content, type Content, pinClock, programWorld, setIds, TODAY } from '../../test/worlds/test-world';

/** Copying a week and shifting drafts: the calendar tools of the program builder. */

const hingeCap = (pct: number) => ({ hinge: { mode: 'capped', caps: { maxPercent1RM: pct } } });
/** A Monday two weeks ahead, so the sessions below are in the future and inside the plan's stage. */
const MONDAY = (() => {
  const d = addDays(TODAY, 14);
  const dow = (new Date(`${d}T00:00:00Z`).getUTCDay() + 6) % 7;
  return addDays(d, -dow);
})();

describe('the program calendar', () => {
  const h = useHarness();
  pinClock();

  /** The athlete has a tested deadlift of 140 kg and a plan capping the hinge at 60% of 1RM (84 kg) from a month ago to four months ahead. */
  async function world() {
    const w = await programWorld(h);
    await w.baseline(w.athlete, 140);
    await w.plan(w.athlete, hingeCap(60));
    return w;
  }

  it("copy-week copies one week's sessions as drafts a week on, with new exercise and set ids", async () => {
    const w = await world();
    const p = await w.program();
    const dl = w.ex('Deadlift');
    const mon = content(dl, [{ kg: 80 }, { kg: 82.5 }]);
    const s1 = await w.session(p.id, MONDAY, mon, 'Mon');
    expect((await w.publish(s1.id, s1.version)).status).toBe(200);
    await w.session(p.id, addDays(MONDAY, 6), content(dl, [{ kg: 70 }]), 'Sun');
    await w.session(p.id, addDays(MONDAY, 7), content(dl, [{ kg: 60 }]), 'Next Mon'); // outside the week copied
    const res = await w.coach.post(`${w.base}/programs/${p.id}/copy-week`, { fromWeekStart: MONDAY, toWeekStart: addDays(MONDAY, 14) });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.map((x: { title: string; date: string; status: string }) => [x.title, x.date, x.status])).toEqual([
      ['Mon', addDays(MONDAY, 14), 'draft'],
      ['Sun', addDays(MONDAY, 20), 'draft'],
    ]);
    const copy = res.body[0].content as Content;
    expect(copy.exercises[0].exerciseId).toBe(dl);
    expect(copy.exercises[0].sets.map((x) => x.load)).toEqual(mon.exercises[0].sets.map((x) => x.load));
    const oldIds = new Set([mon.exercises[0].id, ...setIds(mon)]);
    const newIds = [copy.exercises[0].id, ...setIds(copy)];
    expect(newIds.filter((id) => oldIds.has(id))).toEqual([]);
    expect(new Set(newIds).size).toBe(newIds.length);
    const all = (await w.coach.get(`${w.base}/programs/${p.id}`)).body.sessions;
    expect(all).toHaveLength(5);
    expect(await w.audit('program.week_copied', p.id)).toEqual([
      { before: null, after: { fromWeekStart: MONDAY, toWeekStart: addDays(MONDAY, 14), sessions: 2 }, athlete_id: null },
    ]);
  });

  it('shift moves the drafts from a date on, never a published session or an earlier draft', async () => {
    const w = await world();
    const p = await w.program();
    const dl = w.ex('Deadlift');
    const early = await w.session(p.id, addDays(MONDAY, -1), content(dl, [{ kg: 60 }]), 'Early draft');
    const pub = await w.session(p.id, MONDAY, content(dl, [{ kg: 60 }]), 'Published');
    expect((await w.publish(pub.id, pub.version)).status).toBe(200);
    const later = await w.session(p.id, addDays(MONDAY, 2), content(dl, [{ kg: 60 }]), 'Later draft');
    const res = await w.coach.post(`${w.base}/programs/${p.id}/shift`, { fromDate: MONDAY, days: 3 });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.moved).toBe(1);
    const byTitle = Object.fromEntries(
      (await w.coach.get(`${w.base}/programs/${p.id}`)).body.sessions.map((x: { title: string; date: string; version: number }) => [
        x.title,
        [x.date, x.version],
      ]),
    );
    expect(byTitle).toEqual({
      'Early draft': [addDays(MONDAY, -1), early.version],
      Published: [MONDAY, pub.version + 1],
      'Later draft': [addDays(MONDAY, 5), later.version + 1],
    });
  });
});
