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
  // Athlete reports. Each "All" key is the prefix a write invalidates.
  painReportsAll: (orgId: string) => ['orgs', orgId, 'pain-reports'] as const,
  painReports: (orgId: string, athleteId: string) => ['orgs', orgId, 'pain-reports', athleteId] as const,
  painReport: (orgId: string, id: string) => ['orgs', orgId, 'pain-reports', 'one', id] as const,
  checkInsAll: (orgId: string) => ['orgs', orgId, 'check-ins'] as const,
  checkIns: (orgId: string, athleteId: string, range: { from: string; to: string }) =>
    ['orgs', orgId, 'check-ins', athleteId, range] as const,
  trainingLogsAll: (orgId: string) => ['orgs', orgId, 'training-logs'] as const,
  trainingLogs: (orgId: string, athleteId: string, range: { from: string; to: string }) =>
    ['orgs', orgId, 'training-logs', athleteId, range] as const,
  workloadAll: (orgId: string) => ['orgs', orgId, 'workload'] as const,
  workload: (orgId: string, athleteId: string, to: string, days: number) => ['orgs', orgId, 'workload', athleteId, to, days] as const,
  flagsAll: (orgId: string) => ['orgs', orgId, 'flags'] as const,
  flags: (orgId: string, filters: { athleteId?: string; state: string }) => ['orgs', orgId, 'flags', filters] as const,
  notifications: (orgId: string) => ['orgs', orgId, 'notifications'] as const,
  noticePreferences: (orgId: string) => ['orgs', orgId, 'notice-preferences'] as const,
  lettersAll: (orgId: string) => ['orgs', orgId, 'letters'] as const,
  letters: (orgId: string, athleteId: string | null) => ['orgs', orgId, 'letters', { athleteId }] as const,
  letterPrefill: (orgId: string, athleteId: string) => ['orgs', orgId, 'letters', 'prefill', athleteId] as const,
  outbox: (orgId: string) => ['orgs', orgId, 'outbox'] as const,
  // Uploads. Documents hang off a case; clips off an athlete's logged sessions.
  caseDocuments: (orgId: string, caseId: string) => ['orgs', orgId, 'cases', caseId, 'documents'] as const,
  clipsAll: (orgId: string) => ['orgs', orgId, 'clips'] as const,
  clipLists: (orgId: string) => ['orgs', orgId, 'clips', 'list'] as const,
  clips: (orgId: string, filters: { athleteId?: string; trainingLogId?: string }) => ['orgs', orgId, 'clips', 'list', filters] as const,
  clip: (orgId: string, id: string) => ['orgs', orgId, 'clips', id] as const,
  organizationSettings: (orgId: string) => ['orgs', orgId, 'settings'] as const,
  /** The public letter check: not tied to an organization or a session. */
  letterCheck: (code: string) => ['letter-check', code] as const,
};
