import { queryOptions, useQuery } from '@tanstack/react-query';
import type { DeliveryDto } from '../../../../../policies/dto';
import { api } from '../../../lib/api-client';

/** The organization's outgoing e-mail with its delivery state, newest first (admins). */
export function getDeliveries(orgId: string): Promise<DeliveryDto[]> {
  return api.get<DeliveryDto[]>(`/orgs/${orgId}/deliveries`);
}

export function getDeliveriesQueryOptions(orgId: string) {
  return queryOptions({ queryKey: ['orgs', orgId, 'deliveries'] as const, queryFn: () => getDeliveries(orgId), refetchInterval: 5000 });
}

export function useDeliveries(orgId: string) {
  return useQuery(getDeliveriesQueryOptions(orgId));
}
