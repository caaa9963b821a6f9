import { useQueries } from '@tanstack/react-query';
import type { CaseDetailDto, CaseDto, PlanDto, ProgramDto } from '../../../../../policies/dto';
import type { PlanInput } from '../../../../../policies/load/in-force';
import type { StatusChangeInput } from '../../../../../policies/load/status-on';
import { mostRestrictive } from '../../../../../policies/load/status-on';
import { api } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';
import { currentOneRms, getBaselinesQueryOptions } from './baselines';
import { getProgramsQueryOptions } from './get-programs';
import type { AthleteEngine } from '../components/live-check';

/** The same open-case list the cases feature reads (same key, same cache entry). */
function openCasesQuery(orgId: string, athleteId: string) {
  const filters = { athleteId, state: 'open' as const };
  return { queryKey: queryKeys.caseList(orgId, filters), queryFn: () => api.get<CaseDto[]>(`/orgs/${orgId}/cases`, { query: filters }) };
}

/** The case with its status history (same key and cache entry as the case page). */
function caseDetailQuery(orgId: string, caseId: string) {
  return {
    queryKey: queryKeys.case(orgId, caseId),
    queryFn: () => api.get<CaseDetailDto>(`/orgs/${orgId}/cases/${caseId}`),
    staleTime: 60_000,
  };
}

function planQuery(orgId: string, planId: string) {
  return { queryKey: queryKeys.plan(orgId, planId), queryFn: () => api.get<PlanDto>(`/orgs/${orgId}/plans/${planId}`) };
}

export interface EngineInputs {
  engines: AthleteEngine[];
  isPending: boolean;
  /** The first failure, if any input could not be loaded: the live check is then incomplete. */
  error: unknown;
}

/**
 * What the server's compliance check reads, gathered per athlete: the plans of open cases, the
 * current 1RMs (latest tested or estimated baseline), the participation status decisions of the
 * open cases (so each set is checked against the status of its own date), and every published
 * session the athlete has (for the weekly hard-set count).
 */
export function useEngineInputs(orgId: string, athletes: { id: string; name: string }[]): EngineInputs {
  const cases = useQueries({ queries: athletes.map((a) => openCasesQuery(orgId, a.id)) });
  const planIds = cases.flatMap((c) => (c.data ?? []).map((x) => x.planId).filter((id): id is string => !!id));
  const plans = useQueries({ queries: planIds.map((id) => planQuery(orgId, id)) });
  const openCaseIds = cases.flatMap((c) => (c.data ?? []).map((x) => x.id));
  const details = useQueries({ queries: openCaseIds.map((id) => caseDetailQuery(orgId, id)) });
  const baselines = useQueries({ queries: athletes.map((a) => getBaselinesQueryOptions(orgId, a.id)) });
  const programs = useQueries({ queries: athletes.map((a) => getProgramsQueryOptions(orgId, a.id)) });

  const all = [...cases, ...plans, ...details, ...baselines, ...programs];
  const planById = new Map(plans.flatMap((p) => (p.data ? [[p.data.id, p.data] as const] : [])));
  const historyByCase = new Map(details.flatMap((d) => (d.data ? [[d.data.id, d.data.statusHistory ?? []] as const] : [])));

  const engines = athletes.map((a, i): AthleteEngine => {
    const open = cases[i].data ?? [];
    const planInputs: PlanInput[] = open
      .map((c) => (c.planId ? planById.get(c.planId) : undefined))
      .filter((p): p is PlanDto => !!p)
      .map((p) => ({ planId: p.id, caseId: p.caseId, version: p.version, stages: p.current.stages }));
    const status = mostRestrictive(open.map((c) => c.status));
    const statusChanges: StatusChangeInput[] = open.flatMap((c) =>
      (historyByCase.get(c.id) ?? [{ status: c.status, effectiveFrom: c.statusEffectiveFrom, createdAt: '' }]).map((h) => ({
        caseId: c.id,
        status: h.status,
        effectiveFrom: h.effectiveFrom,
        createdAt: h.createdAt,
      })),
    );
    const oneRms = Object.fromEntries(Object.entries(currentOneRms(baselines[i].data ?? [])).map(([id, b]) => [id, b.e1rmKg]));
    const published = (programs[i].data ?? ([] as ProgramDto[])).flatMap((p) => p.sessions.filter((s) => s.status === 'published'));
    return { athleteId: a.id, athleteName: a.name, plans: planInputs, oneRms, status, statusChanges, published };
  });

  return { engines, isPending: all.some((q) => q.isPending), error: all.find((q) => q.isError)?.error ?? null };
}
