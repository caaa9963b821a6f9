import { z } from 'zod';
import type { RosterRowDto, TodayDto } from '../../../../policies/dto';
import { describeRule } from '../../../../policies/load/describe';
import { inForceOn } from '../../../../policies/load/in-force';
import { MOVEMENT_PATTERNS } from '../../../../policies/load/patterns';
import { plannedKg } from '../../../../policies/load/compliance';
import { OrgItemParamsSchema, OrgParamsSchema } from '../../../../policies/schemas';
import { todayIso } from '../../../../policies/roles';
import { authorize } from '../../core/authorize';
import { orgRoute, type RouteDef } from '../../http/route';
import { rosterRows, todaySessions } from '../../services/programs';
import { toSessionDto } from './program-access';

export const rosterRoutes: RouteDef[] = [
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/roster',
    summary: "The coach's roster: status, limits in force today, sessions on hold, pending exceptions, next session",
    access: { kind: 'org', action: 'read', subject: 'Athlete' },
    params: OrgParamsSchema,
    async handler({ ds, ability, actor, user }) {
      const today = todayIso();
      const rows = await rosterRows(ds, ability, actor.organizationId, today);
      return rows.map((r): RosterRowDto => {
        // Without a plan every pattern is free: nothing to work out.
        const inForce = r.plans.length ? inForceOn(r.plans, today) : null;
        return {
          athleteId: r.athleteId,
          athleteName: r.athleteName,
          status: r.status,
          limitsToday: inForce
            ? MOVEMENT_PATTERNS.filter((p) => inForce.patterns[p].mode !== 'free').map((p) =>
                describeRule(p, inForce.patterns[p], user.unitPref, 'staff'),
              )
            : [],
          sessionsOnHold: r.sessionsOnHold,
          pendingExceptions: r.pendingExceptions,
          nextSession: r.nextSession,
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
      const rows = await todaySessions(ds, actor.organizationId, params.id, date);
      const dto: TodayDto = {
        athleteId: params.id,
        date,
        unit: user.unitPref,
        sessions: rows.map(({ session, programName, holds, exercises, baselines }) => {
          const exerciseNames: Record<string, string> = {};
          const loadsKg: Record<string, number | null> = {};
          for (const e of session.content.exercises) {
            const ex = exercises[e.exerciseId];
            exerciseNames[e.exerciseId] = ex?.name ?? 'Exercise';
            for (const set of e.sets) loadsKg[set.id] = plannedKg(set.load, baselines[ex?.referenceId ?? e.exerciseId]);
          }
          // Athletes see only their own hold, never other athletes' breaches in a group session.
          return { ...toSessionDto(session, programName, holds), onHold: holds.length > 0, exerciseNames, loadsKg };
        }),
      };
      return dto;
    },
  }),
];
