import { format, isValid, parseISO } from 'date-fns';

/** '2025-03-14' → '14 Mar 2025'. Calendar dates are parsed as local dates, never shifted by a zone. */
export function formatDate(isoDate: string | null | undefined): string {
  if (!isoDate) return '—';
  const parsed = parseISO(isoDate);
  return isValid(parsed) ? format(parsed, 'd MMM yyyy') : isoDate;
}

/** An instant → '14 Mar 2025, 09:30' in the viewer's own time zone. */
export function formatDateTime(isoInstant: string | null | undefined): string {
  if (!isoInstant) return '—';
  const parsed = parseISO(isoInstant);
  return isValid(parsed) ? format(parsed, 'd MMM yyyy, HH:mm') : isoInstant;
}

export function joinNames(names: string[]): string {
  if (names.length <= 1) return names[0] ?? '';
  return `${names.slice(0, -1).join(', ')} and ${names[names.length - 1]}`;
}
