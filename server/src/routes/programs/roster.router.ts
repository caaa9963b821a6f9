import { z } from 'zod';
import type { RosterRowDto, TodayDto } from '../../../../policies/dto';
import { describeRule } from '../../../../policies/load/describe';
import { inForceOn } from '../../../../policies/load/in-force';
import { MOVEMENT_PATTERNS } from '../../../../policies/load/patterns';
import { plannedKg } from '../../../../policies/load/compliance';
import { OrgItemParamsSchema, OrgParamsSchema } from '../../../../policies/schemas';
import { todayIso } from '../../../../policies/roles';
import { Exercise, ProgramSession, SessionHold } from '../../entities';
import { authorize } from '../../http/authorize';
import { orgRoute, type RouteDef } from '../../http/route';
import { activePlans, caseload } from '../../services/cases';
import { currentBaselines } from '../../services/programs';
import { sessionDtos } from './program-access';

export const rosterRoutes: RouteDef[] = [
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/roster',
    summary: "The coach's roster: status, limits in force today, sessions on hold, pending exceptions, next session",
    access: { kind: 'org', action: 'read', subject: 'Athlete' },
    params: OrgParamsSchema,
    async handler({ ds, ability, actor, user }) {
      const today = todayIso();
      const rows = await caseload(ds, ability, actor.organizationId, today);
      const ids = rows.map((r) => r.athleteId);
      if (ids.length === 0) return [];
      const [plans, holds, pending, next] = await Promise.all([
        activePlans(ds, ids, today),
        ds.query(`SELECT h.athlete_id, count(*)::int AS n FROM session_holds h JOIN program_sessions s ON s.id = h.session_id
                   WHERE h.athlete_id = ANY($1) AND s.date >= $2 GROUP BY 1`, [ids, today]) as Promise<{ athlete_id: string; n: number }[]>,
        ds.query(`SELECT athlete_id, count(*)::int AS n FROM program_exceptions WHERE athlete_id = ANY($1) AND status = 'pending' GROUP BY 1`, [ids]) as Promise<{ athlete_id: string; n: number }[]>,
        ds.query(`SELECT DISTINCT ON (a) a AS athlete_id, s.id, s.date, s.title FROM program_sessions s JOIN programs p ON p.id = s.program_id
                   CROSS JOIN LATERAL unnest(p.athlete_ids) AS a WHERE a = ANY($1) AND s.status = 'published' AND s.date >= $2 ORDER BY a, s.date, s.created_at`, [ids, today]) as Promise<{ athlete_id: string; id: string; date: string; title: string }[]>,
      ]);
      const count = (list: { athlete_id: string; n: number }[], id: string) => list.find((r) => r.athlete_id === id)?.n ?? 0;
      return rows.map((r): RosterRowDto => {
        const inForce = inForceOn(plans.get(r.athleteId) ?? [], today);
        const n = next.find((x) => x.athlete_id === r.athleteId);
        return {
          athleteId: r.athleteId,
          athleteName: r.athleteName,
          status: r.status,
          limitsToday: MOVEMENT_PATTERNS.filter((p) => inForce.patterns[p].mode !== 'free').map((p) => describeRule(p, inForce.patterns[p], user.unitPref, 'staff')),
          sessionsOnHold: count(holds, r.athleteId),
          pendingExceptions: count(pending, r.athleteId),
          nextSession: n ? { id: n.id, date: n.date, title: n.title } : null,
        };
      });
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/athletes/:id/today',
    summary: "An athlete's published sessions for a day, with loads worked out and on-hold sessions marked",
    access: { kind: 'org', action: 'read', subject: 'Program' },
    params: OrgItemParamsSchema,
    query: z.strictObject({ date: z.iso.date({ message: 'must be a date (YYYY-MM-DD)' }).optional() }),
    async handler({ ds, ability, actor, user, params, query }) {
      authorize(ability, 'read', 'Program', { id: '', organizationId: actor.organizationId, athleteId: params.id });
      const date = query.date ?? todayIso();
      const sessions = await ds.getRepository(ProgramSession).createQueryBuilder('s')
        .innerJoin('programs', 'p', 'p.id = s.program_id')
        .where('s.organization_id = :org', { org: actor.organizationId })
        .andWhere(':athlete = ANY(p.athlete_ids)', { athlete: params.id })
        .andWhere(`s.status = 'published'`).andWhere('s.date = :date', { date })
        .orderBy('s.created_at').getMany();
      const programNames = new Map<string, string>(
        (await ds.query(`SELECT id, name FROM programs WHERE id = ANY($1)`, [sessions.map((s) => s.programId)]) as { id: string; name: string }[]).map((p) => [p.id, p.name]),
      );
      const dtos = await sessionDtos(ds.manager, sessions, programNames);
      const holds = sessions.length ? await ds.getRepository(SessionHold).createQueryBuilder('h').where('h.athlete_id = :a', { a: params.id }).andWhere('h.session_id IN (:...ids)', { ids: sessions.map((s) => s.id) }).getMany() : [];
      const exercises = await ds.getRepository(Exercise).find({ where: { organizationId: actor.organizationId } });
      const byId = new Map(exercises.map((e) => [e.id, e]));
      const baselines = await currentBaselines(ds.manager, params.id);
      const dto: TodayDto = {
        athleteId: params.id,
        date,
        unit: user.unitPref,
        sessions: dtos.map((s) => {
          const exerciseNames: Record<string, string> = {};
          const loadsKg: Record<string, number | null> = {};
          for (const e of s.content.exercises) {
            const ex = byId.get(e.exerciseId);
            exerciseNames[e.exerciseId] = ex?.name ?? 'Exercise';
            for (const set of e.sets) loadsKg[set.id] = plannedKg(set.load, baselines[ex?.referenceId ?? e.exerciseId]);
          }
          // Athletes see only their own hold, never other athletes' breaches in a group session.
          return { ...s, holds: s.holds.filter((h) => h.athleteId === params.id), onHold: holds.some((h) => h.sessionId === s.id), exerciseNames, loadsKg };
        }),
      };
      return dto;
    },
  }),
];
