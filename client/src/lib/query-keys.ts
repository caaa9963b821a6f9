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
  auditChain: (orgId: string) => ['orgs', orgId, 'audit-chain'] as const,
  caseload: (orgId: string) => ['orgs', orgId, 'caseload'] as const,
  caseLists: (orgId: string) => ['orgs', orgId, 'cases', 'list'] as const,
  caseList: (orgId: string, filters: { athleteId?: string; state?: string }) => ['orgs', orgId, 'cases', 'list', filters] as const,
  case: (orgId: string, id: string) => ['orgs', orgId, 'cases', id] as const,
  plan: (orgId: string, id: string) => ['orgs', orgId, 'plans', id] as const,
  planVersions: (orgId: string, id: string) => ['orgs', orgId, 'plans', id, 'versions'] as const,
  /** Prefix of every in-force query; any change to a case or plan can move what is in force. */
  inForceAll: (orgId: string) => ['orgs', orgId, 'in-force'] as const,
  inForce: (orgId: string, athleteId: string, date: string) => ['orgs', orgId, 'in-force', athleteId, date] as const,
};
