import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { QueryClient, type QueryKey } from '@tanstack/react-query';
import { render, screen } from '@testing-library/react';
import type { SessionDto } from '../../../policies/dto';
import { LastUpdatedNote } from '../features/offline/components/LastUpdatedNote';
import { clearOfflineCopies, installOfflineCopy, oldestCopyShown } from './offline-copy';
import { sessionQueryKey } from './query-client';

/**
 * The athlete's offline copy across days (phone first: the app works without signal): opened without signal
 * on a later day than it was saved, the copy is still shown, marked with when it was last updated and that
 * today's view may be out of date — it neither vanishes nor poses as today's.
 */
const ORG = 'org-1';
const ATHLETE = 'athlete-membership-1';
const FRIDAY_EVENING = new Date('2026-12-04T18:30:00Z');
const SATURDAY_MORNING = new Date('2026-12-05T08:15:00Z');

const session = (userId: string): SessionDto =>
  ({
    user: { id: userId },
    memberships: [{ id: ATHLETE, organizationId: ORG, roles: ['athlete'] }],
    csrfToken: 'token',
  }) as unknown as SessionDto;

const todayKey = (day: string): QueryKey => ['orgs', ORG, 'athletes', ATHLETE, 'today', day];
const logsKey = (from: string, to: string): QueryKey => ['orgs', ORG, 'training-logs', ATHLETE, { from, to }];
const todayOf = (day: string) => ({ athleteId: ATHLETE, date: day, unit: 'kg', sessions: [{ id: `session-${day}` }] });

let uninstall: (() => void)[] = [];

/**
 * A page load: a new cache and the copy put back. Without signal the session is the copy's own; with
 * `signedIn`, the server's answer for that person arrives.
 */
function openApp(at: Date, signedIn?: string, sessionOf: (userId: string) => SessionDto = session): QueryClient {
  vi.setSystemTime(at);
  const client = new QueryClient({ defaultOptions: { queries: { retry: false } } });
  uninstall.push(installOfflineCopy(client));
  if (signedIn || !client.getQueryData(sessionQueryKey)) client.setQueryData(sessionQueryKey, sessionOf(signedIn ?? 'user-1'));
  return client;
}

/** What a screen's useQuery would find on its first render for the key. */
function firstRead(client: QueryClient, key: QueryKey) {
  const query = client.getQueryCache().build(client, { queryKey: key });
  return { data: query.state.data, dataUpdatedAt: query.state.dataUpdatedAt, isInvalidated: query.state.isInvalidated };
}

beforeEach(() => {
  localStorage.clear();
  vi.useFakeTimers({ toFake: ['Date'] });
});
afterEach(() => {
  uninstall.forEach((u) => u());
  uninstall = [];
  vi.useRealTimers();
  localStorage.clear();
});

