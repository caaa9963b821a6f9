import { z } from 'zod';
import {
  CopyWeekSchema,
  NothingSchema,
  OrgParamsSchema,
  ProgramCreateSchema,
  ProgramItemParamsSchema,
  ProgramUpdateSchema,
  SessionCreateSchema,
  SessionUpdateSchema,
  ShiftDatesSchema,
  UuidSchema,
  VersionSchema,
} from '../../../../policies/schemas';
import {
  addSession,
  copyWeek,
  createProgram,
  deleteSession,
  editSession,
  publishSession,
  shiftDrafts,
  unpublishSession,
  updateProgram,
} from '../../commands/programs';
import { orgRoute, type RouteDef } from '../../http/route';
import { changeItem, createFromBody, deleteItem, readItem, readList } from '../../http/route-handlers';
import { checkSession, getProgram, listPrograms } from '../../queries/programs';

const read = { kind: 'org', action: 'read', subject: 'Program' } as const;
const update = { kind: 'org', action: 'update', subject: 'Program' } as const;

export const programRoutes: RouteDef[] = [
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/programs',
    summary: 'Programs I may see (athletes: those they are part of, published sessions only)',
    access: read,
    params: OrgParamsSchema,
    body: NothingSchema,
    query: z.strictObject({ athleteId: UuidSchema.optional() }),
    ...readList(listPrograms),
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/programs',
    summary: 'Start a program for one athlete or a group',
    access: { kind: 'org', action: 'create', subject: 'Program' },
    query: NothingSchema,
    params: OrgParamsSchema,
    body: ProgramCreateSchema,
    status: 201,
    ...createFromBody(createProgram),
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/programs/:id',
    summary: 'A program with its sessions',
    access: read,
    params: ProgramItemParamsSchema,
    query: NothingSchema,
    body: NothingSchema,
    ...readItem(getProgram),
  }),
  orgRoute({
    method: 'patch',
    path: '/orgs/:orgId/programs/:id',
    summary: 'Rename a program or change its athletes',
    access: update,
    query: NothingSchema,
    params: ProgramItemParamsSchema,
    body: ProgramUpdateSchema,
    ...changeItem(updateProgram),
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/programs/:id/sessions',
    summary: 'Add a dated session (a draft) to a program',
    access: update,
    query: NothingSchema,
    command: addSession,
    params: ProgramItemParamsSchema,
    body: SessionCreateSchema,
    status: 201,
    async handler({ run, params, body }) {
      return run(addSession, { ...body, programId: params.id });
    },
  }),
  orgRoute({
    method: 'put',
    path: '/orgs/:orgId/sessions/:id',
    summary: 'Edit a session; an edit of a published session is checked again and refused if it breaches',
    access: update,
    query: NothingSchema,
    command: editSession,
    params: ProgramItemParamsSchema,
    body: SessionUpdateSchema,
    async handler({ run, user, params, body }) {
      return run(editSession, { ...body, id: params.id, unit: user.unitPref });
    },
  }),
  orgRoute({
    method: 'delete',
    path: '/orgs/:orgId/sessions/:id',
    summary: 'Delete a session',
    access: update,
    query: NothingSchema,
    body: NothingSchema,
    params: ProgramItemParamsSchema,
    ...deleteItem(deleteSession),
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/sessions/:id/check',
    summary: "Check a session against each athlete's plan without publishing",
    access: read,
    query: NothingSchema,
    body: NothingSchema,
    writesNothing: 'a dry run of the publish check',
    params: ProgramItemParamsSchema,
    async handler({ read: r, user, params }) {
      return r(checkSession, { id: params.id, unit: user.unitPref });
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/sessions/:id/publish',
    summary: 'Publish a session: refused (422) with the breach list if any set goes past a cap',
    access: update,
    query: NothingSchema,
    command: publishSession,
    params: ProgramItemParamsSchema,
    body: z.strictObject({ version: VersionSchema }),
    async handler({ run, user, params, body }) {
      return run(publishSession, { id: params.id, version: body.version, unit: user.unitPref });
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/sessions/:id/unpublish',
    summary: 'Take a session back to draft',
    access: update,
    query: NothingSchema,
    command: unpublishSession,
    params: ProgramItemParamsSchema,
    body: z.strictObject({ version: VersionSchema }),
    async handler({ run, params, body }) {
      return run(unpublishSession, { id: params.id, version: body.version });
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/programs/:id/copy-week',
    summary: 'Copy the sessions of one week to another week, as drafts',
    access: update,
    query: NothingSchema,
    params: ProgramItemParamsSchema,
    body: CopyWeekSchema,
    ...changeItem(copyWeek),
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/programs/:id/shift',
    summary: 'Move every draft session from a date on by a number of days',
    access: update,
    query: NothingSchema,
    params: ProgramItemParamsSchema,
    body: ShiftDatesSchema,
    ...changeItem(shiftDrafts),
  }),
];
