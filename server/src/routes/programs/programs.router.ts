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
import { checkSession, getProgram, listPrograms } from '../../queries/programs';

export const programRoutes: RouteDef[] = [
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/programs',
    summary: 'Programs I may see (athletes: those they are part of, published sessions only)',
    access: { kind: 'org', action: 'read', subject: 'Program' },
    params: OrgParamsSchema,
    body: NothingSchema,
    query: z.strictObject({ athleteId: UuidSchema.optional() }),
    async handler({ read, query }) {
      return read(listPrograms, query);
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/programs',
    summary: 'Start a program for one athlete or a group',
    access: { kind: 'org', action: 'create', subject: 'Program' },
    query: NothingSchema,
    command: createProgram,
    params: OrgParamsSchema,
    body: ProgramCreateSchema,
    status: 201,
    async handler({ run, body }) {
      return run(createProgram, body);
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/programs/:id',
    summary: 'A program with its sessions',
    access: { kind: 'org', action: 'read', subject: 'Program' },
    params: ProgramItemParamsSchema,
    query: NothingSchema,
    body: NothingSchema,
    async handler({ read, params }) {
      return read(getProgram, { id: params.id });
    },
  }),
  orgRoute({
    method: 'patch',
    path: '/orgs/:orgId/programs/:id',
    summary: 'Rename a program or change its athletes',
    access: { kind: 'org', action: 'update', subject: 'Program' },
    query: NothingSchema,
    command: updateProgram,
    params: ProgramItemParamsSchema,
    body: ProgramUpdateSchema,
    async handler({ run, params, body }) {
      return run(updateProgram, { ...body, id: params.id });
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/programs/:id/sessions',
    summary: 'Add a dated session (a draft) to a program',
    access: { kind: 'org', action: 'update', subject: 'Program' },
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
    access: { kind: 'org', action: 'update', subject: 'Program' },
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
    access: { kind: 'org', action: 'update', subject: 'Program' },
    query: NothingSchema,
    body: NothingSchema,
    command: deleteSession,
    params: ProgramItemParamsSchema,
    async handler({ run, params }) {
      await run(deleteSession, { id: params.id });
      return undefined;
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/sessions/:id/check',
    summary: "Check a session against each athlete's plan without publishing",
    access: { kind: 'org', action: 'read', subject: 'Program' },
    query: NothingSchema,
    body: NothingSchema,
    writesNothing: 'a dry run of the publish check',
    params: ProgramItemParamsSchema,
    async handler({ read, user, params }) {
      return read(checkSession, { id: params.id, unit: user.unitPref });
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/sessions/:id/publish',
    summary: 'Publish a session: refused (422) with the breach list if any set goes past a cap',
    access: { kind: 'org', action: 'update', subject: 'Program' },
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
    access: { kind: 'org', action: 'update', subject: 'Program' },
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
    access: { kind: 'org', action: 'update', subject: 'Program' },
    query: NothingSchema,
    command: copyWeek,
    params: ProgramItemParamsSchema,
    body: CopyWeekSchema,
    async handler({ run, params, body }) {
      return run(copyWeek, { ...body, id: params.id });
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/programs/:id/shift',
    summary: 'Move every draft session from a date on by a number of days',
    access: { kind: 'org', action: 'update', subject: 'Program' },
    query: NothingSchema,
    command: shiftDrafts,
    params: ProgramItemParamsSchema,
    body: ShiftDatesSchema,
    async handler({ run, params, body }) {
      return run(shiftDrafts, { ...body, id: params.id });
    },
  }),
];
