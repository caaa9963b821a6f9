import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { fireEvent, render, screen } from '@testing-library/react';
import { QueryClientProvider } from '@tanstack/react-query';
import { RouterProvider, createMemoryRouter } from 'react-router-dom';
import type { Actor } from '../../../policies/access';
import type { AthleteProfileDto, SessionDto } from '../../../policies/dto';
import type { Role } from '../../../policies/roles';
import { createQueryClient } from '../lib/query-client';
import { jsonResponse } from '../test/render';
import { routes } from './router';

const ORG = '11111111-1111-4111-8111-111111111111';
const fetchMock = vi.fn<typeof fetch>();

beforeEach(() => {
  vi.stubGlobal('fetch', fetchMock);
  localStorage.clear();
  sessionStorage.clear();
});
afterEach(() => {
  vi.unstubAllGlobals();
  fetchMock.mockReset();
});

function sessionFor(roles: Role[], actor: Partial<Actor> = {}): SessionDto {
  return {
    user: { id: 'u1', email: 'theo@x.test', displayName: 'Theo Lindqvist', unitPref: 'kg' },
    memberships: [
      {
        id: 'm-theo',
        organizationId: ORG,
        organizationName: 'Harbor Point Performance',
        roles,
        actor: {
          userId: 'u1',
          organizationId: ORG,
          membershipId: 'm-theo',
          roles,
          coachOf: [],
          clinicianOf: [],
          guardianOf: [],
          ...actor,
        },
      },
    ],
    csrfToken: 'token-1',
  };
}

const SIGNED_OUT: SessionDto = { user: null, memberships: [], csrfToken: 'token-0' };

function maya(over: Partial<AthleteProfileDto> = {}): AthleteProfileDto {
  return {
    id: 'm-maya',
    organizationId: ORG,
    displayName: 'Maya Torres',
    dateOfBirth: '2010-03-14',
    age: 15,
    isMinor: true,
    needsGuardian: false,
    sport: 'Softball',
    position: 'Shortstop',
    version: 1,
    careTeam: [
      { id: 'c1', organizationId: ORG, athleteId: 'm-maya', athleteName: 'Maya Torres', memberId: 'm-theo', memberName: 'Theo Lindqvist', role: 'coach' },
    ],
    guardians: [],
    ...over,
  };
}

/** Answers by path; anything unexpected is a 404 so a stray call shows up in the page. */
function serve(routesByPath: Record<string, unknown>) {
  fetchMock.mockImplementation(async (input) => {
    const path = String(input).replace(/^\/api/, '').split('?')[0];
    if (path in routesByPath) return jsonResponse(200, routesByPath[path]);
    return jsonResponse(404, { error: { code: 'not_found', message: `No ${path}` }, requestId: 'r' });
  });
}

function renderAt(path: string) {
  const router = createMemoryRouter(routes, { initialEntries: [path] });
  render(
    <QueryClientProvider client={createQueryClient()}>
      <RouterProvider router={router} />
    </QueryClientProvider>,
  );
  return router;
}

describe('app routes', () => {
  it('sends a signed-out visitor to the sign-in page, with the caution in the footer', async () => {
    serve({ '/session': SIGNED_OUT });
    const router = renderAt('/admin');
    expect(await screen.findByRole('heading', { name: 'Sign in to Loadline' })).toBeInTheDocument();
    expect(router.state.location.pathname).toBe('/sign-in');
    expect(screen.getByText(/does not diagnose or treat/)).toBeInTheDocument();
  });

  it('opens a coach on "My athletes" with their care-team athletes and who they are', async () => {
    serve({ '/session': sessionFor(['coach'], { coachOf: ['m-maya'] }), [`/orgs/${ORG}/athletes`]: [maya()] });
    const router = renderAt('/');
    expect(await screen.findByRole('heading', { name: 'My athletes' })).toBeInTheDocument();
    expect(router.state.location.pathname).toBe('/coach');
    expect(await screen.findByText('Maya Torres')).toBeInTheDocument();
    expect(screen.getByText('theo@x.test · Coach')).toBeInTheDocument();
    expect(screen.getByRole('button', { name: 'Sign out' })).toBeInTheDocument();
    expect(screen.getByText('Programs and caps arrive in a coming release')).toBeInTheDocument();
  });

  it('refuses an admin page to a coach in words', async () => {
    serve({ '/session': sessionFor(['coach']) });
    renderAt('/admin');
    expect(await screen.findByRole('alert')).toHaveTextContent("You can't do that: this page is for people with the admin role");
  });

  it('shows the role switcher only to people with several roles, and follows it', async () => {
    serve({
      '/session': sessionFor(['admin', 'coach'], { coachOf: ['m-maya'] }),
      [`/orgs/${ORG}/athletes`]: [maya()],
      [`/orgs/${ORG}/people`]: [],
    });
    const router = renderAt('/');
    const views = await screen.findByRole('navigation', { name: 'Your views' });
    expect(await screen.findByRole('heading', { name: 'My athletes' })).toBeInTheDocument();
    fireEvent.click(screen.getByRole('link', { name: 'Organization' }));
    expect(await screen.findByRole('heading', { name: 'People' })).toBeInTheDocument();
    expect(router.state.location.pathname).toBe('/admin/people');
    expect(views).toBeInTheDocument();
  });

  it('shows a guardian their athlete and the warning signs without a click', async () => {
    const session = sessionFor(['guardian'], { guardianOf: ['m-maya'] });
    serve({
      '/session': session,
      [`/orgs/${ORG}`]: { id: ORG, name: 'Harbor Point Performance', emergencyNumber: '911' },
      [`/orgs/${ORG}/athletes`]: [
        maya({ guardians: [{ id: 'g1', organizationId: ORG, athleteId: 'm-maya', athleteName: 'Maya Torres', guardianId: 'm-theo', guardianName: 'Theo Lindqvist' }] }),
      ],
    });
    renderAt('/');
    expect(await screen.findByRole('heading', { name: 'Your athlete' })).toBeInTheDocument();
    expect(await screen.findByRole('heading', { name: 'Maya Torres' })).toBeInTheDocument();
    expect(screen.getByRole('heading', { name: /Warning signs/ })).toBeInTheDocument();
    expect(await screen.findByText(/In an emergency call/)).toHaveTextContent('911');
    expect(screen.queryByRole('navigation', { name: 'Your views' })).not.toBeInTheDocument();
  });
});
