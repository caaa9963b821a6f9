import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { screen } from '@testing-library/react';
import type { ExerciseDto, ProgramSessionDto } from '../../../../../policies/dto';
import { PROGRAM_CAUTION } from '../../../../../policies/cautions';
import { setCsrfToken } from '../../../lib/api-client';
import { jsonResponse, renderWithProviders } from '../../../test/render';
import { SessionEditor } from './SessionEditor';

const ORG = '11111111-1111-4111-8111-111111111111';
const SAM = '22222222-2222-4222-8222-222222222222';
const DEADLIFT = '33333333-3333-4333-8333-333333333333';

const deadlift: ExerciseDto = {
  id: DEADLIFT,
  name: 'Deadlift',
  patterns: ['hinge'],
  equipment: 'barbell',
  ballistic: false,
  steps: { kind: 'increment', step: 2.5, unit: 'kg' },
  referenceId: null,
  useInstead: [],
  archived: false,
  version: 1,
};

const session: ProgramSessionDto = {
  id: '44444444-4444-4444-8444-444444444444',
  programId: 'p1',
  programName: 'Return block',
  date: '2027-01-05',
  title: 'Day 1',
  status: 'draft',
  publishedAt: null,
  version: 1,
  holds: [],
  content: {
    exercises: [
      {
        id: 'e1e1e1e1-0000-4000-8000-000000000001',
        exerciseId: DEADLIFT,
        sets: [{ id: '55555555-5555-4555-8555-555555555555', reps: 5, load: { kind: 'kg', value: 80 }, targetRpe: 6 }],
      },
    ],
  },
};

const fetchMock = vi.fn<typeof fetch>();
beforeEach(() => {
  vi.stubGlobal('fetch', fetchMock);
  setCsrfToken('token-1');
  fetchMock.mockImplementation(async () => jsonResponse(200, { results: [{ athleteId: SAM, breaches: [] }] }));
});
afterEach(() => {
  vi.unstubAllGlobals();
  fetchMock.mockReset();
});

describe('the program builder', () => {
  it('carries its own caution right under Publish, in the product brief’s words (shared/PRODUCT.md, cautions)', () => {
    renderWithProviders(
      <SessionEditor
        orgId={ORG}
        unit="kg"
        athletes={[{ id: SAM, name: 'Sam Whitfield' }]}
        session={session}
        library={[deadlift]}
        engines={[]}
        exceptions={[]}
        onReload={async () => null}
        onDeleted={vi.fn()}
      />,
    );
    const caution = screen.getByRole('note', { name: 'Caution' });
    expect(caution).toHaveTextContent(`${PROGRAM_CAUTION.lead} ${PROGRAM_CAUTION.text}`);
    expect(caution).toHaveTextContent('does not diagnose, treat or replace professional care');
    // Beside the action: the bar holding Publish is the element just before it.
    expect(caution.previousElementSibling).toContainElement(screen.getByRole('button', { name: 'Publish' }));
  });
});
