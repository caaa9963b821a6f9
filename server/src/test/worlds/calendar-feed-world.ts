import ICAL from 'ical.js';
import request from 'supertest';
import { expect } from 'vitest';
import type { Harness } from '../harness';
import { addDays, content, programWorld, TODAY } from './test-world';

/**
 * What the calendar feed tests share: a world with a diagnosis, notes, a plan and published sessions,
 * and a reader of the feed written with a separate parser (ical.js), as a calendar would read it.
 */

export const DIAGNOSIS = 'Canary spondylolysis L5';
export const NOTES = 'Canary clinical note about the scan';

export interface Entry {
  uid: string;
  summary: string;
  description: string;
  start: string;
  end: string;
  startIsDate: boolean;
  dtstamp: string;
  sequence: number;
  status: string;
}

export function parse(text: string): { name: string; entries: Entry[] } {
  const cal = new ICAL.Component(ICAL.parse(text));
  const entries = cal.getAllSubcomponents('vevent').map((v) => {
    const start = v.getFirstPropertyValue('dtstart') as ICAL.Time;
    const end = v.getFirstPropertyValue('dtend') as ICAL.Time;
    const stamp = v.getFirstPropertyValue('dtstamp') as ICAL.Time;
    return {
      uid: String(v.getFirstPropertyValue('uid')),
      summary: String(v.getFirstPropertyValue('summary')),
      description: String(v.getFirstPropertyValue('description')),
      start: start.toString(),
      end: end.toString(),
      startIsDate: start.isDate,
      dtstamp: stamp.toString(),
      sequence: Number(v.getFirstPropertyValue('sequence')),
      status: String(v.getFirstPropertyValue('status')),
    };
  });
  return { name: String(cal.getFirstPropertyValue('x-wr-calname')), entries };
}

export const pathOf = (url: string) => new URL(url).pathname;

/** A case with a diagnosis and notes; a plan capping the hinge and blocking jumps; two published sessions and a draft. */
export async function feedWorld(h: Harness) {
  const w = await programWorld(h);
  await w.baseline(w.athlete, 140);
  const c = await w.clinician.post(`${w.base}/cases`, {
    athleteId: w.athlete,
    bodyRegions: ['lower_back'],
    onsetDate: addDays(TODAY, -30),
    status: 'limited',
    statusEffectiveFrom: addDays(TODAY, -30),
    diagnosis: DIAGNOSIS,
    clinicalNotes: NOTES,
  });
  expect(c.status, JSON.stringify(c.body)).toBe(201);
  const stages = [
    {
      id: crypto.randomUUID(),
      label: 'Settle',
      startDate: addDays(TODAY, -30),
      endDate: addDays(TODAY, 9),
      painCeiling: 3,
      patterns: { hinge: { mode: 'capped', caps: { maxPercent1RM: 60 } }, jump: { mode: 'blocked' } },
    },
    { id: crypto.randomUUID(), label: 'Build', startDate: addDays(TODAY, 10), endDate: addDays(TODAY, 40), painCeiling: 4, patterns: {} },
  ];
  const plan = await w.clinician.post(`${w.base}/cases/${c.body.id}/plan`, { stages, guidance: NOTES });
  expect(plan.status, JSON.stringify(plan.body)).toBe(201);
  const p = await w.program();
  const dl = w.ex('Deadlift');
  const s1 = await w.session(p.id, addDays(TODAY, 1), content(dl, [{ kg: 80 }]), 'Lower body A');
  expect((await w.publish(s1.id, s1.version)).status).toBe(200);
  const s2 = await w.session(p.id, addDays(TODAY, 12), content(dl, [{ kg: 80 }]), 'Lower body B');
  expect((await w.publish(s2.id, s2.version)).status).toBe(200);
  await w.session(p.id, addDays(TODAY, 2), content(dl, [{ kg: 60 }]), 'Draft only');
  const athlete = await w.as(w.org.athlete);
  return { ...w, athleteClient: athlete, s1, s2, stages };
}

export const fetchFeed = (h: Harness, url: string) => request(h.app).get(pathOf(url));
