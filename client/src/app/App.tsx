import { useState } from 'react';
import { QueryClientProvider } from '@tanstack/react-query';
import { RouterProvider } from 'react-router-dom';
import { installOfflineCopy } from '../lib/offline-copy';
import { createQueryClient } from '../lib/query-client';
import { createAppRouter } from './router';

export function App() {
  const [queryClient] = useState(() => {
    const client = createQueryClient();
    // Before the first render, so a start without signal shows the last visit's screens.
    installOfflineCopy(client);
    return client;
  });
  const [router] = useState(createAppRouter);
  return (
    <QueryClientProvider client={queryClient}>
      <RouterProvider router={router} />
    </QueryClientProvider>
  );
}
