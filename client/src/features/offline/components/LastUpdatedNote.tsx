import { Notice } from '../../../components/ui/Notice';
import { orgDayOf, todayLocal } from '../../../lib/dates';
import { formatDate, formatDateTime } from '../../../lib/format';
import { oldestCopyShown } from '../../../lib/offline-copy';

/**
 * Marks a screen shown from the copy of an earlier visit (lib/offline-copy.ts) with when that copy
 * was made; nothing when everything on it was refreshed during this visit. A copy saved on an earlier
 * day than today says so plainly: what it shows for "today" is that day's, and the clinician's word
 * comes first.
 */
export function LastUpdatedNote({
  queries,
  audience = 'athlete',
}: {
  queries: { data: unknown; dataUpdatedAt: number }[];
  /** The athlete reads about their own training; a guardian about the athlete's. */
  audience?: 'athlete' | 'family';
}) {
  const at = oldestCopyShown(queries);
  if (at === null) return null;
  const instant = new Date(at).toISOString();
  const savedDay = orgDayOf(instant);
  return (
    <Notice tone="caution" role="status" title={`Last updated ${formatDateTime(instant)}`}>
      <p>Loadline can&apos;t be reached right now, so this is what your phone kept from your last visit. It may have changed since.</p>
      {savedDay < todayLocal() && (
        <p>
          It was saved on {formatDate(savedDay)}, so what it shows for today may be out of date.{' '}
          {audience === 'family'
            ? 'Check with the clinician or coach before your athlete trains on it.'
            : 'Check with your clinician before you train on it.'}
        </p>
      )}
    </Notice>
  );
}
