import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { jargonIn } from '../../../policies/plain-words';
import { User, CareTeamAssignment } from '../entities';
import { setNoticeQueue } from '../jobs/queue';
import { deliveriesWhere, mailTo, waitFor } from '../mail/mail-fixtures';
import { pinClock, unpinClock } from '../test/worlds/clock-world';
import { reportBody } from '../test/worlds/report-world';
import { put } from '../test/worlds/plan-world';
import { signedIn, useHarness, type Client } from '../test/harness';
import { createMember, createOrg, TEST_PASSWORD, type MemberRef, type TestOrg } from '../test/factories';

/**
 * Everyone hears every change: a status change and a new plan version reach the athlete, their coaches and a
 * minor's guardians — in the app and by e-mail through the real queue and the fake SMTP server — each in
 * their own words; each person's e-mail choice is respected, and emergencies always go.
 */
const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' }, { mail: true });

const TODAY = '2026-06-10';
let org: TestOrg;
let base: string;
let clin: Client;
let guardian: Client;
let adult: MemberRef;

interface NoticeRow {
  recipient_id: string;
  kind: string;
  severity: string;
  title: string;
  body: string;
}
const noticesAbout = (athleteId: string, kind: string): Promise<NoticeRow[]> =>
  h.ds.query(
    `SELECT recipient_id, kind, severity, title, body FROM notifications WHERE athlete_id = $1 AND kind = $2 ORDER BY created_at`,
    [athleteId, kind],
  );
const textOf = (n: NoticeRow) => `${n.title}\n${n.body}`;

/** Hinge blocked, squat capped at 40 kg and RPE 6, rotation capped at two sets: from yesterday for three weeks. */
const stages = () => [
  {
    id: randomUUID(),
    label: 'Protect',
    startDate: '2026-06-09',
    endDate: '2026-06-30',
    painCeiling: 3,
    patterns: {
      hinge: { mode: 'blocked' },
      squat: { mode: 'capped', caps: { maxLoadKg: 40, maxRpe: 6 } },
      rotation: { mode: 'capped', caps: { maxSetsPerSession: 2 } },
    },
  },
];

async function openCase(athleteId: string, status = 'limited'): Promise<{ id: string; version: number }> {
  const res = await clin.post(`${base}/cases`, {
    athleteId,
    bodyRegions: ['lower_back'],
    onsetDate: '2026-06-01',
    diagnosis: 'Lumbar strain',
    status,
    statusEffectiveFrom: TODAY,
    statusNote: 'Easy days for now',
  });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body;
}

beforeAll(async () => {
  pinClock(`${TODAY}T12:00:00Z`);
  setNoticeQueue(h.jobs!);
  org = await createOrg(h.ds);
  base = `/api/orgs/${org.id}`;
  // The family reads pounds; the coach and the athlete read kilograms.
  await h.ds.getRepository(User).update({ id: org.guardian.userId }, { unitPref: 'lb' });
  adult = await createMember(h.ds, org.id, ['athlete'], { dateOfBirth: '1990-01-01' });
  await h.ds.getRepository(CareTeamAssignment).save([
    { organizationId: org.id, athleteId: adult.membershipId, memberId: org.coach.membershipId, role: 'coach' },
    { organizationId: org.id, athleteId: adult.membershipId, memberId: org.clinician.membershipId, role: 'clinician' },
  ]);
  clin = await signedIn(h.app, org.clinician.email, TEST_PASSWORD);
  guardian = await signedIn(h.app, org.guardian.email, TEST_PASSWORD);
});
afterAll(() => {
  setNoticeQueue(null);
  unpinClock();
});

