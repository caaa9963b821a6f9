/**
 * Query keys of programming data, in lib/query-keys.ts's shape (['orgs', orgId, …]). The exercises
 * and exceptions features keep copies of the few they share, so all three hit the same cache entries
 * without importing each other. Cases and plans use lib/query-keys.ts itself.
 */
export const programKeys = {
  exercises: (orgId: string) => ['orgs', orgId, 'exercises'] as const,
  roster: (orgId: string) => ['orgs', orgId, 'roster'] as const,
  /** Prefix of every program query: lists and single programs. */
  all: (orgId: string) => ['orgs', orgId, 'programs'] as const,
  list: (orgId: string, athleteId: string | null) => ['orgs', orgId, 'programs', 'list', athleteId ?? 'all'] as const,
  program: (orgId: string, programId: string) => ['orgs', orgId, 'programs', programId] as const,
  check: (orgId: string, sessionId: string, version: number) => ['orgs', orgId, 'programs', 'check', sessionId, version] as const,
  baselines: (orgId: string, athleteId: string) => ['orgs', orgId, 'athletes', athleteId, 'baselines'] as const,
  exceptions: (orgId: string) => ['orgs', orgId, 'exceptions'] as const,
  today: (orgId: string, athleteId: string, date: string) => ['orgs', orgId, 'athletes', athleteId, 'today', date] as const,
  week: (orgId: string, athleteId: string, from: string) => ['orgs', orgId, 'athletes', athleteId, 'week', from] as const,
};
