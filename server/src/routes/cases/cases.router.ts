import type { EntityManager } from 'typeorm';
import { z } from 'zod';
import { CLINICAL_FIELDS } from '../../../../policies/access/case';
import {
  CaseCloseSchema,
  CaseCreateSchema,
  CaseItemParamsSchema,
  CaseUpdateSchema,
  OrgParamsSchema,
  StatusChangeSchema,
  UuidSchema,
} from '../../../../policies/schemas';
import { todayIso } from '../../../../policies/roles';
import type { CaseDetailDto } from '../../../../policies/dto';
import { CaseRecord, PainReport, ParticipationStatusChange } from '../../entities';
import { authorize } from '../../core/authorize';
import { AppError } from '../../core/errors';
import { orgRoute, type RouteDef } from '../../http/route';
import { redact } from '../../services/audit';
import { caseload, listCases, statusHistory } from '../../services/cases';
import { requireMemberWithRole } from '../../services/org-members';
import { updateVersioned } from '../../services/versioned';
import { recheckAthlete } from '../../commands/limits';
import { orgToday } from '../../../../policies/today';

const CaseListQuerySchema = z.strictObject({
  athleteId: UuidSchema.optional(),
  state: z.enum(['open', 'closed', 'all'], { message: 'must be open, closed or all' }).default('all'),
});

async function loadCase(m: EntityManager, id: string, organizationId: string) {
  return m.findOne(CaseRecord, { where: { id, organizationId } });
}

