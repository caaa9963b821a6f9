import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import type { AuditEntryDto } from '../../../../policies/dto';
import { signedIn, useHarness, type Client } from '../../test/harness';
import { createOrg, TEST_PASSWORD, type TestOrg } from '../../test/factories';
import { auditProbes } from '../../test/worlds/audit-fixtures';

const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });
const { append } = auditProbes(h);

describe('GET /audit filters and pages', () => {
  let org: TestOrg;
  let admin: Client;
  // 20:00 UTC on 10 January is 09:00 on 11 January in Auckland (UTC+13 in summer): the calendars disagree.
  const AT = new Date('2027-01-10T20:00:00Z');
  const days = { today: '2027-01-11', tomorrow: '2027-01-12', yesterday: '2027-01-10' };
  const ACTIONS = [
    'care_team.assigned',
    'guardian.linked',
    'careXteam.lookalike',
    'care_team.unassigned',
    'membership.roles_changed',
    'care_team.assigned',
  ];

  beforeAll(async () => {
    vi.useFakeTimers({ toFake: ['Date'] });
    vi.setSystemTime(AT);
    org = await createOrg(h.ds);
    await h.ds.query(`UPDATE organizations SET time_zone = 'Pacific/Auckland' WHERE id = $1`, [org.id]);
    admin = await signedIn(h.app, org.admin.email, TEST_PASSWORD);
    for (const action of ACTIONS) await append(org.id, { action, actorUserId: org.admin.userId });
  });
  afterAll(() => {
    vi.useRealTimers();
  });

  const list = async (query: string) => {
    const res = await admin.get(`/api/orgs/${org.id}/audit?${query}`);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    return res.body as { entries: AuditEntryDto[]; nextBefore: number | null };
  };

  it('action is a prefix, and its _ and % are matched literally', async () => {
    expect((await list('action=care_team.')).entries.map((e) => e.action)).toEqual([
      'care_team.assigned',
      'care_team.unassigned',
      'care_team.assigned',
    ]);
    expect((await list('action=care_')).entries.map((e) => e.action)).not.toContain('careXteam.lookalike');
    expect((await list('action=care%25')).entries).toEqual([]);
    expect((await list('action=membership.')).entries.map((e) => e.action)).toEqual(['membership.roles_changed']);
  });

  it("from and to are whole days on the organization's calendar, both included (not the UTC day)", async () => {
    const all = (await list('limit=500')).entries;
    expect(all.length).toBeGreaterThanOrEqual(ACTIONS.length);
    expect((await list(`from=${days.today}&to=${days.today}&limit=500`)).entries).toEqual(all);
    expect((await list(`from=${days.tomorrow}`)).entries).toEqual([]);
    // The UTC day of every entry: not a day of theirs on Auckland's calendar.
    expect(AT.toISOString().slice(0, 10)).toBe(days.yesterday);
    expect((await list(`to=${days.yesterday}`)).entries).toEqual([]);
    expect((await list(`from=${days.yesterday}&to=${days.tomorrow}&action=care_team.`)).entries).toHaveLength(3);
  });

  it('pages newest first with before/nextBefore, each entry exactly once', async () => {
    const all = (await list('limit=500')).entries;
    const seen: string[] = [];
    let before: number | null = null;
    let pages = 0;
    do {
      const page: { entries: AuditEntryDto[]; nextBefore: number | null } = await list(`limit=2${before ? `&before=${before}` : ''}`);
      expect(page.entries.length).toBeLessThanOrEqual(2);
      seen.push(...page.entries.map((e) => e.id));
      before = page.nextBefore;
      if (before !== null) expect(String(before)).toBe(page.entries[page.entries.length - 1].id);
      pages += 1;
    } while (before !== null && pages < 20);
    expect(seen).toEqual(all.map((e) => e.id));
    expect(pages).toBe(Math.ceil(all.length / 2));
  });

  it('refuses unknown or malformed filters (400)', async () => {
    for (const query of ['organizationId=' + randomUUID(), 'from=yesterday', 'limit=0', 'limit=501', 'actorId=nope']) {
      const res = await admin.get(`/api/orgs/${org.id}/audit?${query}`);
      expect(res.status, query).toBe(400);
    }
  });
});
