import { describe, expect, it } from 'vitest';
import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import type { GroupDto, TeamProgramSummaryDto } from '../../../../policies/dto/teams';
import type { Role } from '../../../../policies/roles';
import { fetchMock, ORG, renderAt, sessionFor, stubFetch } from '../../test/app';
import { jsonResponse } from '../../test/render';

stubFetch();

const GROUP_ID = '22222222-2222-4222-8222-222222222222';
const infield = (over: Partial<GroupDto> = {}): GroupDto => ({
  id: GROUP_ID,
  name: 'Infield',
  kind: 'team',
  coaches: [{ id: 'm-theo', name: 'Theo Lindqvist' }],
  athletes: [{ id: 'm-maya', name: 'Maya Torres' }],
  canManage: true,
  canSetCoaches: false,
  archived: false,
  version: 3,
  ...over,
});
const person = (id: string, displayName: string, roles: Role[]) => ({ id, displayName, roles, athlete: null });

interface Call {
  method: string;
  path: string;
  body: unknown;
}

/** Answers by method and path; records every write. */
function api(roles: Role[], coachOf: string[], answers: Record<string, (body: unknown) => Response>): Call[] {
  const calls: Call[] = [];
  fetchMock.mockImplementation(async (input, init) => {
    const path = String(input).replace(/^\/api/, '');
    const method = init?.method ?? 'GET';
    const body = init?.body ? JSON.parse(String(init.body)) : undefined;
    if (method !== 'GET') calls.push({ method, path, body });
    if (path === '/session') return jsonResponse(200, sessionFor(roles, { coachOf }));
    const answer = answers[`${method} ${path}`];
    if (answer) return answer(body);
    return jsonResponse(404, { error: { code: 'not_found', message: `No ${method} ${path}` }, requestId: 'r' });
  });
  return calls;
}

