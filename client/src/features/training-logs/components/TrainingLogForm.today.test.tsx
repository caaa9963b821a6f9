import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { screen } from '@testing-library/react';
import { setOrgTimeZone } from '../../../lib/dates';
import { renderWithProviders } from '../../../test/render';
import { TrainingLogForm } from './TrainingLogForm';

/**
 * The session date counts in the organization's zone. At 21:30 UTC on 10 March it is already 08:30
 * on 11 March in Sydney: an athlete there logging this morning's session must be offered the 11th,
 * not the browser's (or the server's UTC) 10th, which the server would also refuse as the wrong day.
 */
beforeEach(() => {
  vi.stubEnv('TZ', 'UTC');
  vi.useFakeTimers({ toFake: ['Date'] });
  vi.setSystemTime(new Date('2026-03-10T21:30:00Z'));
});
afterEach(() => {
  vi.useRealTimers();
  vi.unstubAllEnvs();
  setOrgTimeZone(null);
});

describe('TrainingLogForm, in the organization’s day', () => {
  it('offers this morning in Sydney as the session date, and no later day, to a browser in UTC', () => {
    setOrgTimeZone('Australia/Sydney');
    renderWithProviders(<TrainingLogForm orgId="org-1" athleteId="a-1" unit="kg" onSaved={() => {}} />);
    const date = screen.getByLabelText('Session date');
    expect(date).toHaveValue('2026-03-11');
    expect(date).toHaveAttribute('max', '2026-03-11');
  });

  it('keeps the evening of the 10th in Los Angeles while UTC has moved on', () => {
    vi.setSystemTime(new Date('2026-03-11T02:00:00Z'));
    setOrgTimeZone('America/Los_Angeles');
    renderWithProviders(<TrainingLogForm orgId="org-1" athleteId="a-1" unit="kg" onSaved={() => {}} />);
    expect(screen.getByLabelText('Session date')).toHaveValue('2026-03-10');
  });
});
