import { Notice } from '../../../components/ui/Notice';
import { formatDateTime } from '../../../lib/format';
import { oldestCopyShown } from '../../../lib/offline-copy';

/**
 * Marks a screen shown from the copy of an earlier visit (lib/offline-copy.ts) with when that copy
 * was made; nothing when everything on it was refreshed during this visit.
 */
export function LastUpdatedNote({ queries }: { queries: { data: unknown; dataUpdatedAt: number }[] }) {
  const at = oldestCopyShown(queries);
  if (at === null) return null;
  return (
    <Notice tone="caution" role="status" title={`Last updated ${formatDateTime(new Date(at).toISOString())}`}>
      <p>Loadline can&apos;t be reached right now, so this is what your phone kept from your last visit. It may have changed since.</p>
    </Notice>
  );
}
