import { infiniteQueryOptions, useInfiniteQuery } from '@tanstack/react-query';
import type { AuditEntryDto } from '../../../../../policies/dto';
import { api } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';

export interface AuditFilters {
  action?: string;
  actorId?: string;
  subjectId?: string;
  athleteId?: string;
  from?: string;
  to?: string;
}

export interface AuditPage {
  entries: AuditEntryDto[];
  nextBefore: number | null;
}

export const AUDIT_PAGE_SIZE = 50;

export function getAudit(orgId: string, filters: AuditFilters, before?: number): Promise<AuditPage> {
  return api.get<AuditPage>(`/orgs/${orgId}/audit`, {
    query: { ...filters, limit: AUDIT_PAGE_SIZE, before },
  });
}

export function getAuditQueryOptions(orgId: string, filters: AuditFilters) {
  return infiniteQueryOptions({
    queryKey: [...queryKeys.audit(orgId), filters] as const,
    queryFn: ({ pageParam }) => getAudit(orgId, filters, pageParam),
    initialPageParam: undefined as number | undefined,
    getNextPageParam: (last) => last.nextBefore ?? undefined,
  });
}

/** The CSV export of the same filtered entries: a plain GET the browser downloads with its cookie. */
export function auditExportHref(orgId: string, filters: AuditFilters): string {
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(filters)) if (value) params.set(key, value);
  const query = params.toString();
  return `/api/orgs/${orgId}/audit/export${query ? `?${query}` : ''}`;
}

export function useAudit(orgId: string, filters: AuditFilters) {
  return useInfiniteQuery(getAuditQueryOptions(orgId, filters));
}
