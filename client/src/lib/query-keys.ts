/**
 * Query keys in one place, so a mutation in one feature can refresh what another feature shows
 * without the features importing each other.
 */
export const queryKeys = {
  org: (orgId: string) => ['orgs', orgId] as const,
  organization: (orgId: string) => ['orgs', orgId, 'organization'] as const,
  people: (orgId: string) => ['orgs', orgId, 'people'] as const,
  person: (orgId: string, id: string) => ['orgs', orgId, 'people', id] as const,
  athletes: (orgId: string) => ['orgs', orgId, 'athletes'] as const,
  athlete: (orgId: string, id: string) => ['orgs', orgId, 'athletes', id] as const,
  invitations: (orgId: string) => ['orgs', orgId, 'invitations'] as const,
  audit: (orgId: string) => ['orgs', orgId, 'audit'] as const,
};
