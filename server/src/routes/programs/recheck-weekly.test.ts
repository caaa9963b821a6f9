import { describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import { weekOf } from '../../../../policies/load/compliance';
import { useHarness } from '../../test/harness';
import { recheckWorld } from '../../test/worlds/recheck-world';
import { addDays, pinClock, put, TODAY } from '../../test/worlds/test-world';
import { humanDate } from '../../../../policies/words/dates';

describe('published sessions are checked again against the weekly hard-set limit', () => {
  const h = useHarness();
  pinClock();
  const world = (pct: number | null) => recheckWorld(h, pct);

  // The pinned day is a Thursday: this week has earlier days.
  it("weekly hard-set limits count this week's earlier published sessions too, as publishing does", async () => {
    const w = await world(null);
    const c = await w.clinician.get(`${w.base}/cases/${w.caseId}`);
    expect(c.status).toBe(200);
    const stages = (maxHard: number) => [
      {
        id: randomUUID(),
        startDate: addDays(TODAY, -30),
        endDate: addDays(TODAY, 120),
        painCeiling: 5,
        patterns: { hinge: { mode: 'capped', caps: { maxHardSetsPerWeek: maxHard } } },
      },
    ];
    const plan = await w.clinician.post(`${w.base}/cases/${w.caseId}/plan`, { stages: stages(10), guidance: '' });
    expect(plan.status).toBe(201);
    const hard = (n: number) => ({
      exercises: [
        {
          id: randomUUID(),
          exerciseId: w.dl,
          sets: Array.from({ length: n }, () => ({ id: randomUUID(), reps: 5, load: { kind: 'kg', value: 60 }, targetRpe: 8 })),
        },
      ],
    });
    const publish = async (date: string, n: number) => {
      const s = await w.coach.post(`${w.base}/programs/${w.program}/sessions`, { date, title: date, content: hard(n) });
      expect((await w.coach.post(`${w.base}/sessions/${s.body.id}/publish`, { version: s.body.version })).status).toBe(200);
      return s.body.id as string;
    };
    await publish(weekOf(TODAY), 3); // earlier this week: 3 hard sets (RPE 8 ≥ 7, common practice)
    const todays = await publish(TODAY, 2);
    // A cap of 4: today's second set is the week's fifth hard set.
    const revised = await put(w.clinician, `${w.base}/plans/${plan.body.id}`, { version: 1, stages: stages(4), guidance: '' });
    expect(revised.status).toBe(200);
    expect(await w.held()).toEqual([todays]);
    const [hold] = await h.ds.query(`SELECT breaches FROM session_holds WHERE session_id = $1`, [todays]);
    expect(hold.breaches.map((b: { rule: string; planned: string }) => [b.rule, b.planned])).toEqual([
      ['hard_sets_per_week', `hard set 5 of the week of ${humanDate(weekOf(TODAY))}`],
    ]);
  });

  it('publishing an earlier session that would push a later published one past the weekly hard-set limit is refused (422) naming the later session', async () => {
    const w = await world(null);
    const stages = [
      {
        id: randomUUID(),
        startDate: addDays(TODAY, -30),
        endDate: addDays(TODAY, 120),
        painCeiling: 5,
        patterns: { hinge: { mode: 'capped', caps: { maxHardSetsPerWeek: 4 } } },
      },
    ];
    expect((await w.clinician.post(`${w.base}/cases/${w.caseId}/plan`, { stages, guidance: '' })).status).toBe(201);
    const hard = (n: number) => ({
      exercises: [
        {
          id: randomUUID(),
          exerciseId: w.dl,
          sets: Array.from({ length: n }, () => ({ id: randomUUID(), reps: 5, load: { kind: 'kg', value: 60 }, targetRpe: 8 })),
        },
      ],
    });
    const draft = async (date: string, n: number) =>
      (await w.coach.post(`${w.base}/programs/${w.program}/sessions`, { date, title: date, content: hard(n) })).body as {
        id: string;
        version: number;
      };
    // Next week: Friday's 3 hard sets fit a limit of 4 on their own.
    const nextMonday = addDays(weekOf(TODAY), 7);
    const friday = await draft(addDays(nextMonday, 4), 3);
    expect((await w.coach.post(`${w.base}/sessions/${friday.id}/publish`, { version: friday.version })).status).toBe(200);
    // Monday's 2 come first in the week, so Friday's third set would become the week's fifth.
    const monday = await draft(nextMonday, 2);
    const refused = await w.coach.post(`${w.base}/sessions/${monday.id}/publish`, { version: monday.version });
    expect(refused.status, JSON.stringify(refused.body)).toBe(422);
    expect(JSON.stringify(refused.body)).toContain(friday.id);
    expect(await w.held()).toEqual([]);
    // One hard set on Monday still fits (3 + 1 = 4).
    const light = await draft(nextMonday, 1);
    expect((await w.coach.post(`${w.base}/sessions/${light.id}/publish`, { version: light.version })).status).toBe(200);
  });

  it('unpublishing an earlier session of the week releases a later one held for the weekly hard-set limit', async () => {
    const w = await world(null);
    const stages = (maxHard: number) => [
      {
        id: randomUUID(),
        startDate: addDays(TODAY, -30),
        endDate: addDays(TODAY, 120),
        painCeiling: 5,
        patterns: { hinge: { mode: 'capped', caps: { maxHardSetsPerWeek: maxHard } } },
      },
    ];
    const plan = await w.clinician.post(`${w.base}/cases/${w.caseId}/plan`, { stages: stages(10), guidance: '' });
    expect(plan.status).toBe(201);
    const hard = (n: number) => ({
      exercises: [
        {
          id: randomUUID(),
          exerciseId: w.dl,
          sets: Array.from({ length: n }, () => ({ id: randomUUID(), reps: 5, load: { kind: 'kg', value: 60 }, targetRpe: 8 })),
        },
      ],
    });
    const nextMonday = addDays(weekOf(TODAY), 7);
    const published = async (date: string, n: number) => {
      const d = (await w.coach.post(`${w.base}/programs/${w.program}/sessions`, { date, title: date, content: hard(n) })).body;
      const p = await w.coach.post(`${w.base}/sessions/${d.id}/publish`, { version: d.version });
      expect(p.status).toBe(200);
      return p.body as { id: string; version: number };
    };
    const monday = await published(nextMonday, 3);
    const friday = await published(addDays(nextMonday, 4), 3);
    expect((await put(w.clinician, `${w.base}/plans/${plan.body.id}`, { version: 1, stages: stages(4), guidance: '' })).status).toBe(200);
    expect(await w.held()).toEqual([friday.id]);
    const back = await w.coach.post(`${w.base}/sessions/${monday.id}/unpublish`, { version: monday.version });
    expect(back.status, JSON.stringify(back.body)).toBe(200);
    expect(await w.held()).toEqual([]);
  });
});
