import { randomUUID } from 'node:crypto';
import pino from 'pino';
import { describe, expect, it } from 'vitest';
import { defineAbilityFor } from '../../../../policies/access';
import { RED_FLAG_ITEMS } from '../../../../policies/red-flags';
import { setStatus, type SetStatusInput } from '../../commands/cases';
import { runOrgCommand } from '../../commands/run';
import type { CoreDeps } from '../../core/command';
import { loadActor } from '../../services/actor';
import { useHarness, signedIn } from '../../test/harness';
import { createOrg, TEST_PASSWORD, type MemberRef } from '../../test/factories';

const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });

/**
 * setStatus is the one writer of participation status. An athlete may not change a case; the only
 * thing that lets their request set a status is their own emergency report (NICE NG59), which the
 * command checks itself rather than trusting its caller (ASVS 5.0 V8.2.2: checks on the loaded record).
 */
describe('setStatus guards each cause', () => {
  const run = async (who: MemberRef, organizationId: string, input: SetStatusInput) => {
    const actor = (await loadActor(h.ds, who.userId, organizationId))!;
    const deps = { ds: h.ds, config: h.config, logger: pino({ level: 'silent' }), jobs: null, storage: null } as unknown as CoreDeps;
    return runOrgCommand(
      setStatus,
      { deps, requestId: `test-${randomUUID()}`, userId: who.userId, actor, ability: defineAbilityFor(actor) },
      input,
    );
  };

  it('an athlete cannot set a status by naming a report that is not an emergency, or with the clinician’s cause', async () => {
    const org = await createOrg(h.ds);
    const base = `/api/orgs/${org.id}`;
    const clinician = await signedIn(h.app, org.clinician.email, TEST_PASSWORD);
    const opened = await clinician.post(`${base}/cases`, {
      athleteId: org.athlete.membershipId,
      bodyRegions: ['lower_back'],
      onsetDate: '2026-06-01',
      status: 'limited',
      statusEffectiveFrom: '2026-06-01',
    });
    expect(opened.status, JSON.stringify(opened.body)).toBe(201);
    const athlete = await signedIn(h.app, org.athlete.email, TEST_PASSWORD);
    const routine = await athlete.post(`${base}/pain-reports`, {
      athleteId: org.athlete.membershipId,
      bodyRegions: ['lower_back'],
      painNow: 3,
      painWorst24h: 4,
      onsetDate: '2026-06-01',
      aggravatingPatterns: [],
      startedInTraining: false,
      redFlags: Object.fromEntries(RED_FLAG_ITEMS.map((i) => [i.id, false])),
    });
    expect(routine.status, JSON.stringify(routine.body)).toBe(201);

    const full = { caseId: opened.body.id, status: 'full' as const, effectiveFrom: '2026-06-02', note: null };
    await expect(
      run(org.athlete, org.id, { ...full, cause: { kind: 'emergency_report', painReportId: routine.body.report.id } }),
    ).rejects.toMatchObject({
      code: 'not_found',
    });
    await expect(run(org.athlete, org.id, { ...full, cause: { kind: 'clinician', version: 1 } })).rejects.toMatchObject({
      code: 'forbidden',
    });
    await expect(run(org.athlete, org.id, { ...full, cause: { kind: 'case_opened' } })).rejects.toMatchObject({ code: 'forbidden' });
    // The clinician cannot give an existing case a second "first" status either.
    await expect(run(org.clinician, org.id, { ...full, cause: { kind: 'case_opened' } })).rejects.toMatchObject({ code: 'conflict' });

    const rows = await h.ds.query('SELECT status FROM participation_status_changes WHERE case_id = $1', [opened.body.id]);
    expect(rows).toEqual([{ status: 'limited' }]);
  });
});
