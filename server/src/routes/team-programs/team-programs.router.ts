import {
  NothingSchema,
  OrgParamsSchema,
  ProgramItemParamsSchema,
  SessionCreateSchema,
  SessionUpdateSchema,
} from '../../../../policies/schemas';
import {
  TeamProgramCreateSchema,
  TeamProgramListQuerySchema,
  TeamProgramRenameSchema,
  TeamPublishSchema,
  TeamVersionActionSchema,
  TeamVersionParamsSchema,
} from '../../../../policies/schemas/team-programs';
import { addTeamSession, createTeamProgram, deleteTeamSession, editTeamSession, renameTeamProgram } from '../../commands/team-programs';
import { acceptVersion, asWrittenVersion, publishTeamSessions, resetVersion } from '../../commands/team-versions';
import { orgRoute, type RouteDef } from '../../http/route';
import { changeItem, createFromBody, deleteItem, readItem, readList } from '../../http/route-handlers';
import { getTeamProgram, getTeamVersion, listTeamPrograms, teamGrid } from '../../queries/team-programs';

/**
 * Team programs: a group's sessions written once and each athlete's fitted version. Who may read or
 * change them is decided by the group (services/team-access.ts): admins and the group's coaches, and
 * the clinicians of its athletes read-only; anyone else is told it was not found.
 */
const read = { kind: 'org', action: 'read', subject: 'Program' } as const;
const update = { kind: 'org', action: 'update', subject: 'Program' } as const;

export const teamProgramRoutes: RouteDef[] = [
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/team-programs',
    summary: "Team programs of the groups I coach (or whose athletes' care I am part of)",
    access: read,
    params: OrgParamsSchema,
    query: TeamProgramListQuerySchema,
    body: NothingSchema,
    ...readList(listTeamPrograms),
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/team-programs',
    summary: 'Start a team program for a group',
    access: { kind: 'org', action: 'create', subject: 'Program' },
    params: OrgParamsSchema,
    query: NothingSchema,
    body: TeamProgramCreateSchema,
    status: 201,
    ...createFromBody(createTeamProgram),
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/team-programs/:id',
    summary: 'A team program with its sessions as written',
    access: read,
    params: ProgramItemParamsSchema,
    query: NothingSchema,
    body: NothingSchema,
    ...readItem(getTeamProgram),
  }),
  orgRoute({
    method: 'patch',
    path: '/orgs/:orgId/team-programs/:id',
    summary: 'Rename a team program',
    access: update,
    params: ProgramItemParamsSchema,
    query: NothingSchema,
    body: TeamProgramRenameSchema,
    ...changeItem(renameTeamProgram),
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/team-programs/:id/sessions',
    summary: "Add a team session; each athlete's version is fitted at once",
    access: update,
    command: addTeamSession,
    params: ProgramItemParamsSchema,
    query: NothingSchema,
    body: SessionCreateSchema,
    status: 201,
    async handler({ run, user, params, body }) {
      return run(addTeamSession, { ...body, programId: params.id, unit: user.unitPref });
    },
  }),
  orgRoute({
    method: 'patch',
    path: '/orgs/:orgId/team-sessions/:id',
    summary: 'Edit a team session; every version not edited by hand is fitted again',
    access: update,
    command: editTeamSession,
    params: ProgramItemParamsSchema,
    query: NothingSchema,
    body: SessionUpdateSchema,
    async handler({ run, user, params, body }) {
      return run(editTeamSession, { ...body, id: params.id, unit: user.unitPref });
    },
  }),
  orgRoute({
    method: 'delete',
    path: '/orgs/:orgId/team-sessions/:id',
    summary: "Delete a team session and the athletes' versions of it",
    access: update,
    params: ProgramItemParamsSchema,
    query: NothingSchema,
    body: NothingSchema,
    ...deleteItem(deleteTeamSession),
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/team-programs/:id/grid',
    summary: "The review grid: each athlete's version of each team session",
    access: read,
    params: ProgramItemParamsSchema,
    query: NothingSchema,
    body: NothingSchema,
    ...readItem(teamGrid),
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/team-programs/:id/publish',
    summary: 'Publish team sessions to the whole group: every version is checked, and any problem (422) publishes nothing',
    access: update,
    command: publishTeamSessions,
    params: ProgramItemParamsSchema,
    query: NothingSchema,
    body: TeamPublishSchema,
    async handler({ run, user, params, body }) {
      return run(publishTeamSessions, { programId: params.id, teamSessionIds: body.teamSessionIds, unit: user.unitPref });
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/team-sessions/:id/versions/:athleteId',
    summary: "One athlete's version beside the team session, with the engine's findings",
    access: read,
    params: TeamVersionParamsSchema,
    query: NothingSchema,
    body: NothingSchema,
    async handler({ read: r, user, params }) {
      return r(getTeamVersion, { teamSessionId: params.id, athleteId: params.athleteId, unit: user.unitPref });
    },
  }),
  ...(
    [
      ['accept', acceptVersion, 'Take the waiting proposal (checked again), or mark the version reviewed'],
      ['reset', resetVersion, 'Drop the hand edit and fit the version again from the team session'],
      ['as-written', asWrittenVersion, "The team's sets as written, kept as a hand edit until the clinician grants an exception"],
    ] as const
  ).map(([action, command, summary]) =>
    orgRoute({
      method: 'post',
      path: `/orgs/:orgId/team-sessions/:id/versions/:athleteId/${action}`,
      summary,
      access: update,
      command,
      params: TeamVersionParamsSchema,
      query: NothingSchema,
      body: TeamVersionActionSchema,
      async handler({ run, user, params, body }) {
        return run(command, { teamSessionId: params.id, athleteId: params.athleteId, version: body.version, unit: user.unitPref });
      },
    }),
  ),
];
