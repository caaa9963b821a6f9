import { queryOptions, useQuery } from '@tanstack/react-query';
import type { LetterDto } from '../../../../../policies/dto';
import { api } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';

/** Clearance letters the reader may see, newest first; one athlete's, or every athlete's they may read. */
export function getLetters(orgId: string, athleteId: string | null): Promise<LetterDto[]> {
  return api.get<LetterDto[]>(`/orgs/${orgId}/letters`, { query: { athleteId } });
}

export function getLettersQueryOptions(orgId: string, athleteId: string | null) {
  return queryOptions({ queryKey: queryKeys.letters(orgId, athleteId), queryFn: () => getLetters(orgId, athleteId) });
}

const waiting = (letters: LetterDto[] | undefined) =>
  !!letters?.some((l) => l.deliveries?.some((d) => d.status === 'queued' || d.status === 'sending'));

/** `followDeliveries` asks again every few seconds while an e-mail is still on its way, so "Sent" shows up by itself. */
export function useLetters(orgId: string, athleteId: string | null, options: { followDeliveries?: boolean } = {}) {
  return useQuery({
    ...getLettersQueryOptions(orgId, athleteId),
    refetchInterval: options.followDeliveries ? (query) => (waiting(query.state.data) ? 4_000 : false) : false,
  });
}

/**
 * The letter in force: the server marks at most one 'signed' per athlete (the latest-signed that has
 * started, while its valid-until date has not passed). An expired letter is not in force.
 */
export function currentLetter(letters: LetterDto[]): LetterDto | null {
  return letters.find((l) => l.status === 'signed') ?? null;
}

/**
 * The latest-signed letter that has started but is past its valid-until date: the one that would be in
 * force, so a new letter is needed. The server marks at most one per athlete, and never beside a 'signed' one.
 */
export function expiredLetter(letters: LetterDto[]): LetterDto | null {
  return letters.find((l) => l.status === 'expired') ?? null;
}

/**
 * Signed letters not yet in force, the next to start first. Of two starting the same day the
 * later-signed one wins, and the list comes newest first, so a stable sort keeps it ahead.
 */
export function scheduledLetters(letters: LetterDto[]): LetterDto[] {
  return letters.filter((l) => l.status === 'scheduled').sort((a, b) => a.effectiveFrom.localeCompare(b.effectiveFrom));
}

/** Links rather than fetches: the server answers with an attachment, which the browser saves. */
export const letterPdfHref = (orgId: string, letterId: string) => `/api/orgs/${orgId}/letters/${letterId}/pdf`;
export const letterPreviewHref = (orgId: string, letterId: string) => `/api/orgs/${orgId}/letters/${letterId}/preview`;
