import {
  BaselineCreateSchema,
  ExerciseCreateSchema,
  ExerciseUpdateSchema,
  NothingSchema,
  OrgItemParamsSchema,
  OrgParamsSchema,
} from '../../../../policies/schemas';
import { recordBaseline } from '../../commands/baselines';
import { createExercise, editExercise } from '../../commands/exercises';
import { orgRoute, type RouteDef } from '../../http/route';
import { listBaselines, listExercises } from '../../queries/exercises';

export const exerciseRoutes: RouteDef[] = [
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/exercises',
    summary: "The organization's exercise library",
    access: { kind: 'org', action: 'read', subject: 'Exercise' },
    params: OrgParamsSchema,
    query: NothingSchema,
    body: NothingSchema,
    async handler({ read }) {
      return read(listExercises, undefined);
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/exercises',
    summary: 'Add an exercise to the library',
    access: { kind: 'org', action: 'create', subject: 'Exercise' },
    query: NothingSchema,
    command: createExercise,
    params: OrgParamsSchema,
    body: ExerciseCreateSchema,
    status: 201,
    async handler({ run, body }) {
      return run(createExercise, body);
    },
  }),
  orgRoute({
    method: 'patch',
    path: '/orgs/:orgId/exercises/:id',
    summary:
      'Edit, archive or restore a library exercise; a change of its patterns, impact flag or reference lift re-checks the sessions using it',
    access: { kind: 'org', action: 'update', subject: 'Exercise' },
    query: NothingSchema,
    command: editExercise,
    params: OrgItemParamsSchema,
    body: ExerciseUpdateSchema,
    async handler({ run, params, body }) {
      return run(editExercise, { ...body, id: params.id });
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/athletes/:id/baselines',
    summary: "An athlete's strength history: tested maxes, estimates and logged sets",
    access: { kind: 'org', action: 'read', subject: 'Baseline' },
    params: OrgItemParamsSchema,
    query: NothingSchema,
    body: NothingSchema,
    async handler({ read, params }) {
      return read(listBaselines, { athleteId: params.id });
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/athletes/:id/baselines',
    summary: 'Record a tested 1RM or a set to estimate it from (Epley; RIR-adjusted when an RPE is given)',
    access: { kind: 'org', action: 'create', subject: 'Baseline' },
    query: NothingSchema,
    command: recordBaseline,
    params: OrgItemParamsSchema,
    body: BaselineCreateSchema,
    status: 201,
    async handler({ run, params, body }) {
      return run(recordBaseline, { ...body, athleteId: params.id });
    },
  }),
];
