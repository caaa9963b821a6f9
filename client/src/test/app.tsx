import { afterEach, beforeEach, vi } from 'vitest';
import { render } from '@testing-library/react';
import { QueryClientProvider } from '@tanstack/react-query';
import { RouterProvider, createMemoryRouter } from 'react-router-dom';
import type { Actor } from '../../../policies/access';
import type { CaseloadRowDto, SessionDto } from '../../../policies/dto';
import type { Role } from '../../../policies/roles';
import { routes } from '../app/router';
import { setOrgTimeZone } from '../lib/dates';
import { createQueryClient } from '../lib/query-client';
import { jsonResponse } from './render';
import { loadAllScreens } from './lazy-routes';

/** The whole app in memory, as a signed-in person sees it, with the API answered by path. */

await loadAllScreens(routes);

export const ORG = '11111111-1111-4111-8111-111111111111';
export const fetchMock = vi.fn<typeof fetch>();

/** Call at the top of a test file: every test starts with a fresh fetch stub and empty storage. */
export function stubFetch(): void {
  beforeEach(() => {
    vi.stubGlobal('fetch', fetchMock);
    localStorage.clear();
    sessionStorage.clear();
  });
  afterEach(() => {
    vi.unstubAllGlobals();
    fetchMock.mockReset();
    setOrgTimeZone(null);
  });
}

/** Theo, signed in with these roles in one organization (in UTC unless another zone is given). */
export function sessionFor(roles: Role[], actor: Partial<Actor> = {}, timeZone = 'UTC'): SessionDto {
  return {
    user: { id: 'u1', email: 'theo@x.test', displayName: 'Theo Lindqvist', unitPref: 'kg' },
    memberships: [
      {
        id: 'm-theo',
        organizationId: ORG,
        organizationName: 'Harbor Point Performance',
        timeZone,
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

export function mayaRow(over: Partial<CaseloadRowDto> = {}): CaseloadRowDto {
  return {
    athleteId: 'm-maya',
    athleteName: 'Maya Torres',
    age: 16,
    isMinor: true,
    sport: 'Softball',
    status: 'limited',
    statusEffectiveFrom: '2026-03-02',
    openCaseCount: 1,
    openCaseId: 'c-1',
    nextReviewDate: '2026-03-16',
    latestPainReport: null,
    ...over,
  };
}

/** Answers by path; anything unexpected is a 404 so a stray call shows up in the page. */
export function serve(routesByPath: Record<string, unknown>): void {
  fetchMock.mockImplementation(async (input) => {
    const path = String(input)
      .replace(/^\/api/, '')
      .split('?')[0];
    if (path in routesByPath) return jsonResponse(200, routesByPath[path]);
    return jsonResponse(404, { error: { code: 'not_found', message: `No ${path}` }, requestId: 'r' });
  });
}

/** The query strings the app sent to one path, e.g. which day it asked the limits for. */
export function queriesTo(path: string): URLSearchParams[] {
  return fetchMock.mock.calls
    .map(([input]) => String(input).replace(/^\/api/, ''))
    .filter((url) => url.split('?')[0] === path)
    .map((url) => new URLSearchParams(url.split('?')[1] ?? ''));
}

export function renderAt(path: string) {
  const router = createMemoryRouter(routes, { initialEntries: [path] });
  render(
    <QueryClientProvider client={createQueryClient()}>
      <RouterProvider router={router} />
    </QueryClientProvider>,
  );
  return router;
}
