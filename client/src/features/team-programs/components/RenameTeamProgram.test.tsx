import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { fireEvent, screen, waitFor } from '@testing-library/react';
import { setCsrfToken } from '../../../lib/api-client';
import { jsonResponse, renderWithProviders } from '../../../test/render';
import { RenameTeamProgram } from './RenameTeamProgram';

const ORG = '11111111-1111-4111-8111-111111111111';
const PROGRAM = '22222222-2222-4222-8222-222222222222';

const fetchMock = vi.fn<typeof fetch>();
beforeEach(() => {
  vi.stubGlobal('fetch', fetchMock);
  setCsrfToken('token-1');
});
afterEach(() => {
  vi.unstubAllGlobals();
  fetchMock.mockReset();
});

const sent = () =>
  fetchMock.mock.calls
    .filter(([, init]) => init?.method === 'PATCH')
    .map(([input, init]) => ({ url: String(input), body: JSON.parse(String(init!.body)) as { name: string; version: number } }));

function open(onReload = vi.fn()) {
  renderWithProviders(<RenameTeamProgram orgId={ORG} program={{ id: PROGRAM, name: 'Pre-season', version: 3 }} onReload={onReload} />);
  fireEvent.click(screen.getByRole('button', { name: 'Rename this program' }));
  return onReload;
}

describe('RenameTeamProgram', () => {
  it('sends the new name with the version it was read at, and says it was renamed', async () => {
    fetchMock.mockResolvedValue(jsonResponse(200, { id: PROGRAM, name: 'In-season', version: 4 }));
    open();
    const name = screen.getByLabelText(/Program name/);
    expect(name).toHaveValue('Pre-season');
    fireEvent.change(name, { target: { value: 'In-season' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save the name' }));
    expect(await screen.findByRole('status')).toHaveTextContent('Renamed to “In-season”');
    expect(sent()).toEqual([
      { url: expect.stringContaining(`/orgs/${ORG}/team-programs/${PROGRAM}`), body: { name: 'In-season', version: 3 } },
    ]);
    expect(screen.queryByRole('form', { name: 'Rename the team program' })).toBeNull();
  });

  it('refuses an empty name before sending, naming the field', async () => {
    open();
    fireEvent.change(screen.getByLabelText(/Program name/), { target: { value: '' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save the name' }));
    expect(await screen.findByText('Program name is required')).toBeInTheDocument();
    expect(sent()).toEqual([]);
  });

  it('on a stale version (409) says so in words, blocks saving again, and reloads on request', async () => {
    fetchMock.mockResolvedValue(
      jsonResponse(409, {
        error: { code: 'version_conflict', message: 'This team program was changed by someone else.' },
        requestId: 'r1',
      }),
    );
    const onReload = open();
    fireEvent.change(screen.getByLabelText(/Program name/), { target: { value: 'In-season' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save the name' }));
    const alert = await screen.findByRole('alert');
    expect(alert).toHaveTextContent('Someone else changed this team program since you opened it. Reload it to see the latest');
    expect(screen.getByRole('button', { name: 'Save the name' })).toBeDisabled();
    fireEvent.click(screen.getByRole('button', { name: 'Reload the team program' }));
    await waitFor(() => expect(onReload).toHaveBeenCalledTimes(1));
    await waitFor(() => expect(screen.queryByRole('alert')).toBeNull());
    expect(screen.getByRole('button', { name: 'Rename this program' })).toBeInTheDocument();
  });
});