describe('a status change and a new plan version, each audience in its own words', () => {
  let caseRef: { id: string; version: number };
  beforeAll(async () => {
    caseRef = await openCase(org.athlete.membershipId);
    const plan = await clin.post(`${base}/cases/${caseRef.id}/plan`, { stages: stages(), guidance: 'Walk every day.' });
    expect(plan.status, JSON.stringify(plan.body)).toBe(201);
  });

  it('the status change reaches the athlete, the coach and the guardian — not the clinician who made it, nor anyone else', async () => {
    const rows = await noticesAbout(org.athlete.membershipId, 'status_changed');
    expect(rows.map((r) => r.recipient_id).sort()).toEqual(
      [org.athlete.membershipId, org.coach.membershipId, org.guardian.membershipId].sort(),
    );
  });

  it('the plan version: the coach reads the trade (Hinge, RPE, kg), the athlete "you", the guardian plain words in pounds', async () => {
    const rows = await noticesAbout(org.athlete.membershipId, 'plan_changed');
    const by = (id: string) => textOf(rows.find((r) => r.recipient_id === id)!);
    const coach = by(org.coach.membershipId);
    expect(coach).toContain('Hinge: not allowed for now');
    expect(coach).toContain('effort RPE 6 or easier');
    expect(coach).toContain('no more than 40 kg');
    expect(coach).toContain('Rotation / anti-rotation: at most 2 sets a session');
    expect(coach).toContain('Stage 1 (Protect), 9 June 2026 to 30 June 2026:');

    const athlete = by(org.athlete.membershipId);
    expect(athlete).toMatch(/^Your training limits have been set\nYour clinician set out what you may do in training\./);
    expect(athlete).toContain('nothing heavier than 40 kg');
    expect(athlete).toContain("Your clinician's advice: Walk every day.");

    const family = by(org.guardian.membershipId);
    expect(family).toContain(`${org.athlete.name}'s training limits have been set`);
    expect(family).toContain('No lifting heavy things from the floor or bending forward with weight.');
    // Common practice: effort as what is left in reserve — RPE 6 = 4 in reserve (Zourdos et al. 2016); 40 kg = 88.18 lb (NIST SP 811), rounded down to a load on the bar (5-lb steps, common practice): 85 lb.
    expect(family).toContain('keep it at a comfortable effort, able to do 4 more');
    expect(family).toContain('nothing heavier than 85 lb');
    expect(family).toContain('From 9 June 2026 to 30 June 2026:');
  });

  it('a revised plan (version 2) is told too: the coach with its version and change note, the family that the limits changed', async () => {
    const plan = (await clin.get(`${base}/cases/${caseRef.id}`)).body.planId as string;
    const next = stages();
    next[0].patterns.hinge = { mode: 'capped', caps: { maxPercent1RM: 50 } } as never;
    const res = await put(clin, `${base}/plans/${plan}`, {
      stages: next,
      guidance: 'Walk every day.',
      changeNote: 'Hinge back in, light',
      version: 1,
    });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const rows = (await noticesAbout(org.athlete.membershipId, 'plan_changed')).slice(-3);
    const by = (id: string) => textOf(rows.find((r) => r.recipient_id === id)!);
    expect(by(org.coach.membershipId)).toContain('restriction plan version 2');
    expect(by(org.coach.membershipId)).toContain('Change note: Hinge back in, light');
    expect(by(org.coach.membershipId)).toContain('Hinge: up to 50% of estimated 1RM');
    const family = by(org.guardian.membershipId);
    expect(family).toContain(`${org.athlete.name}'s training limits have changed`);
    expect(family).toContain(
      'Lifting things from the floor or bending forward at the hips: weights no heavier than half of the most that can be lifted once.',
    );
    expect(jargonIn(family)).toEqual([]);
  });

  it('common practice: no family or athlete notice holds the trade’s jargon (hinge, RPE, 1RM, rotation, sets, reps, %)', async () => {
    const rows = [
      ...(await noticesAbout(org.athlete.membershipId, 'status_changed')),
      ...(await noticesAbout(org.athlete.membershipId, 'plan_changed')),
    ].filter((r) => r.recipient_id !== org.coach.membershipId);
    expect(rows).toHaveLength(6);
    for (const r of rows) expect(jargonIn(textOf(r)), textOf(r)).toEqual([]);
  });

  it('a clinician’s status change: Full, in plain words to the family, and by e-mail to all three', async () => {
    const res = await clin.post(`${base}/cases/${caseRef.id}/status`, { status: 'full', effectiveFrom: TODAY, version: caseRef.version });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const rows = await noticesAbout(org.athlete.membershipId, 'status_changed');
    const family = rows.filter((r) => r.recipient_id === org.guardian.membershipId).pop()!;
    expect(family.title).toBe(`${org.athlete.name}'s training status: Full from 10 June 2026`);
    expect(family.body).toBe(`From 10 June 2026, ${org.athlete.name} is back to full training, with no limits.`);
    const coach = rows.filter((r) => r.recipient_id === org.coach.membershipId).pop()!;
    expect(coach.body).toContain(`The clinician set ${org.athlete.name}'s participation status to Full from 10 June 2026.`);

    const three = [org.athlete.email, org.coach.email, org.guardian.email];
    const mail = await waitFor('the Full e-mails', async () => {
      const m = (await mailTo(h.ds, three)).filter((x) => x.subject?.includes('Full from 10 June 2026'));
      return m.length === 3 ? m : null;
    });
    const familyMail = mail.find((m) => m.envelope_to.includes(org.guardian.email))!;
    expect(familyMail.text_body).toContain('is back to full training, with no limits.');
    expect(jargonIn(`${familyMail.subject}\n${familyMail.text_body}`)).toEqual([]);
  });

  it('the plan e-mail to the family keeps one limit per paragraph, in plain words', async () => {
    const mail = await waitFor('the plan e-mail to the guardian', async () => {
      const m = (await mailTo(h.ds, [org.guardian.email])).find((x) => x.subject === `${org.athlete.name}'s training limits have been set`);
      return m ?? null;
    });
    expect(mail.html_body).toContain('<p>No lifting heavy things from the floor or bending forward with weight.</p>');
    expect(jargonIn(`${mail.subject}\n${mail.text_body}`)).toEqual([]);
  });
});