export const caseRoutes: RouteDef[] = [
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/caseload',
    summary: 'Athletes I may see with status, open cases and next review date',
    access: { kind: 'org', action: 'read', subject: 'Athlete' },
    params: OrgParamsSchema,
    async handler({ ds, ability, actor }) {
      return caseload(ds, ability, actor.organizationId, todayIso());
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/cases',
    summary: 'Cases I may see, with the fields my role may read',
    access: { kind: 'org', action: 'read', subject: 'Case' },
    params: OrgParamsSchema,
    query: CaseListQuerySchema,
    async handler({ ds, ability, actor, query }) {
      return listCases(ds, ability, actor.organizationId, query, todayIso());
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/cases',
    summary: 'Open a case for an athlete on my care team, with its first participation status',
    access: { kind: 'org', action: 'create', subject: 'Case' },
    params: OrgParamsSchema,
    body: CaseCreateSchema,
    status: 201,
    async handler({ ds, ability, actor, user, body, tx }) {
      const org = actor.organizationId;
      const id = await tx(async (m, audit) => {
        await requireMemberWithRole(m, org, body.athleteId, 'athlete', 'athleteId');
        authorize(ability, 'create', 'Case', { id: '', organizationId: org, athleteId: body.athleteId });
        const saved = await m.save(
          m.create(CaseRecord, {
            organizationId: org,
            athleteId: body.athleteId,
            bodyRegions: body.bodyRegions,
            onsetDate: body.onsetDate,
            diagnosis: body.diagnosis ?? null,
            clinicalNotes: body.clinicalNotes ?? null,
            reviewDate: body.reviewDate ?? null,
            openedBy: user.id,
          }),
        );
        await m.save(
          m.create(ParticipationStatusChange, {
            organizationId: org,
            athleteId: body.athleteId,
            caseId: saved.id,
            status: body.status,
            effectiveFrom: body.statusEffectiveFrom,
            note: body.statusNote ?? null,
            setBy: user.id,
          }),
        );
        if (body.painReportId) {
          const linked = await m.update(
            PainReport,
            { id: body.painReportId, athleteId: body.athleteId, organizationId: org },
            { caseId: saved.id },
          );
          if (linked.affected !== 1) {
            throw new AppError('validation_failed', "Please check the form: painReportId must be one of this athlete's pain reports.", {
              painReportId: ["must be one of this athlete's pain reports"],
            });
          }
        }
        await audit({
          action: 'case.opened',
          subjectType: 'Case',
          subjectId: saved.id,
          athleteId: body.athleteId,
          after: redact(body, CLINICAL_FIELDS),
        });
        return saved.id;
      });
      const [dto] = await listCases(ds, ability, org, { caseId: id }, todayIso(), true);
      return dto;
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/cases/:id',
    summary: 'One case with its status history; clinical notes for clinicians (the read is audited)',
    access: { kind: 'org', action: 'read', subject: 'Case' },
    params: CaseItemParamsSchema,
    async handler({ ds, ability, actor, params, tx }) {
      const [dto] = await listCases(ds, ability, actor.organizationId, { caseId: params.id }, todayIso(), true);
      authorize(ability, 'read', 'Case', dto);
      const detail: CaseDetailDto = { ...dto };
      if ('statusNote' in dto) detail.statusHistory = await statusHistory(ds, dto.id);
      if ('clinicalNotes' in dto) {
        // Reads of clinical records are part of the trail (45 CFR 164.312(b)).
        await tx((_m, audit) => audit({ action: 'case.viewed', subjectType: 'Case', subjectId: dto.id, athleteId: dto.athleteId }));
      }
      return detail;
    },
  }),
  orgRoute({
    method: 'patch',
    path: '/orgs/:orgId/cases/:id',
    summary: "Edit a case's regions, onset, diagnosis, notes or review date",
    access: { kind: 'org', action: 'update', subject: 'Case' },
    params: CaseItemParamsSchema,
    body: CaseUpdateSchema,
    async handler({ ds, ability, actor, params, body, tx }) {
      const { version, ...changes } = body;
      await tx(async (m, audit) => {
        const c = await loadCase(m, params.id, actor.organizationId);
        authorize(ability, 'update', 'Case', c);
        if (c.closedOn) throw new AppError('conflict', 'This case is closed. Open a new case for a new episode.');
        await updateVersioned(m, CaseRecord, c.id, version, { ...changes, updatedAt: () => 'now()' }, 'case');
        const before = Object.fromEntries(Object.keys(changes).map((k) => [k, c[k as keyof typeof changes]]));
        await audit({
          action: 'case.updated',
          subjectType: 'Case',
          subjectId: c.id,
          athleteId: c.athleteId,
          before: redact(before, CLINICAL_FIELDS),
          after: redact(changes, CLINICAL_FIELDS),
        });
      });
      const [dto] = await listCases(ds, ability, actor.organizationId, { caseId: params.id }, todayIso(), true);
      return dto;
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/cases/:id/status',
    summary: 'Set the participation status (Out, Limited, Full) from a date',
    access: { kind: 'org', action: 'create', subject: 'ParticipationStatus' },
    params: CaseItemParamsSchema,
    body: StatusChangeSchema,
    status: 201,
    async handler({ ds, ability, actor, user, params, body, tx }) {
      await tx(async (m, audit) => {
        const c = await loadCase(m, params.id, actor.organizationId);
        authorize(ability, 'update', 'Case', c);
        authorize(ability, 'create', 'ParticipationStatus', { organizationId: c.organizationId, athleteId: c.athleteId });
        if (c.closedOn) throw new AppError('conflict', 'This case is closed; its status can no longer change.');
        // The case version guards the status too, so two clinicians cannot set it at once unseen.
        await updateVersioned(m, CaseRecord, c.id, body.version, { updatedAt: () => 'now()' }, 'case');
        const previous = await m.findOne(ParticipationStatusChange, {
          where: { caseId: c.id },
          order: { effectiveFrom: 'DESC', createdAt: 'DESC' },
        });
        const saved = await m.save(
          m.create(ParticipationStatusChange, {
            organizationId: c.organizationId,
            athleteId: c.athleteId,
            caseId: c.id,
            status: body.status,
            effectiveFrom: body.effectiveFrom,
            note: body.note ?? null,
            setBy: user.id,
          }),
        );
        await audit({
          action: 'status.changed',
          subjectType: 'ParticipationStatus',
          subjectId: saved.id,
          athleteId: c.athleteId,
          before: previous ? { status: previous.status, effectiveFrom: previous.effectiveFrom } : null,
          after: { caseId: c.id, status: body.status, effectiveFrom: body.effectiveFrom, note: body.note ?? null },
        });
        await recheckAthlete(
          m,
          c.organizationId,
          c.athleteId,
          `The clinician set the status to ${body.status} from ${body.effectiveFrom}.`,
          orgToday(actor.timeZone),
        );
      });
      const [dto] = await listCases(ds, ability, actor.organizationId, { caseId: params.id }, todayIso(), true);
      return { ...dto, statusHistory: await statusHistory(ds, params.id) } satisfies CaseDetailDto;
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/cases/:id/close',
    summary: 'Close a resolved case; its plan stops being in force',
    access: { kind: 'org', action: 'update', subject: 'Case' },
    params: CaseItemParamsSchema,
    body: CaseCloseSchema,
    async handler({ ds, ability, actor, params, body, tx }) {
      await tx(async (m, audit) => {
        const c = await loadCase(m, params.id, actor.organizationId);
        authorize(ability, 'update', 'Case', c);
        if (c.closedOn) throw new AppError('conflict', 'This case is already closed.');
        if (body.closedOn > todayIso()) {
          // Closing lifts the case's restrictions, so it cannot be dated ahead: set Full from a date instead.
          throw new AppError(
            'validation_failed',
            'Please check the form: closedOn cannot be in the future; to lift limits from a later date, set the status to Full from that date.',
            { closedOn: ['cannot be in the future'] },
          );
        }
        if (body.closedOn < c.onsetDate) {
          throw new AppError('validation_failed', 'Please check the form: closedOn must be on or after the onset date.', {
            closedOn: ['must be on or after the onset date'],
          });
        }
        await updateVersioned(
          m,
          CaseRecord,
          c.id,
          body.version,
          { closedOn: body.closedOn, closingNote: body.closingNote ?? null, updatedAt: () => 'now()' },
          'case',
        );
        await audit({
          action: 'case.closed',
          subjectType: 'Case',
          subjectId: c.id,
          athleteId: c.athleteId,
          before: { closedOn: null },
          after: body,
        });
        await recheckAthlete(m, c.organizationId, c.athleteId, 'The clinician closed a case.', orgToday(actor.timeZone));
      });
      const [dto] = await listCases(ds, ability, actor.organizationId, { caseId: params.id }, todayIso(), true);
      return dto;
    },
  }),
];
