import { BODY_REGION_LABELS, type BodyRegion } from '../../../../../policies/body-regions';

export function regionsText(regions: readonly BodyRegion[] | undefined): string {
  if (!regions || regions.length === 0) return 'No body region recorded';
  return regions.map((r) => BODY_REGION_LABELS[r]).join(', ');
}

export const STALE_CASE =
  'Someone changed this case after you opened it, so your change was not saved. Load the latest case, check it, then make your change again.';
