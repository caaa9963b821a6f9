import { randomUUID } from 'node:crypto';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { CaseRecord, ParticipationStatusChange, Program, ProgramSession } from '../../entities';
import { ROUTE_TABLE } from '../../http/route';
import { signedIn, useHarness } from '../../test/harness';
import { createOrg, TEST_PASSWORD, type TestOrg } from '../../test/factories';

/**
 * A care-team change changes who is told about an athlete's held sessions, so it goes through the one
 * "limits changed" path (commands/limits.ts): the athlete's published sessions are checked again and
 * each coach — the new one included — hears of sessions newly put on hold. A guardian link does not.
 */
describe('care-team changes re-check the athlete’s published sessions', () => {
  const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });
  afterEach(() => {
    vi.useRealTimers();
  });

  /**
   * An athlete who is Out from 1 February with no plan, and a session published for 12 February
   * that nobody has checked against it (written straight to the tables, as if before the change).
   */
  async function unheldBreach(org: TestOrg) {
    const athleteId = org.athlete.membershipId;
    const [exercise]: { id: string }[] = await h.ds.query(`SELECT id FROM exercises WHERE organization_id = $1 ORDER BY name LIMIT 1`, [
      org.id,
    ]);
    const kase = await h.ds.getRepository(CaseRecord).save({
      organizationId: org.id,
      athleteId,
      bodyRegions: ['lower_back'],
      onsetDate: '2027-01-25',
      openedBy: org.clinician.userId,
    });
    const out = await h.ds.getRepository(ParticipationStatusChange).save({
      organizationId: org.id,
      athleteId,
      caseId: kase.id,
      status: 'out',
      effectiveFrom: '2027-02-01',
      note: null,
      setBy: org.clinician.userId,
    });
    const program = await h.ds
      .getRepository(Program)
      .save({ organizationId: org.id, name: 'Block', athleteIds: [athleteId], createdBy: null });
    const session = await h.ds.getRepository(ProgramSession).save({
      organizationId: org.id,
      programId: program.id,
      date: '2027-02-12',
      title: 'Heavy day',
      status: 'published',
      publishedAt: new Date(),
      content: {
        exercises: [
          {
            id: randomUUID(),
            exerciseId: exercise.id,
            sets: [{ id: randomUUID(), reps: 5, load: { kind: 'kg', value: 60 }, targetRpe: 6 }],
          },
        ],
      },
    } as never);
    return { athleteId, sessionId: (session as unknown as ProgramSession).id, statusChangeId: out.id };
  }

  const holds = async (athleteId: string): Promise<string[]> =>
    (await h.ds.query(`SELECT session_id FROM session_holds WHERE athlete_id = $1`, [athleteId])).map(
      (r: { session_id: string }) => r.session_id,
    );
  const holdNotices = async (athleteId: string): Promise<{ recipient_id: string; body: string }[]> =>
    h.ds.query(`SELECT recipient_id, body FROM notifications WHERE kind = 'sessions_on_hold' AND athlete_id = $1 ORDER BY recipient_id`, [
      athleteId,
    ]);

  it('assigning a coach holds the session that breaches, and tells every coach, the new one included; unassigning releases what fits again', async () => {
    vi.useFakeTimers({ toFake: ['Date'] });
    vi.setSystemTime(new Date('2027-02-10T12:00:00Z'));
    const org = await createOrg(h.ds);
    const admin = await signedIn(h.app, org.admin.email, TEST_PASSWORD);
    const { athleteId, sessionId, statusChangeId } = await unheldBreach(org);
    expect(await holds(athleteId)).toEqual([]);

    const assigned = await admin.post(`/api/orgs/${org.id}/care-team`, { athleteId, memberId: org.otherCoach.membershipId, role: 'coach' });
    expect(assigned.status, JSON.stringify(assigned.body)).toBe(201);
    expect(await holds(athleteId)).toEqual([sessionId]);
    const notices = await holdNotices(athleteId);
    expect(notices.map((n) => n.recipient_id).sort()).toEqual([org.coach.membershipId, org.otherCoach.membershipId].sort());
    for (const n of notices) expect(n.body).toMatch(/^A coach joined the care team\. /);

    // The athlete is back: taking the coach off again re-checks, and the session fits.
    await h.ds.getRepository(ParticipationStatusChange).delete({ id: statusChangeId });
    expect((await admin.delete(`/api/orgs/${org.id}/care-team/${assigned.body.id}`)).status).toBe(204);
    expect(await holds(athleteId)).toEqual([]);
  });

  it('a guardian link re-checks nothing: a guardian changes nothing the athlete may do', async () => {
    vi.useFakeTimers({ toFake: ['Date'] });
    vi.setSystemTime(new Date('2027-02-10T12:00:00Z'));
    const org = await createOrg(h.ds);
    const admin = await signedIn(h.app, org.admin.email, TEST_PASSWORD);
    const { athleteId } = await unheldBreach(org);
    const linked = await admin.post(`/api/orgs/${org.id}/guardian-links`, { athleteId, guardianId: org.otherGuardian.membershipId });
    expect(linked.status).toBe(201);
    expect(await holds(athleteId)).toEqual([]);
    expect(await holdNotices(athleteId)).toEqual([]);
  });

  it('the route table shows which link routes change limits (! after the command)', () => {
    const commandsOf = (method: string, path: string) => ROUTE_TABLE.find((r) => r.method === method && r.path === path)?.commands;
    expect(commandsOf('POST', '/api/orgs/:orgId/care-team')).toEqual(['assignCareTeam!']);
    expect(commandsOf('DELETE', '/api/orgs/:orgId/care-team/:id')).toEqual(['unassignCareTeam!']);
    expect(commandsOf('POST', '/api/orgs/:orgId/guardian-links')).toEqual(['linkGuardian']);
    expect(commandsOf('DELETE', '/api/orgs/:orgId/guardian-links/:id')).toEqual(['unlinkGuardian']);
  });
});