describe('an adult athlete with no guardian', () => {
  it('hears of the status and the plan with their coach; no guardian notice is written', async () => {
    const c = await openCase(adult.membershipId, 'out');
    const plan = await clin.post(`${base}/cases/${c.id}/plan`, { stages: stages(), guidance: '' });
    expect(plan.status, JSON.stringify(plan.body)).toBe(201);
    for (const kind of ['status_changed', 'plan_changed']) {
      const rows = await noticesAbout(adult.membershipId, kind);
      expect(rows.map((r) => r.recipient_id).sort(), kind).toEqual([adult.membershipId, org.coach.membershipId].sort());
    }
    const [out] = (await noticesAbout(adult.membershipId, 'status_changed')).filter((r) => r.recipient_id === adult.membershipId);
    expect(out).toMatchObject({ severity: 'urgent', title: 'Your training status: Out from 10 June 2026' });
  });
});

describe('e-mail per kind of notice: each person chooses, emergencies always go', () => {
  it('the guardian sees their own kinds; the emergency one is on and fixed', async () => {
    const res = await guardian.get(`${base}/notice-preferences`);
    expect(res.status).toBe(200);
    expect(res.body).toEqual([
      { kind: 'red_flag_emergency_guardian', label: expect.any(String), email: true, fixed: true },
      { kind: 'status_changed', label: expect.any(String), email: true, fixed: false },
      { kind: 'plan_changed', label: expect.any(String), email: true, fixed: false },
    ]);
  });

  it('ASVS 5.0 V2.2.1: switching an emergency e-mail off is a 400 naming the field, and nothing is stored', async () => {
    const res = await guardian.patch(`${base}/notice-preferences`, { email: { red_flag_emergency_guardian: false } });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields)).toEqual(['email.red_flag_emergency_guardian']);
    expect(res.body.error.fields['email.red_flag_emergency_guardian'].join(' ')).toMatch(/always e-mailed/);
    const unknown = await guardian.patch(`${base}/notice-preferences`, { email: { letters: false } });
    expect(unknown.status).toBe(400);
    expect(await h.ds.query(`SELECT 1 FROM notice_email_opt_outs WHERE member_id = $1`, [org.guardian.membershipId])).toEqual([]);
  });

  it('a kind switched off: the in-app notice still appears, no e-mail is queued for that person; others still get theirs', async () => {
    const off = await guardian.patch(`${base}/notice-preferences`, { email: { plan_changed: false } });
    expect(off.status, JSON.stringify(off.body)).toBe(200);
    expect(off.body.find((k: { kind: string }) => k.kind === 'plan_changed').email).toBe(false);
    // The other athlete joins the same care team and gets the same guardian, so both are told of their plan.
    await h.ds.query(`INSERT INTO guardian_links (organization_id, athlete_id, guardian_id) VALUES ($1, $2, $3)`, [
      org.id,
      org.otherAthlete.membershipId,
      org.guardian.membershipId,
    ]);
    await h.ds.getRepository(CareTeamAssignment).save(
      (['coach', 'clinician'] as const).map((role) => ({
        organizationId: org.id,
        athleteId: org.otherAthlete.membershipId,
        memberId: org[role].membershipId,
        role,
      })),
    );
    const c = await openCase(org.otherAthlete.membershipId);
    const plan = await clin.post(`${base}/cases/${c.id}/plan`, { stages: stages(), guidance: '' });
    expect(plan.status, JSON.stringify(plan.body)).toBe(201);
    const rows = await noticesAbout(org.otherAthlete.membershipId, 'plan_changed');
    expect(rows.map((r) => r.recipient_id)).toContain(org.guardian.membershipId);
    const subjects = (to: string): Promise<{ subject: string }[]> =>
      h.ds.query(`SELECT subject FROM email_deliveries WHERE kind = 'notice:plan_changed' AND to_address = $1`, [to]);
    const name = org.otherAthlete.name;
    expect((await subjects(org.coach.email)).map((r) => r.subject)).toContain(`${name}: restriction plan version 1`);
    expect((await subjects(org.guardian.email)).map((r) => r.subject)).not.toContain(`${name}'s training limits have been set`);
    // Switched back on, it is on again.
    const on = await guardian.patch(`${base}/notice-preferences`, { email: { plan_changed: true } });
    expect(on.body.find((k: { kind: string }) => k.kind === 'plan_changed').email).toBe(true);
  });

  it('an emergency is e-mailed even to someone with a stored "off" for it (a row the API would refuse)', async () => {
    await h.ds.query(`INSERT INTO notice_email_opt_outs (member_id, kind) VALUES ($1, 'red_flag_emergency_guardian')`, [
      org.guardian.membershipId,
    ]);
    const athlete = await signedIn(h.app, org.athlete.email, TEST_PASSWORD);
    const res = await athlete.post(
      `${base}/pain-reports`,
      reportBody(org.athlete.membershipId, { onsetDate: '2026-06-08' }, ['saddle_numbness']),
    );
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.route).toBe('emergency');
    const rows = await waitFor('the guardian’s emergency e-mail', async () => {
      const r = await deliveriesWhere(h.ds, `kind = 'notice:red_flag_emergency_guardian' AND to_address = $1`, [org.guardian.email]);
      return r.length ? r : null;
    });
    expect(rows).toHaveLength(1);
    // The emergency's own words already tell everyone; the status change it causes adds no second notice.
    const after = await noticesAbout(org.athlete.membershipId, 'status_changed');
    expect(after.filter((r) => r.body.includes('not training for now'))).toEqual([]);
  });
});