describe('the offline copy on a later day', () => {
  it("shows Friday's copy on Saturday's screen, with Friday's time, and still asks the server first", () => {
    const friday = openApp(FRIDAY_EVENING);
    friday.setQueryData(todayKey('2026-12-04'), todayOf('2026-12-04'));

    const saturday = openApp(SATURDAY_MORNING);
    const read = firstRead(saturday, todayKey('2026-12-05'));
    expect(read.data).toEqual(todayOf('2026-12-04'));
    expect(read.dataUpdatedAt).toBe(FRIDAY_EVENING.getTime());
    // Never taken for a fresh answer: the screen asks for Saturday's on first use.
    expect(read.isInvalidated).toBe(true);
    expect(oldestCopyShown([read])).toBe(FRIDAY_EVENING.getTime());
  });

  it('marks the screen "Last updated" with the time and says today may be out of date, deferring to the clinician', () => {
    const friday = openApp(FRIDAY_EVENING);
    friday.setQueryData(todayKey('2026-12-04'), todayOf('2026-12-04'));
    const saturday = openApp(SATURDAY_MORNING);
    render(<LastUpdatedNote queries={[firstRead(saturday, todayKey('2026-12-05'))]} />);
    const note = screen.getByRole('status');
    expect(note).toHaveTextContent(/^Last updated 4 Dec 2026, \d\d:\d\d/);
    expect(note).toHaveTextContent('It was saved on Fri 4 Dec 2026, so what it shows for today may be out of date.');
    expect(note).toHaveTextContent('Check with your clinician before you train on it.');
  });

  it('says nothing about an earlier day for a copy saved earlier the same day', () => {
    const morning = openApp(new Date('2026-12-05T06:00:00Z'));
    morning.setQueryData(todayKey('2026-12-05'), todayOf('2026-12-05'));
    const later = openApp(SATURDAY_MORNING);
    render(<LastUpdatedNote queries={[firstRead(later, todayKey('2026-12-05'))]} />);
    expect(screen.getByRole('status')).toHaveTextContent(/^Last updated 5 Dec 2026, \d\d:\d\d/);
    expect(screen.getByRole('status')).not.toHaveTextContent('saved on');
  });

  it('fills a range key ({ from, to }) from the latest earlier range of the same kind', () => {
    const friday = openApp(FRIDAY_EVENING);
    friday.setQueryData(logsKey('2026-11-20', '2026-12-03'), ['Thursday']);
    friday.setQueryData(logsKey('2026-11-21', '2026-12-04'), ['Friday']);
    const saturday = openApp(SATURDAY_MORNING);
    expect(firstRead(saturday, logsKey('2026-11-22', '2026-12-05')).data).toEqual(['Friday']);
  });

  it("never fills a day from a later day's copy, another kind of query, or another person's copy", () => {
    const friday = openApp(FRIDAY_EVENING);
    friday.setQueryData(todayKey('2026-12-06'), todayOf('2026-12-06'));
    friday.setQueryData(['orgs', ORG, 'in-force', ATHLETE, '2026-12-04'], { status: 'limited' });

    const saturday = openApp(SATURDAY_MORNING);
    expect(firstRead(saturday, todayKey('2026-12-05')).data).toBeUndefined();
    expect(firstRead(saturday, ['orgs', ORG, 'in-force', 'someone-else', '2026-12-05']).data).toBeUndefined();

    // Someone else signs in on this phone: the first person's copy is never shown to them.
    const other = openApp(SATURDAY_MORNING, 'user-2');
    expect(firstRead(other, ['orgs', ORG, 'in-force', ATHLETE, '2026-12-05']).data).toBeUndefined();
  });

  it('does not save the filled-in copy under the new day, and keeps the latest three days of each kind', () => {
    const week = ['2026-11-30', '2026-12-01', '2026-12-02', '2026-12-03', '2026-12-04'];
    const friday = openApp(FRIDAY_EVENING);
    for (const day of week) friday.setQueryData(todayKey(day), todayOf(day));
    friday.setQueryData(['orgs', ORG, 'organization'], { name: 'Harbor' });

    const saturday = openApp(SATURDAY_MORNING);
    firstRead(saturday, todayKey('2026-12-05'));
    const saved = JSON.parse(localStorage.getItem('loadline.offline.user.user-1') ?? '[]') as { key: QueryKey }[];
    const todayDays = saved.filter((e) => e.key[4] === 'today').map((e) => e.key[5]);
    expect(todayDays.sort()).toEqual(['2026-12-02', '2026-12-03', '2026-12-04']);
    expect(saved.some((e) => e.key[2] === 'organization')).toBe(true);
  });

  it("keeps the athlete's own clearance letters for reading offline, never anyone else's", () => {
    const friday = openApp(FRIDAY_EVENING);
    friday.setQueryData(['orgs', ORG, 'letters', { athleteId: ATHLETE }], [{ id: 'letter-1', decision: 'limited' }]);
    friday.setQueryData(['orgs', ORG, 'letters', { athleteId: 'someone-else' }], [{ id: 'letter-2' }]);
    friday.setQueryData(['orgs', ORG, 'letters', { athleteId: null }], [{ id: 'letter-3' }]);

    const saturday = openApp(SATURDAY_MORNING);
    expect(saturday.getQueryData(['orgs', ORG, 'letters', { athleteId: ATHLETE }])).toEqual([{ id: 'letter-1', decision: 'limited' }]);
    expect(saturday.getQueryData(['orgs', ORG, 'letters', { athleteId: 'someone-else' }])).toBeUndefined();
    expect(saturday.getQueryData(['orgs', ORG, 'letters', { athleteId: null }])).toBeUndefined();
  });

  it('marks a later day filled from a copy saved during this same visit (the app left open past midnight)', () => {
    const client = openApp(FRIDAY_EVENING);
    client.setQueryData(todayKey('2026-12-04'), todayOf('2026-12-04'));
    vi.setSystemTime(SATURDAY_MORNING);
    const read = firstRead(client, todayKey('2026-12-05'));
    expect(read.data).toEqual(todayOf('2026-12-04'));
    expect(oldestCopyShown([read])).toBe(FRIDAY_EVENING.getTime());
    // A fresh answer for the day is no copy.
    client.setQueryData(todayKey('2026-12-05'), todayOf('2026-12-05'));
    const fresh = client.getQueryState(todayKey('2026-12-05'))!;
    expect(oldestCopyShown([{ data: fresh.data, dataUpdatedAt: fresh.dataUpdatedAt }])).toBeNull();
  });
});

/** A guardian's phone: Elena-like, the guardian of one athlete (WARD) in the organization. */
const GUARDIAN = 'guardian-membership-1';
const WARD = 'ward-membership-1';
const guardianSession = (userId: string): SessionDto =>
  ({
    user: { id: userId },
    memberships: [{ id: GUARDIAN, organizationId: ORG, roles: ['guardian'], actor: { guardianOf: [WARD] } }],
    csrfToken: 'token',
  }) as unknown as SessionDto;
