import { queryOptions, useQuery } from '@tanstack/react-query';
import type { LetterCheckDto } from '../../../../../policies/dto';
import { api } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';

const STATUSES: readonly LetterCheckDto['status'][] = ['valid', 'scheduled', 'expired', 'superseded', 'unknown'];

const text = (value: unknown): string | undefined => (typeof value === 'string' && value.trim() ? value : undefined);

/**
 * Keeps only what the public page may show. Whatever else an answer might carry (a name, limits,
 * a note) is dropped here, before any component can see it.
 */
export function pickCheckFields(raw: unknown): LetterCheckDto {
  const body = (typeof raw === 'object' && raw !== null ? raw : {}) as Record<string, unknown>;
  const status = STATUSES.find((s) => s === body.status) ?? 'unknown';
  if (status === 'unknown') return { status };
  return {
    status,
    athleteInitials: text(body.athleteInitials),
    decision: text(body.decision),
    effectiveFrom: text(body.effectiveFrom),
    validUntil: text(body.validUntil) ?? null,
    organizationName: text(body.organizationName),
    issuedOn: text(body.issuedOn),
    // Only the fact, as a boolean: never what the newer decision is.
    ...(body.newerDecision === true ? { newerDecision: true } : {}),
  };
}

/** Public: no sign-in. Case, spaces and dashes in the code do not matter to the server. */
export async function checkLetter(code: string): Promise<LetterCheckDto> {
  return pickCheckFields(await api.post<unknown>('/check', { code }));
}

export function getLetterCheckQueryOptions(code: string) {
  return queryOptions({
    queryKey: queryKeys.letterCheck(code),
    queryFn: () => checkLetter(code),
    // A letter's standing changes only on a start date, after its valid-until date or when a later one is signed; a fresh visit asks again.
    staleTime: 60_000,
    retry: false,
  });
}

export function useLetterCheck(code: string | null) {
  return useQuery({ ...getLetterCheckQueryOptions(code ?? ''), enabled: code !== null });
}
