import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { act, renderHook } from '@testing-library/react';
import type { ReactNode } from 'react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { useSignOut } from './sign-out';

/**
 * A shared phone: the athlete taps "Sign out" and the page is closed (or left) before the server
 * answers. Their offline copy and outbox must already be gone, or the next start would put the last
 * person's screens back (OWASP ASVS 5.0 V14.3.1: authenticated data cleared from client storage when
 * the session ends).
 */
describe('sign-out', () => {
  afterEach(() => {
    vi.unstubAllGlobals();
    localStorage.clear();
  });

  it('clears the offline copies and the outbox as soon as it is asked for, before the server answers', async () => {
    localStorage.setItem('loadline.offline.last-user', 'user-maya');
    localStorage.setItem('loadline.offline.user.user-maya', JSON.stringify([{ key: ['session'], data: {}, updatedAt: 1 }]));
    localStorage.setItem('loadline.outbox.user-maya', JSON.stringify([{ key: 'k1' }]));
    localStorage.setItem('unrelated', 'kept');
    // The server never answers: the page is about to be closed.
    vi.stubGlobal(
      'fetch',
      vi.fn(() => new Promise<Response>(() => {})),
    );
    const client = new QueryClient();
    const wrapper = ({ children }: { children: ReactNode }) => <QueryClientProvider client={client}>{children}</QueryClientProvider>;
    const { result } = renderHook(() => useSignOut(), { wrapper });

    act(() => result.current.mutate());

    await vi.waitFor(() => expect(localStorage.getItem('loadline.offline.last-user')).toBeNull());
    expect(Object.keys(localStorage).filter((k) => k.startsWith('loadline.'))).toEqual([]);
    expect(localStorage.getItem('unrelated')).toBe('kept');
    await vi.waitFor(() => expect(result.current.isPending).toBe(true));
  });
});