const openGuardian = (at: Date) => openApp(at, undefined, guardianSession);
const allLetters = ['orgs', ORG, 'letters', { athleteId: null }];
const athletesList = ['orgs', ORG, 'athletes'];
const wardInForce = (day: string) => ['orgs', ORG, 'in-force', WARD, day];

describe("the guardian's letters offline", () => {
  it("keeps the guardian's page — their athlete, status today and letters — cut to the athletes in their care", () => {
    const friday = openGuardian(FRIDAY_EVENING);
    friday.setQueryData(athletesList, [{ id: WARD }, { id: 'someone-else' }]);
    friday.setQueryData(allLetters, [
      { id: 'letter-1', athleteId: WARD, decision: 'limited' },
      { id: 'letter-2', athleteId: 'someone-else' },
    ]);
    friday.setQueryData(wardInForce('2026-12-04'), { status: 'limited' });
    friday.setQueryData(['orgs', ORG, 'in-force', 'someone-else', '2026-12-04'], { status: 'out' });
    friday.setQueryData(['orgs', ORG, 'training-logs', WARD, { from: '2026-11-21', to: '2026-12-04' }], ['a log']);

    const saturday = openGuardian(SATURDAY_MORNING);
    expect(saturday.getQueryData(sessionQueryKey)).toMatchObject({ user: { id: 'user-1' }, csrfToken: '' });
    expect(saturday.getQueryData(athletesList)).toEqual([{ id: WARD }]);
    expect(saturday.getQueryData(allLetters)).toEqual([{ id: 'letter-1', athleteId: WARD, decision: 'limited' }]);
    expect(firstRead(saturday, wardInForce('2026-12-05')).data).toEqual({ status: 'limited' });
    expect(saturday.getQueryData(['orgs', ORG, 'in-force', 'someone-else', '2026-12-04'])).toBeUndefined();
    // Only what the guardian's page shows: not the athlete's own logs, even had they been read.
    expect(saturday.getQueryData(['orgs', ORG, 'training-logs', WARD, { from: '2026-11-21', to: '2026-12-04' }])).toBeUndefined();
    const letters = saturday.getQueryState(allLetters)!;
    expect(oldestCopyShown([{ data: letters.data, dataUpdatedAt: letters.dataUpdatedAt }])).toBe(FRIDAY_EVENING.getTime());
  });

  it('marks the letters "Last updated" and, a day later, defers to the clinician or coach in the family\'s words', () => {
    const friday = openGuardian(FRIDAY_EVENING);
    friday.setQueryData(wardInForce('2026-12-04'), { status: 'limited' });
    const saturday = openGuardian(SATURDAY_MORNING);
    render(<LastUpdatedNote queries={[firstRead(saturday, wardInForce('2026-12-05'))]} audience="family" />);
    const note = screen.getByRole('status');
    expect(note).toHaveTextContent(/^Last updated 4 Dec 2026, \d\d:\d\d/);
    expect(note).toHaveTextContent('Check with the clinician or coach before your athlete trains on it.');
    expect(note).not.toHaveTextContent('before you train');
  });

  it("a sign-out, or a session found signed out, leaves none of the guardian's copy on the phone", () => {
    const keys = () => Object.keys(localStorage).filter((k) => k.startsWith('loadline.offline.'));
    const friday = openGuardian(FRIDAY_EVENING);
    friday.setQueryData(allLetters, [{ id: 'letter-1', athleteId: WARD }]);
    expect(keys().length).toBeGreaterThan(0);
    // What the sign-out button does first (features/auth/api/sign-out.ts).
    clearOfflineCopies();
    expect(keys()).toEqual([]);

    const again = openGuardian(FRIDAY_EVENING);
    again.setQueryData(allLetters, [{ id: 'letter-1', athleteId: WARD }]);
    expect(keys().length).toBeGreaterThan(0);
    again.setQueryData(sessionQueryKey, { user: null, memberships: [], csrfToken: 't' });
    expect(keys()).toEqual([]);
  });

  it('keeps nothing for a guardian linked to no athlete (the guardianship ended)', () => {
    const unlinked = (userId: string) =>
      ({
        user: { id: userId },
        memberships: [{ id: GUARDIAN, organizationId: ORG, roles: ['guardian'], actor: { guardianOf: [] } }],
        csrfToken: 't',
      }) as unknown as SessionDto;
    const client = openApp(FRIDAY_EVENING, 'user-3', unlinked);
    client.setQueryData(allLetters, [{ id: 'letter-1', athleteId: WARD }]);
    client.setQueryData(['orgs', ORG, 'organization'], { name: 'Harbor' });
    expect(Object.keys(localStorage).filter((k) => k.startsWith('loadline.offline.'))).toEqual([]);
  });
});