describe('groups in the browser', () => {
  it('an admin lists groups and starts one naming its coach and athletes, then lands on it', async () => {
    const created = infield({ id: '33333333-3333-4333-8333-333333333333', name: 'Outfield', canSetCoaches: true });
    const calls = api(['admin'], [], {
      [`GET /orgs/${ORG}/groups`]: () => jsonResponse(200, [infield()]),
      [`GET /orgs/${ORG}/people`]: () =>
        jsonResponse(200, [
          person('m-maya', 'Maya Torres', ['athlete']),
          person('m-jo', 'Jo Park', ['athlete']),
          person('m-theo', 'Theo Lindqvist', ['coach']),
          person('m-ada', 'Ada Admin', ['admin']),
        ]),
      [`GET /orgs/${ORG}/athletes`]: () => jsonResponse(200, []),
      [`POST /orgs/${ORG}/groups`]: () => jsonResponse(201, created),
      [`GET /orgs/${ORG}/groups/${created.id}`]: () => jsonResponse(200, created),
      [`GET /orgs/${ORG}/team-programs?groupId=${created.id}`]: () => jsonResponse(200, []),
    });
    const router = renderAt('/groups');
    expect(await screen.findByRole('link', { name: 'Infield' })).toHaveAttribute('href', `/groups/${GROUP_ID}`);
    const form = await screen.findByRole('form', { name: 'New group' });
    fireEvent.change(within(form).getByLabelText('Group name'), { target: { value: '  Outfield ' } });
    fireEvent.change(within(form).getByLabelText('Kind'), { target: { value: 'position' } });
    // Only coaches are offered as coaches, only athletes as athletes.
    const coaches = within(form).getByRole('group', { name: 'Coaches' });
    expect(within(coaches).queryByLabelText('Ada Admin')).toBeNull();
    fireEvent.click(within(coaches).getByLabelText('Theo Lindqvist'));
    fireEvent.click(within(within(form).getByRole('group', { name: 'Athletes' })).getByLabelText('Jo Park'));
    fireEvent.click(within(form).getByRole('button', { name: 'Create group' }));
    await waitFor(() => expect(router.state.location.pathname).toBe(`/groups/${created.id}`));
    expect(calls).toEqual([
      {
        method: 'POST',
        path: `/orgs/${ORG}/groups`,
        body: { name: 'Outfield', kind: 'position', athleteIds: ['m-jo'], coachIds: ['m-theo'] },
      },
    ]);
  });

  it('a coach is offered only the athletes they coach, sees the coaches without changing them, and saves with the version', async () => {
    // The server's copy: the saved one once saved.
    let current = infield();
    const calls = api(['coach'], ['m-maya', 'm-jo'], {
      [`GET /orgs/${ORG}/groups/${GROUP_ID}`]: () => jsonResponse(200, current),
      [`GET /orgs/${ORG}/team-programs?groupId=${GROUP_ID}`]: () => jsonResponse(200, []),
      [`GET /orgs/${ORG}/athletes`]: () =>
        jsonResponse(200, [
          { id: 'm-maya', displayName: 'Maya Torres' },
          { id: 'm-jo', displayName: 'Jo Park' },
        ]),
      [`PUT /orgs/${ORG}/groups/${GROUP_ID}/members`]: () => {
        current = infield({
          version: 4,
          athletes: [
            { id: 'm-jo', name: 'Jo Park' },
            { id: 'm-maya', name: 'Maya Torres' },
          ],
        });
        return jsonResponse(200, current);
      },
    });
    renderAt(`/groups/${GROUP_ID}`);
    const form = await screen.findByRole('form', { name: 'Members' });
    expect(within(form).queryByRole('group', { name: 'Coaches' })).toBeNull();
    expect(form).toHaveTextContent("An admin of your organization chooses a group's coaches.");
    const athletes = within(form).getByRole('group', { name: 'Athletes' });
    expect(within(athletes).getByLabelText('Maya Torres')).toBeChecked();
    const save = within(form).getByRole('button', { name: 'Save members' });
    expect(save).toBeDisabled();
    fireEvent.click(within(athletes).getByLabelText('Jo Park'));
    fireEvent.click(save);
    expect(await screen.findByText('Members saved. Who sees whom follows at once.')).toBeInTheDocument();
    expect(calls).toEqual([
      {
        method: 'PUT',
        path: `/orgs/${ORG}/groups/${GROUP_ID}/members`,
        body: { coachIds: ['m-theo'], athleteIds: ['m-jo', 'm-maya'], version: 3 },
      },
    ]);
  });

  it('a stale version says someone else changed the group and offers a reload', async () => {
    api(['coach'], ['m-maya', 'm-jo'], {
      [`GET /orgs/${ORG}/groups/${GROUP_ID}`]: () => jsonResponse(200, infield()),
      [`GET /orgs/${ORG}/team-programs?groupId=${GROUP_ID}`]: () => jsonResponse(200, []),
      [`GET /orgs/${ORG}/athletes`]: () => jsonResponse(200, [{ id: 'm-jo', displayName: 'Jo Park' }]),
      [`PUT /orgs/${ORG}/groups/${GROUP_ID}/members`]: () =>
        jsonResponse(409, { error: { code: 'version_conflict', message: 'Someone else changed this group.' }, requestId: 'r' }),
    });
    renderAt(`/groups/${GROUP_ID}`);
    const form = await screen.findByRole('form', { name: 'Members' });
    fireEvent.click(within(form).getByLabelText('Jo Park'));
    fireEvent.click(within(form).getByRole('button', { name: 'Save members' }));
    expect(await screen.findByText('Someone else changed this group; reload to see the latest.')).toBeInTheDocument();
    expect(screen.getByRole('button', { name: 'Reload this group' })).toBeInTheDocument();
  });

  it("lists the group's team programs as links and starts a new one, opening it", async () => {
    const programs: TeamProgramSummaryDto[] = [
      { id: 'p-1', name: 'Preseason', groupId: GROUP_ID, groupName: 'Infield', sessions: 4, archived: false, version: 1 },
    ];
    const calls = api(['coach'], ['m-maya'], {
      [`GET /orgs/${ORG}/groups/${GROUP_ID}`]: () => jsonResponse(200, infield()),
      [`GET /orgs/${ORG}/team-programs?groupId=${GROUP_ID}`]: () => jsonResponse(200, programs),
      [`GET /orgs/${ORG}/athletes`]: () => jsonResponse(200, []),
      [`POST /orgs/${ORG}/team-programs`]: () => jsonResponse(201, { ...programs[0], id: 'p-2', name: 'In season', sessions: 0 }),
    });
    const router = renderAt(`/groups/${GROUP_ID}`);
    expect(await screen.findByRole('link', { name: 'Preseason' })).toHaveAttribute('href', '/coach/team-programs/p-1');
    const form = screen.getByRole('form', { name: 'New team program' });
    fireEvent.change(within(form).getByLabelText('New team program'), { target: { value: 'In season' } });
    fireEvent.click(within(form).getByRole('button', { name: 'Start team program' }));
    await waitFor(() => expect(router.state.location.pathname).toBe('/coach/team-programs/p-2'));
    expect(calls).toEqual([{ method: 'POST', path: `/orgs/${ORG}/team-programs`, body: { groupId: GROUP_ID, name: 'In season' } }]);
  });

  it('a clinician reads the members without an editor; an athlete is told groups are not for them', async () => {
    api(['clinician'], [], {
      [`GET /orgs/${ORG}/groups/${GROUP_ID}`]: () => jsonResponse(200, infield({ canManage: false })),
      [`GET /orgs/${ORG}/team-programs?groupId=${GROUP_ID}`]: () => jsonResponse(200, []),
      [`GET /orgs/${ORG}/athletes`]: () => jsonResponse(200, []),
    });
    renderAt(`/groups/${GROUP_ID}`);
    expect(await screen.findByText('Maya Torres')).toBeInTheDocument();
    expect(screen.queryByRole('form', { name: 'Members' })).toBeNull();
    expect(screen.queryByRole('button', { name: 'Archive this group' })).toBeNull();
  });
});
