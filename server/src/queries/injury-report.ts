import type { InjuryReportDto, TeamSessionHoursDto } from '../../../policies/dto/injury-report';
import type { BodyRegion } from '../../../policies/body-regions';
import { buildInjuryReport, type AthleteForReport, type CaseForReport, type ExposureEntry } from '../../../policies/load/injury-report';
import type { ParticipationStatus } from '../../../policies/load/patterns';
import type { TeamSessionKind } from '../../../policies/schemas/injury-report';
import { orgQuery } from '../core/command';
import { authorize } from '../core/authorize';
import { groupSubject, readableGroup } from './groups';
import { managerOf } from './programs';

export interface TeamSessionHoursRow {
  id: string;
  group_id: string;
  date: string;
  minutes: number;
  kind: TeamSessionKind;
  athlete_ids: string[];
}

export const toTeamSessionHoursDto = (r: TeamSessionHoursRow): TeamSessionHoursDto => ({
  id: r.id,
  groupId: r.group_id,
  date: r.date,
  minutes: r.minutes,
  kind: r.kind,
  present: r.athlete_ids.length,
  athleteIds: r.athlete_ids,
});

/** A group's recorded session hours, newest first (the last 100): readable by whoever reads the group. */
export const listTeamSessionHours = orgQuery({
  name: 'team_session_hours.list',
  async run(ctx, input: { groupId: string }): Promise<TeamSessionHoursDto[]> {
    const m = managerOf(ctx.db);
    const { group, members } = await readableGroup(m, ctx.actor, ctx.ability, input.groupId);
    authorize(ctx.ability, 'read', 'Group', groupSubject(group, members));
    const rows: TeamSessionHoursRow[] = await m.query(
      `SELECT id, group_id, to_char(date, 'YYYY-MM-DD') AS date, minutes, kind, athlete_ids
         FROM team_session_hours WHERE group_id = $1 AND organization_id = $2
        ORDER BY date DESC, created_at DESC LIMIT 100`,
      [group.id, ctx.actor.organizationId],
    );
    return rows.map(toTeamSessionHoursDto);
  },
});

/**
 * The organization's injury report over [from, to] (policies/load/injury-report.ts): aggregates only,
 * small cells suppressed, for admins and clinicians (policies/access/injury-report.ts). Every case of
 * the organization counts — not only those the reader cares for — which is why nothing below the
 * suppression thresholds ever leaves this function.
 */
export const injuryReport = orgQuery({
  name: 'injury_report.read',
  async run(ctx, input: { from: string; to: string }): Promise<InjuryReportDto> {
    const org = ctx.actor.organizationId;
    authorize(ctx.ability, 'read', 'InjuryReport', { organizationId: org });
    const m = managerOf(ctx.db);
    const caseRows: {
      id: string;
      athlete_id: string;
      onset: string;
      closed: string | null;
      body_regions: BodyRegion[];
      statuses: { status: ParticipationStatus; effectiveFrom: string; createdAt: string }[] | null;
    }[] = await m.query(
      `SELECT c.id, c.athlete_id, to_char(c.onset_date, 'YYYY-MM-DD') AS onset, to_char(c.closed_on, 'YYYY-MM-DD') AS closed,
              c.body_regions,
              (SELECT json_agg(json_build_object('status', s.status, 'effectiveFrom', to_char(s.effective_from, 'YYYY-MM-DD'),
                                                 'createdAt', s.created_at))
                 FROM participation_status_changes s WHERE s.case_id = c.id) AS statuses
         FROM cases c WHERE c.organization_id = $1 AND c.onset_date BETWEEN $2 AND $3`,
      [org, input.from, input.to],
    );
    const cases: CaseForReport[] = caseRows.map((c) => ({
      caseId: c.id,
      athleteId: c.athlete_id,
      onsetDate: c.onset,
      closedOn: c.closed,
      bodyRegions: c.body_regions,
      statuses: (c.statuses ?? []).map((s) => ({ ...s, createdAt: new Date(s.createdAt).toISOString() })),
    }));
    const exposureRows: { athlete_id: string; date: string; minutes: number; group_id: string | null; kind: ExposureEntry['kind'] }[] =
      await m.query(
        `SELECT l.athlete_id, to_char(l.date, 'YYYY-MM-DD') AS date, l.duration_minutes AS minutes, NULL::uuid AS group_id,
                'training' AS kind
           FROM training_logs l WHERE l.organization_id = $1 AND l.date BETWEEN $2 AND $3
         UNION ALL
         SELECT a.athlete_id, to_char(t.date, 'YYYY-MM-DD'), t.minutes, t.group_id, t.kind
           FROM team_session_hours t CROSS JOIN LATERAL unnest(t.athlete_ids) AS a(athlete_id)
          WHERE t.organization_id = $1 AND t.date BETWEEN $2 AND $3`,
        [org, input.from, input.to],
      );
    const athleteRows: { id: string; sport: string | null; groups: { id: string; name: string }[] | null }[] = await m.query(
      `SELECT mb.id, p.sport,
              (SELECT json_agg(json_build_object('id', g.id, 'name', g.name))
                 FROM group_members gm JOIN groups g ON g.id = gm.group_id
                WHERE gm.member_id = mb.id AND gm.role = 'athlete') AS groups
         FROM memberships mb LEFT JOIN athlete_profiles p ON p.membership_id = mb.id
        WHERE mb.organization_id = $1 AND 'athlete' = ANY(mb.roles)`,
      [org],
    );
    const athletes: AthleteForReport[] = athleteRows.map((a) => ({ id: a.id, sport: a.sport, groups: a.groups ?? [] }));
    const exposure: ExposureEntry[] = exposureRows.map((e) => ({
      athleteId: e.athlete_id,
      date: e.date,
      minutes: Number(e.minutes),
      groupId: e.group_id,
      kind: e.kind,
    }));
    return buildInjuryReport({ from: input.from, to: input.to, today: ctx.today, cases, exposure, athletes });
  },
});
