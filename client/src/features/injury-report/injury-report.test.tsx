import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import type { GroupDto } from '../../../../policies/dto/teams';
import { buildInjuryReport, type CaseForReport } from '../../../../policies/load/injury-report';
import type { Role } from '../../../../policies/roles';
import { fetchMock, ORG, queriesTo, renderAt, sessionFor, stubFetch } from '../../test/app';
import { jsonResponse } from '../../test/render';

stubFetch();
beforeEach(() => {
  vi.useFakeTimers({ toFake: ['Date'] });
  vi.setSystemTime(new Date('2026-03-10T12:00:00Z'));
});
afterEach(() => vi.useRealTimers());

/**
 * The worked example of the IOC consensus definitions (Bahr et al. 2020, BJSM 54:372–389): 18 time-loss
 * injuries and 270 days lost in 12,000 h → 1.5 and 22.5 per 1,000 h; the exact 95 % interval of the
 * incidence is 0.89 to 2.37 (χ² quantiles from SciPy 1.17). Built with the same pure code the server uses.
 */
function report() {
  const athletes = Array.from({ length: 40 }, (_, i) => ({ id: `a${i}`, sport: 'Soccer', groups: [{ id: 'g1', name: 'Varsity' }] }));
  const exposure = athletes.map((a) => ({
    athleteId: a.id,
    date: '2026-01-15',
    minutes: 300 * 60,
    groupId: 'g1',
    kind: 'practice' as const,
  }));
  const cases: CaseForReport[] = Array.from({ length: 18 }, (_, i) => ({
    caseId: `c${i}`,
    athleteId: `a${i}`,
    onsetDate: '2026-01-05',
    closedOn: null,
    bodyRegions: [i < 16 ? 'knee_left' : 'neck'],
    statuses: [
      { status: 'out', effectiveFrom: '2026-01-05', createdAt: '2026-01-05T08:00:00Z' },
      { status: 'full', effectiveFrom: '2026-01-20', createdAt: '2026-01-05T08:00:00Z' },
    ],
  }));
  return buildInjuryReport({ from: '2025-03-11', to: '2026-03-10', today: '2026-03-10', cases, exposure, athletes });
}

function api(roles: Role[], answers: Record<string, (body: unknown) => Response>) {
  const posts: { path: string; body: unknown }[] = [];
  fetchMock.mockImplementation(async (input, init) => {
    const path = String(input)
      .replace(/^\/api/, '')
      .split('?')[0];
    const method = init?.method ?? 'GET';
    const body = init?.body ? JSON.parse(String(init.body)) : undefined;
    if (method !== 'GET') posts.push({ path, body });
    if (path === '/session') return jsonResponse(200, sessionFor(roles));
    const answer = answers[`${method} ${path}`];
    if (answer) return answer(body);
    return jsonResponse(404, { error: { code: 'not_found', message: `No ${method} ${path}` }, requestId: 'r' });
  });
  return posts;
}

describe('the injury report page', () => {
  it('shows an admin the totals with exact intervals, a chart, the breakdowns with small cells withheld, and the CSV link', async () => {
    api(['admin'], { [`GET /orgs/${ORG}/injury-report`]: () => jsonResponse(200, report()) });
    renderAt('/admin/injury-report');
    // In the totals and again in January's row of the table.
    expect(await screen.findAllByText('1.50 (0.89–2.37)')).toHaveLength(2);
    expect(screen.getAllByText('22.5 (19.9–25.4)')).toHaveLength(2);
    // The last 365 days up to the organization's today.
    expect(queriesTo(`/orgs/${ORG}/injury-report`)[0].toString()).toBe('from=2025-03-11&to=2026-03-10');
    expect(screen.getByRole('link', { name: 'Download CSV' })).toHaveAttribute(
      'href',
      `/api/orgs/${ORG}/injury-report.csv?from=2025-03-11&to=2026-03-10`,
    );
    expect(screen.getByRole('img', { name: /injuries per 1,000 h/ })).toBeInTheDocument();
    fireEvent.click(screen.getByLabelText('Body region'));
    const table = screen.getByRole('table', { name: 'By body region' });
    const neck = within(table).getByRole('row', { name: /Neck/ });
    // 2 neck injuries: "< 5", and the knee row is withheld too so the neck cannot be worked out by subtraction.
    expect(neck).toHaveTextContent('< 5');
    expect(neck).toHaveTextContent('Fewer than 5 injuries: numbers withheld');
    expect(within(table).getByRole('row', { name: /Knee/ })).toHaveTextContent('Withheld so another row cannot be worked out');
    expect(screen.getByText(/Bahr et al\. 2020, BJSM 54:372–389/)).toBeInTheDocument();
  });

  it('tells a coach the report is not theirs', async () => {
    api(['coach'], {});
    renderAt('/clinician/injury-report');
    expect(await screen.findByRole('alert')).toBeInTheDocument();
    expect(fetchMock.mock.calls.some(([u]) => String(u).includes('injury-report'))).toBe(false);
  });
});

describe('session hours on the group page', () => {
  const group: GroupDto = {
    id: '22222222-2222-4222-8222-222222222222',
    name: 'Infield',
    kind: 'team',
    coaches: [{ id: 'm-theo', name: 'Theo Lindqvist' }],
    athletes: [
      { id: 'm-maya', name: 'Maya Torres' },
      { id: 'm-jo', name: 'Jo Park' },
    ],
    canManage: true,
    canSetCoaches: false,
    archived: false,
    version: 3,
  };

  it('a coach records a practice in one step, everyone ticked, unticking the absent', async () => {
    const posts = api(['coach'], {
      [`GET /orgs/${ORG}/groups/${group.id}`]: () => jsonResponse(200, group),
      [`GET /orgs/${ORG}/team-programs`]: () => jsonResponse(200, []),
      [`GET /orgs/${ORG}/athletes`]: () => jsonResponse(200, []),
      [`POST /orgs/${ORG}/groups/${group.id}/session-hours`]: (body) =>
        jsonResponse(201, { id: 'h1', groupId: group.id, ...(body as object), present: 1 }),
    });
    renderAt(`/groups/${group.id}`);
    const form = await screen.findByRole('form', { name: 'Session hours' });
    expect(within(form).getByLabelText('Date')).toHaveValue('2026-03-10');
    const present = within(form).getByRole('group', { name: 'Present' });
    expect(within(present).getByLabelText('Maya Torres')).toBeChecked();
    fireEvent.click(within(present).getByLabelText('Jo Park'));
    fireEvent.change(within(form).getByLabelText('Minutes'), { target: { value: '75' } });
    fireEvent.click(within(form).getByLabelText('Competition'));
    fireEvent.click(within(form).getByRole('button', { name: 'Record session hours' }));
    await waitFor(() => expect(posts).toHaveLength(1));
    expect(posts[0].body).toEqual({ date: '2026-03-10', minutes: 75, kind: 'competition', athleteIds: ['m-maya'] });
    expect(await within(form).findByText(/75 minutes of competition on Tue 10 Mar 2026 for 1 athlete/)).toBeInTheDocument();
  });
});
