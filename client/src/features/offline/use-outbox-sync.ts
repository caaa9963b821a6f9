import { useEffect } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import { flushOutbox, outboxOf } from '../../lib/offline-queue';

/** How often to try again while something waits and the browser did not say it is back online. */
const RETRY_MS = 30_000;

/**
 * Sends the signed-in person's outbox when the app opens, when the browser says it is back online,
 * and every half minute while something waits; what arrived refreshes that organization's screens.
 */
export function useOutboxSync(userId: string) {
  const queryClient = useQueryClient();
  useEffect(() => {
    const flush = () => {
      if (!outboxOf(userId).some((i) => i.state === 'waiting')) return;
      void flushOutbox(userId, (item) => void queryClient.invalidateQueries({ queryKey: ['orgs', item.orgId] }));
    };
    flush();
    window.addEventListener('online', flush);
    const timer = window.setInterval(flush, RETRY_MS);
    return () => {
      window.removeEventListener('online', flush);
      window.clearInterval(timer);
    };
  }, [userId, queryClient]);
}
