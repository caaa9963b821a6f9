import { describe, expect, it } from 'vitest';
import { fireEvent, screen, within } from '@testing-library/react';
import type { AthleteProfileDto, RosterRowDto, SessionDto } from '../../../policies/dto';
import type { PatternRule } from '../../../policies/load/patterns';
import { ORG, mayaRow, renderAt, serve, sessionFor, stubFetch } from '../test/app';

const SIGNED_OUT: SessionDto = { user: null, memberships: [], csrfToken: 'token-0' };

stubFetch();

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
      {
        id: 'c1',
        organizationId: ORG,
        athleteId: 'm-maya',
        athleteName: 'Maya Torres',
        memberId: 'm-theo',
        memberName: 'Theo Lindqvist',
        memberEmail: 'theo.lindqvist@harborpoint.example',
        role: 'coach',
      },
    ],
    guardians: [],
    ...over,
  };
}

describe('app routes', () => {
  it('sends a signed-out visitor to the sign-in page, with the caution in the footer', async () => {
    serve({ '/session': SIGNED_OUT });
    const router = renderAt('/admin');
    expect(await screen.findByRole('heading', { name: 'Sign in to Loadline' })).toBeInTheDocument();
    expect(router.state.location.pathname).toBe('/sign-in');
    expect(screen.getByText(/does not diagnose or treat/)).toBeInTheDocument();
  });

  it('opens a coach on "My athletes" with their care-team athletes, their status and who they are', async () => {
    const roster: RosterRowDto = {
      athleteId: 'm-maya',
      athleteName: 'Maya Torres',
      status: 'limited',
      limitsToday: ['Hinge: up to 60% of your best lift'],
      sessionsOnHold: 1,
      pendingExceptions: 0,
      nextSession: null,
    };
    serve({ '/session': sessionFor(['coach'], { coachOf: ['m-maya'] }), [`/orgs/${ORG}/roster`]: [roster] });
    const router = renderAt('/');
    expect(await screen.findByRole('heading', { name: 'My athletes' })).toBeInTheDocument();
    expect(router.state.location.pathname).toBe('/coach');
    expect(await screen.findByRole('link', { name: 'Maya Torres' })).toHaveAttribute('href', '/coach/athletes/m-maya');
    const table = screen.getByRole('region', { name: 'Athletes you coach' });
    expect(within(table).getByRole('img', { name: 'Participation status: Limited' })).toBeInTheDocument();
    expect(screen.getByText('theo@x.test · Coach')).toBeInTheDocument();
    expect(screen.getByRole('button', { name: 'Sign out' })).toBeInTheDocument();
    expect(within(table).getByText('Hinge: up to 60% of your best lift')).toBeInTheDocument();
    expect(within(table).getByText('1 on hold')).toBeInTheDocument();
    expect(screen.getByRole('button', { name: 'New program' })).toBeInTheDocument();
  });

  it('opens a clinician on "My caseload" with their athletes only, and no pain report yet', async () => {
    serve({
      '/session': sessionFor(['clinician', 'admin'], { clinicianOf: ['m-maya'] }),
      [`/orgs/${ORG}/caseload`]: [mayaRow(), mayaRow({ athleteId: 'm-sam', athleteName: 'Sam Whitfield', status: 'full' })],
    });
    renderAt('/clinician');
    expect(await screen.findByRole('heading', { name: 'My caseload' })).toBeInTheDocument();
    expect(await screen.findByRole('link', { name: 'Maya Torres' })).toHaveAttribute('href', '/clinician/athletes/m-maya');
    expect(screen.queryByText('Sam Whitfield')).not.toBeInTheDocument();
    expect(screen.getByText('none yet')).toBeInTheDocument();
    expect(screen.getByRole('link', { name: 'Audit trail' })).toHaveAttribute('href', '/clinician/audit');
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
        maya({
          guardians: [
            {
              id: 'g1',
              organizationId: ORG,
              athleteId: 'm-maya',
              athleteName: 'Maya Torres',
              guardianId: 'm-theo',
              guardianName: 'Theo Lindqvist',
            },
          ],
        }),
      ],
    });
    renderAt('/');
    expect(await screen.findByRole('heading', { name: 'Your athlete' })).toBeInTheDocument();
    expect(await screen.findByRole('heading', { name: 'Maya Torres' })).toBeInTheDocument();
    expect(screen.getByRole('heading', { name: /Warning signs/ })).toBeInTheDocument();
    expect(await screen.findByText(/In an emergency call/)).toHaveTextContent('911');
    expect(screen.queryByRole('navigation', { name: 'Your views' })).not.toBeInTheDocument();
  });

  it("shows an athlete today's limits in plain words, the pain ceiling and the guidance", async () => {
    const patterns: Record<string, PatternRule> = Object.fromEntries(
      [
        'hinge',
        'squat',
        'lunge',
        'horizontal_push',
        'vertical_push',
        'horizontal_pull',
        'vertical_pull',
        'carry',
        'rotation',
        'jump',
        'sprint',
        'throw',
        'swing',
      ].map((p) => [p, { mode: 'free' } as PatternRule]),
    );
    patterns.hinge = { mode: 'capped', caps: { maxPercent1RM: 60 } };
    patterns.jump = { mode: 'blocked' };
    const stage = { id: 's1', label: 'Protect', startDate: '2026-03-02', endDate: '2026-03-14', painCeiling: 4, patterns: {} };
    serve({
      '/session': sessionFor(['athlete'], { membershipId: 'm-theo' }),
      [`/orgs/${ORG}`]: { id: ORG, name: 'Harbor Point Performance', emergencyNumber: '911' },
      [`/orgs/${ORG}/athletes/m-theo`]: maya({ id: 'm-theo', displayName: 'Theo Lindqvist' }),
      [`/orgs/${ORG}/athletes/m-theo/in-force`]: {
        date: '2026-03-05',
        athleteId: 'm-theo',
        stages: [{ planId: 'p1', caseId: 'c1', planVersion: 1, stage }],
        patterns,
        painCeiling: 4,
        restricted: true,
        status: 'limited',
        statusEffectiveFrom: '2026-03-02',
        guidance: ['Walk and cycle freely.'],
      },
    });
    renderAt('/athlete');
    expect(await screen.findByRole('heading', { name: 'What you may do today' })).toBeInTheDocument();
    expect(screen.getByText('Jump / landing: not allowed for now')).toBeInTheDocument();
    expect(screen.getByText('Hinge: up to 60% of your best lift')).toBeInTheDocument();
    expect(screen.getByText(/Everything else has no limits: squat/)).toBeInTheDocument();
    expect(screen.getByText('These limits apply until 14 March 2026.')).toBeInTheDocument();
    expect(screen.getByText('Stop a session and tell your clinician if pain rises past 4/10.')).toBeInTheDocument();
    expect(screen.getByText('Walk and cycle freely.')).toBeInTheDocument();
    expect(screen.getByRole('img', { name: /Participation status: Limited/ })).toBeInTheDocument();
  });
});
