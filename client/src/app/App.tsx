import { useState } from 'react';
import { QueryClientProvider } from '@tanstack/react-query';
import { RouterProvider } from 'react-router-dom';
import { installOfflineCopy } from '../lib/offline-copy';
import { createQueryClient } from '../lib/query-client';
import { getSessionQueryOptions } from '../features/auth/api/get-session';
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
  return (
    <QueryClientProvider client={queryClient}>
      <RouterProvider router={router} />
    </QueryClientProvider>
  );
}
