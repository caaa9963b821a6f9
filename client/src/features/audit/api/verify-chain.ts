import { useMutation } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

export interface ChainReport {
  intact: boolean;
  entries: number;
  firstBrokenId: string | null;
  reason: string | null;
}

/** Re-computes the organization's whole hash chain on the server (admins). */
export function verifyChain(orgId: string): Promise<ChainReport> {
  return api.get<ChainReport>(`/orgs/${orgId}/audit/verify`);
}

/** A mutation, not a query: it is an action the admin asks for, and its answer should never be stale. */
export function useVerifyChain(orgId: string) {
  return useMutation({ mutationFn: () => verifyChain(orgId) });
}
