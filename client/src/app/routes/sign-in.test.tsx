import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { fireEvent, render, screen } from '@testing-library/react';
import { QueryClientProvider } from '@tanstack/react-query';
import { RouterProvider, createMemoryRouter } from 'react-router-dom';
import type { SessionDto } from '../../../../policies/dto';
import { createQueryClient } from '../../lib/query-client';
import { jsonResponse } from '../../test/render';
import { loadAllScreens } from '../../test/lazy-routes';
import { routes } from '../router';

await loadAllScreens(routes);

const fetchMock = vi.fn<typeof fetch>();
beforeEach(() => vi.stubGlobal('fetch', fetchMock));
afterEach(() => {
  vi.unstubAllGlobals();
  fetchMock.mockReset();
});

const SIGNED_OUT: SessionDto = { user: null, memberships: [], csrfToken: 'token-0' };
const WAITING: SessionDto = { user: null, memberships: [], csrfToken: 'token-1', secondStep: true };

function renderAt(path: string) {
  const router = createMemoryRouter(routes, { initialEntries: [path] });
  render(
    <QueryClientProvider client={createQueryClient()}>
      <RouterProvider router={router} />
    </QueryClientProvider>,
  );
  return router;
}

describe('the sign-in page with two-step sign-in', () => {
  it('after a right password, asks for the code instead of going in; "Start again" goes back to the password', async () => {
    fetchMock.mockImplementation(async (input, init) => {
      const url = String(input);
      if (url === '/api/session' && init?.method === 'POST') return jsonResponse(200, WAITING);
      if (url === '/api/session') return jsonResponse(200, SIGNED_OUT);
      throw new Error(`unexpected ${url}`);
    });
    const router = renderAt('/sign-in');
    fireEvent.change(await screen.findByLabelText('E-mail'), { target: { value: 'priya@example.test' } });
    fireEvent.change(screen.getByLabelText('Password'), { target: { value: 'the right passphrase' } });
    fireEvent.click(screen.getByRole('button', { name: 'Sign in' }));

    expect(await screen.findByRole('heading', { name: 'One more step' })).toBeInTheDocument();
    expect(screen.getByLabelText('Sign-in code', { exact: true })).toBeInTheDocument();
    expect(router.state.location.pathname).toBe('/sign-in');

    fireEvent.click(screen.getByRole('button', { name: 'Start again' }));
    expect(await screen.findByRole('heading', { name: 'Sign in to Loadline' })).toBeInTheDocument();
  });

  it('a reload while the code is awaited shows the code screen again', async () => {
    fetchMock.mockImplementation(async () => jsonResponse(200, WAITING));
    renderAt('/sign-in');
    expect(await screen.findByRole('heading', { name: 'One more step' })).toBeInTheDocument();
  });

  it('links to the forgotten-password page', async () => {
    fetchMock.mockImplementation(async () => jsonResponse(200, SIGNED_OUT));
    const router = renderAt('/sign-in');
    fireEvent.click(await screen.findByRole('link', { name: 'Forgot your password?' }));
    expect(await screen.findByRole('heading', { name: 'Forgot your password?' })).toBeInTheDocument();
    expect(router.state.location.pathname).toBe('/forgot-password');
  });
});
