import { queryOptions, useQuery } from '@tanstack/react-query';
import type { PersonDto } from '../../../../../policies/dto';
import { api } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';

export function getPerson(orgId: string, personId: string): Promise<PersonDto> {
  return api.get<PersonDto>(`/orgs/${orgId}/people/${personId}`);
}

export function getPersonQueryOptions(orgId: string, personId: string) {
  return queryOptions({ queryKey: queryKeys.person(orgId, personId), queryFn: () => getPerson(orgId, personId) });
}

export function usePerson(orgId: string, personId: string) {
  return useQuery(getPersonQueryOptions(orgId, personId));
}
