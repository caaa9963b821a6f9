import { useEffect, useState } from 'react';
import { QueryClientProvider } from '@tanstack/react-query';
import { RouterProvider } from 'react-router-dom';
import { installOfflineCopy } from '../lib/offline-copy';
import { createQueryClient } from '../lib/query-client';
import { getSessionQueryOptions } from '../features/auth/api/get-session';
import { registerServiceWorkerWhenIdle } from '../lib/register-service-worker';
import { createAppRouter } from './router';

export function App() {
  const [queryClient] = useState(() => {
    const client = createQueryClient();
    // Before the first render, so a start without signal shows the last visit's screens.
    installOfflineCopy(client);
    // Asked for at once, while the first screen's code is still loading, rather than after it.
    void client.prefetchQuery(getSessionQueryOptions());
    return client;
  });
  const [router] = useState(createAppRouter);
  useEffect(() => {
    if (!import.meta.env.PROD) return;
    const screen = {
      settled: () => router.state.initialized && router.state.navigation.state === 'idle',
      subscribe: (onChange: () => void) => router.subscribe(onChange),
    };
    registerServiceWorkerWhenIdle(() => {
      void import('virtual:pwa-register').then(({ registerSW }) => registerSW({ immediate: true }));
    }, screen);
  }, [router]);
  return (
    <QueryClientProvider client={queryClient}>
      <RouterProvider router={router} />
    </QueryClientProvider>
  );
}
