import { randomUUID } from 'node:crypto';
import { expect } from 'vitest';
import type { TeamGridDto, TeamProgramDto, TeamVersionDto } from '../../../../policies/dto/teams';
import { CareTeamAssignment } from '../../entities';
import { createMember, type MemberRef } from '../factories';
import type { Client, Harness } from '../harness';
import { addDays, cheapen, programWorld, TODAY } from './test-world';

/**
 * The team-program tests' world: a squad of eight athletes in one group coached by the org's coach,
 * each with a tested back squat of 100 kg and deadlift of 140 kg. Two are restricted by the clinician
 * — Hinge capped at 60 % of 1RM, and Sprint blocked — and one is Out. A team session of back squat
 * and deadlift 3 × 5 @ 75 % and 4 sprints follows on the next Monday; the sprint names nothing to use instead.
 */

/** Monday of the week after the pinned Thursday (2026-12-03): inside every plan stage below. */
export const MONDAY = addDays(TODAY, 4);

const set = (reps: number, load: object, targetRpe = 7) => ({ id: randomUUID(), reps, load, targetRpe });
export const threeByFive = (exerciseId: string, pct = 75) => ({
  id: randomUUID(),
  exerciseId,
  sets: [1, 2, 3].map(() => set(5, { kind: 'percent', value: pct })),
});

export async function teamWorld(h: Harness) {
  const w = await programWorld(h);
  const { org, base, coach, ex } = w;
  const extra: MemberRef[] = [];
  for (let i = 1; i <= 6; i++) extra.push(await createMember(h.ds, org.id, ['athlete'], { name: `Squad athlete ${i}` }));
  await cheapen(
    h.ds,
    extra.map((a) => a.userId),
  );
  const hinge = org.athlete.membershipId;
  const sprint = org.otherAthlete.membershipId;
  const out = extra[0].membershipId;
  const athletes = [hinge, sprint, ...extra.map((a) => a.membershipId)];
  const plainAthlete = extra[1];
  await h.ds.getRepository(CareTeamAssignment).save([
    ...athletes.slice(1).map((a) => ({ organizationId: org.id, athleteId: a, memberId: org.coach.membershipId, role: 'coach' as const })),
    ...[sprint, out].map((a) => ({
      organizationId: org.id,
      athleteId: a,
      memberId: org.clinician.membershipId,
      role: 'clinician' as const,
    })),
  ]);
  const [group] = (await h.ds.query(
    `INSERT INTO groups (organization_id, name, kind, version) VALUES ($1, 'Infield', 'team', 1) RETURNING id`,
    [org.id],
  )) as { id: string }[];
  await h.ds.query(
    `INSERT INTO group_members (group_id, member_id, role, organization_id)
     SELECT $1, m, r, $2 FROM unnest($3::uuid[], $4::text[]) AS x(m, r)`,
    [group.id, org.id, [org.coach.membershipId, ...athletes], ['coach', ...athletes.map(() => 'athlete')]],
  );
  // This squad's sprint has nothing to use instead, so a blocked sprint is a set nothing fits ("needs a
  // decision"); the starter library's sprint → bike intervals swap is tested in exercises-use-instead.test.ts.
  await h.ds.query(`UPDATE exercises SET use_instead = '{}' WHERE organization_id = $1 AND name = 'Sprint 20 m'`, [org.id]);
  for (const a of athletes) {
    await w.baseline(a, 100, 'Back squat');
    await w.baseline(a, 140, 'Deadlift');
  }
  const hingePlan = await w.plan(hinge, { hinge: { mode: 'capped', caps: { maxPercent1RM: 60 } } });
  await w.plan(sprint, { sprint: { mode: 'blocked' } });
  const outCase = await w.clinician.post(`${base}/cases`, {
    athleteId: out,
    bodyRegions: ['knee_left'],
    onsetDate: addDays(TODAY, -2),
    status: 'out',
    statusEffectiveFrom: addDays(TODAY, -2),
  });
  expect(outCase.status, JSON.stringify(outCase.body)).toBe(201);

  const squadContent = () => ({
    exercises: [
      threeByFive(ex('Back squat')),
      threeByFive(ex('Deadlift')),
      { id: randomUUID(), exerciseId: ex('Sprint 20 m'), sets: [1, 2, 3, 4].map(() => set(1, { kind: 'bodyweight' }, 8)) },
    ],
  });
  const createProgram = async (client: Client = coach) => {
    const res = await client.post(`${base}/team-programs`, { groupId: group.id, name: 'Infield strength' });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    return res.body as TeamProgramDto;
  };
  const addSession = async (programId: string, content = squadContent(), date = MONDAY) => {
    const res = await coach.post(`${base}/team-programs/${programId}/sessions`, { date, title: 'Squad lift', content });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    return res.body as { id: string; version: number; content: ReturnType<typeof squadContent> };
  };
  const grid = async (programId: string, client: Client = coach) => {
    const res = await client.get(`${base}/team-programs/${programId}/grid`);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    return res.body as TeamGridDto;
  };
  const cell = (g: TeamGridDto, athleteId: string, teamSessionId?: string) =>
    g.cells.find((c) => c.athleteId === athleteId && (!teamSessionId || c.teamSessionId === teamSessionId))!;
  const version = async (teamSessionId: string, athleteId: string, client: Client = coach) => {
    const res = await client.get(`${base}/team-sessions/${teamSessionId}/versions/${athleteId}`);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    return res.body as TeamVersionDto;
  };
  const versionAction = (teamSessionId: string, athleteId: string, action: string, v: number) =>
    coach.post(`${base}/team-sessions/${teamSessionId}/versions/${athleteId}/${action}`, { version: v });
  const publish = (programId: string, teamSessionIds: string[]) =>
    coach.post(`${base}/team-programs/${programId}/publish`, { teamSessionIds });
  return {
    ...w,
    group,
    athletes,
    hinge,
    sprint,
    out,
    outCase: outCase.body as { id: string; version: number },
    plainAthlete,
    extra,
    hingePlan,
    squadContent,
    createProgram,
    addSession,
    grid,
    cell,
    version,
    versionAction,
    publish,
  };
}
