import { queryOptions, useQuery } from '@tanstack/react-query';
import type { PersonDto } from '../../../../../policies/dto';
import { api } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';

export function getPeople(orgId: string): Promise<PersonDto[]> {
  return api.get<PersonDto[]>(`/orgs/${orgId}/people`);
}

export function getPeopleQueryOptions(orgId: string) {
  return queryOptions({ queryKey: queryKeys.people(orgId), queryFn: () => getPeople(orgId) });
}

export function usePeople(orgId: string, options: { enabled?: boolean } = {}) {
  return useQuery({ ...getPeopleQueryOptions(orgId), enabled: options.enabled ?? true });
}
