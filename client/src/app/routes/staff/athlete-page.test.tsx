import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { screen, within } from '@testing-library/react';
import type { CaseDto, InForceDto } from '../../../../../policies/dto';
import { MOVEMENT_PATTERNS, type PatternRule } from '../../../../../policies/load/patterns';
import type { Role } from '../../../../../policies/roles';
import { ORG, mayaRow, queriesTo, renderAt, serve, sessionFor, stubFetch } from '../../../test/app';

/**
 * The coach's and the clinician's page for one athlete: one frame, each role's own sections. The
 * organization is in Los Angeles and the browser in UTC; at 02:00 UTC on 10 March it is still the
 * evening of 9 March at the organization, and that is the "today" both pages count from.
 */

stubFetch();
beforeEach(() => {
  vi.stubEnv('TZ', 'UTC');
  vi.useFakeTimers({ toFake: ['Date'] });
  vi.setSystemTime(new Date('2026-03-10T02:00:00Z'));
});
afterEach(() => {
  vi.useRealTimers();
  vi.unstubAllEnvs();
});

const LA = 'America/Los_Angeles';
const DIAGNOSIS = 'Lumbar strain';
const NOTES = 'Tender at L4–L5';

/** Maya's open case as the server would send it to a clinician (diagnosis and notes included). */
const mayaCase: CaseDto = {
  id: 'c-1',
  organizationId: ORG,
  athleteId: 'm-maya',
  athleteName: 'Maya Torres',
  status: 'limited',
  statusEffectiveFrom: '2026-03-02',
  openedAt: '2026-03-02T17:00:00Z',
  closedOn: null,
  version: 1,
  bodyRegions: ['lower_back'],
  onsetDate: '2026-02-28',
  diagnosis: DIAGNOSIS,
  clinicalNotes: NOTES,
  statusNote: 'Light training only.',
  reviewDate: '2026-03-16',
  planId: null,
};

const inForce: InForceDto = {
  date: '2026-03-09',
  athleteId: 'm-maya',
  stages: [],
  patterns: Object.fromEntries(MOVEMENT_PATTERNS.map((p) => [p, { mode: 'free' } as PatternRule])) as InForceDto['patterns'],
  painCeiling: 5,
  restricted: false,
  status: 'limited',
  statusEffectiveFrom: '2026-03-02',
  guidance: [],
};

function open(path: string, roles: Role[], caseload = [mayaRow()]) {
  serve({
    '/session': sessionFor(roles, { coachOf: ['m-maya'], clinicianOf: ['m-maya'] }, LA),
    [`/orgs/${ORG}/caseload`]: caseload,
    [`/orgs/${ORG}/cases`]: [mayaCase],
    [`/orgs/${ORG}/athletes/m-maya/in-force`]: inForce,
  });
  return renderAt(path);
}

const region = (name: string) => screen.queryByRole('region', { name });

describe("a coach's page for an athlete", () => {
  it('shows status, limits in force for the organization’s today, letter, stages, programs and baselines', async () => {
    open('/coach/athletes/m-maya', ['coach']);
    expect(await screen.findByRole('heading', { level: 1, name: 'Maya Torres' })).toBeInTheDocument();
    expect(screen.getByRole('link', { name: '← My athletes' })).toHaveAttribute('href', '/coach');
    expect(screen.getByRole('link', { name: 'Workload and pain' })).toHaveAttribute('href', '/staff/athletes/m-maya/workload');
    expect(screen.getByText(/Softball · 16 years/)).toBeInTheDocument();

    expect(await screen.findByText('Today, Mon 9 Mar 2026. Program under these; the clinician sets them.')).toBeInTheDocument();
    expect(queriesTo(`/orgs/${ORG}/athletes/m-maya/in-force`).map((q) => q.get('date'))).toEqual(['2026-03-09']);

    for (const name of ['Status', 'What is allowed today', 'Clearance letter', 'Upcoming stages', 'Programs', 'Baselines'])
      expect(region(name), name).toBeInTheDocument();
    const status = region('Status')!;
    expect(await within(status).findByText('Lower back')).toBeInTheDocument();
    expect(within(status).getByText('“Light training only.”')).toBeInTheDocument();
  });

  it('has no place for clinical fields, even if a response carried them, and no case actions', async () => {
    open('/coach/athletes/m-maya', ['coach']);
    expect(await within(await screen.findByRole('region', { name: 'Status' })).findByText('Lower back')).toBeInTheDocument();
    expect(document.body).not.toHaveTextContent(DIAGNOSIS);
    expect(document.body).not.toHaveTextContent(NOTES);
    expect(screen.queryByRole('button', { name: 'Open a case' })).not.toBeInTheDocument();
    expect(region('Open cases')).not.toBeInTheDocument();
  });

  it('is the coach’s page on the coach’s address, also for someone who is a clinician too', async () => {
    open('/coach/athletes/m-maya', ['coach', 'clinician']);
    expect(await screen.findByRole('heading', { level: 1, name: 'Maya Torres' })).toBeInTheDocument();
    expect(region('Baselines')).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'Open a case' })).not.toBeInTheDocument();
  });

  it('says so when the athlete is not one of the coach’s', async () => {
    open('/coach/athletes/m-maya', ['coach'], []);
    expect(await screen.findByRole('alert')).toHaveTextContent('Not one of your athletes');
    expect(screen.queryByRole('heading', { level: 1, name: 'Maya Torres' })).not.toBeInTheDocument();
  });
});

describe("a clinician's page for an athlete", () => {
  it('shows the status in the header, the cases, what is in force on the organization’s today, clips and letters', async () => {
    open('/clinician/athletes/m-maya', ['clinician']);
    expect(await screen.findByRole('heading', { level: 1, name: 'Maya Torres' })).toBeInTheDocument();
    expect(screen.getByRole('link', { name: '← My caseload' })).toHaveAttribute('href', '/clinician');
    expect(screen.getByRole('img', { name: /^Participation status: Limited/ })).toBeInTheDocument();
    expect(screen.getByText('since Mon 2 Mar 2026')).toBeInTheDocument();
    expect(screen.getByRole('button', { name: 'Open a case' })).toBeInTheDocument();
    expect(await screen.findByRole('region', { name: 'Open cases' })).toBeInTheDocument();

    expect(region('What is allowed on')).toBeInTheDocument();
    expect(screen.getByLabelText('Date to check')).toHaveValue('2026-03-09');
    expect(screen.queryByRole('button', { name: 'Back to today' })).not.toBeInTheDocument();
    for (const name of ['What is allowed today', 'Limits in force', 'In force on', 'Status', 'Programs', 'Baselines'])
      expect(region(name), name).not.toBeInTheDocument();
  });

  it('says so when the athlete is not in the clinician’s caseload', async () => {
    open('/clinician/athletes/m-maya', ['clinician'], []);
    expect(await screen.findByRole('alert')).toHaveTextContent('Not in your caseload');
  });
});
