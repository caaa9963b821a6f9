import { describe, expect, it } from 'vitest';
import { fireEvent, screen, within } from '@testing-library/react';
import type { Role } from '../../../../policies/roles';
import { fetchMock, ORG, renderAt, sessionFor, stubFetch } from '../../test/app';
import { jsonResponse } from '../../test/render';

stubFetch();

const URL_ONCE = 'http://127.0.0.1:3000/api/calendar/AAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAA.ics';
const SINCE = '2026-12-03T12:00:00.000Z';

/** Answers by method and path; records every write. */
function api(roles: Role[], answers: Record<string, () => Response>) {
  const calls: string[] = [];
  fetchMock.mockImplementation(async (input, init) => {
    const path = String(input).replace(/^\/api/, '');
    const method = init?.method ?? 'GET';
    if (method !== 'GET') calls.push(`${method} ${path}`);
    if (path === '/session') return jsonResponse(200, sessionFor(roles));
    if (path.endsWith('/two-step')) return jsonResponse(200, { enabled: false });
    const answer = answers[`${method} ${path}`];
    if (answer) return answer();
    return jsonResponse(404, { error: { code: 'not_found', message: `No ${method} ${path}` }, requestId: 'r' });
  });
  return calls;
}

describe('the calendar feed panel on the account page', () => {
  it('an athlete turns the feed on, sees the address once to copy, then turns it off', async () => {
    let on = false;
    const calls = api(['athlete'], {
      [`GET /orgs/${ORG}/calendar-feed`]: () => jsonResponse(200, on ? { on: true, since: SINCE } : { on: false, since: null }),
      [`POST /orgs/${ORG}/calendar-feed`]: () => {
        on = true;
        return jsonResponse(201, { on: true, since: SINCE, url: URL_ONCE });
      },
      [`DELETE /orgs/${ORG}/calendar-feed`]: () => {
        on = false;
        return jsonResponse(200, { on: false, since: null });
      },
    });
    renderAt('/account');
    const panel = (await screen.findByRole('heading', { name: 'Calendar feed' })).closest('section')!;
    expect(within(panel).getByText(/no\s+diagnosis or notes/)).toBeInTheDocument();
    fireEvent.click(await within(panel).findByRole('button', { name: 'Turn on calendar feed' }));
    expect(await within(panel).findByLabelText('Your feed address (shown only now)')).toHaveValue(URL_ONCE);
    expect(within(panel).getByRole('button', { name: 'Copy address' })).toBeInTheDocument();
    fireEvent.click(within(panel).getByRole('button', { name: 'Turn off' }));
    expect(await within(panel).findByText('The feed is off; its address no longer works.')).toBeInTheDocument();
    expect(within(panel).queryByDisplayValue(URL_ONCE)).toBeNull();
    expect(calls).toEqual([`POST /orgs/${ORG}/calendar-feed`, `DELETE /orgs/${ORG}/calendar-feed`]);
  });

  it("a guardian turns on a feed of their athletes' sessions, told it holds no diagnosis, notes or limits", async () => {
    const calls = api(['guardian'], {
      [`GET /orgs/${ORG}/calendar-feed`]: () => jsonResponse(200, { on: false, since: null }),
      [`POST /orgs/${ORG}/calendar-feed`]: () => jsonResponse(201, { on: true, since: SINCE, url: URL_ONCE }),
    });
    renderAt('/account');
    const panel = (await screen.findByRole('heading', { name: 'Calendar feed' })).closest('section')!;
    expect(within(panel).getByText(/planned sessions of each athlete you are linked to as parent or guardian/)).toBeInTheDocument();
    expect(within(panel).getByText(/No diagnosis, notes or limits are in it/)).toBeInTheDocument();
    expect(within(panel).queryByText(/what is limited that day/)).toBeNull();
    fireEvent.click(await within(panel).findByRole('button', { name: 'Turn on calendar feed' }));
    expect(await within(panel).findByLabelText('Your feed address (shown only now)')).toHaveValue(URL_ONCE);
    expect(calls).toEqual([`POST /orgs/${ORG}/calendar-feed`]);
  });

  it('an administrator has no calendar feed panel', async () => {
    api(['admin'], {});
    renderAt('/account');
    expect(await screen.findByRole('heading', { name: 'Your account' })).toBeInTheDocument();
    expect(screen.queryByRole('heading', { name: /Calendar feed/ })).toBeNull();
  });
});
