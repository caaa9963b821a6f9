import type { EntityManager } from 'typeorm';
import { CLINICAL_FIELDS } from '../../../policies/access/case';
import type { CaseDetailDto, CaseDto } from '../../../policies/dto';
import type { ParticipationStatus } from '../../../policies/load/patterns';
import type { CaseCloseInput, CaseCreateInput, CaseUpdateInput } from '../../../policies/schemas';
import { CaseRecord, PainReport, ParticipationStatusChange } from '../entities';
import { authorize } from '../core/authorize';
import { orgCommand, type OrgCommandCtx } from '../core/command';
import { AppError } from '../core/errors';
import { listCases, statusHistory } from '../queries/cases';
import { listPainReports } from '../queries/reports';
import { redact } from '../services/audit';
import { tellStatusChange } from '../services/change-notices';
import { requireMemberWithRole } from '../services/org-members';
import { updateVersioned } from '../services/versioned';
import { callWithin } from './run';
import { humanDate } from '../../../policies/words/dates';

async function loadCase(m: EntityManager, id: string, organizationId: string) {
  return m.findOne(CaseRecord, { where: { id, organizationId } });
}

/** The case as its reader may see it, read inside the command's transaction (so with the change). */
async function caseAsSeen(ctx: OrgCommandCtx, caseId: string): Promise<CaseDto> {
  const [dto] = await listCases(ctx.m, ctx.ability, ctx.actor.organizationId, { caseId }, ctx.today, true);
  return dto;
}

/**
 * Why a status changes. Each cause carries its own guard: the clinician's form the case version
 * they saw; a new case must have no status yet; an emergency names the pain report that caused it.
 */
export type StatusCause =
  { kind: 'clinician'; version: number } | { kind: 'case_opened' } | { kind: 'emergency_report'; painReportId: string };

export interface SetStatusInput {
  caseId: string;
  status: ParticipationStatus;
  effectiveFrom: string;
  note: string | null;
  cause: StatusCause;
}

const CAUSE_WORDS: Record<StatusCause['kind'], string> = {
  clinician: 'set by the clinician',
  case_opened: 'first status of a new case',
  emergency_report: 'emergency red-flag answer',
};

function limitsReason(input: SetStatusInput): string {
  switch (input.cause.kind) {
    case 'clinician':
      return `The clinician set the status to ${input.status} from ${humanDate(input.effectiveFrom)}.`;
    case 'case_opened':
      return `The clinician opened a case with the status ${input.status} from ${humanDate(input.effectiveFrom)}.`;
    case 'emergency_report':
      return 'The athlete reported an emergency warning sign and is Out.';
  }
}

/**
 * The one way a participation status is written: by the clinician, as the first status of a new
 * case, or by an emergency pain report. Same audit entry, same re-check of the athlete's published
 * sessions, whoever causes it.
 */
export const setStatus = orgCommand({
  name: 'setStatus',
  changesLimits: true,
  async run(ctx, input: SetStatusInput): Promise<ParticipationStatusChange> {
    const { m, ability } = ctx;
    const c = await loadCase(m, input.caseId, ctx.actor.organizationId);
    if (input.cause.kind === 'emergency_report') {
      // The athlete may not change a case; what allows this change is their own emergency report.
      const report = await m.findOne(PainReport, { where: { id: input.cause.painReportId, organizationId: ctx.actor.organizationId } });
      authorize(ability, 'read', 'PainReport', report);
      if (!c || report.route !== 'emergency' || report.athleteId !== c.athleteId || report.reportedBy !== ctx.userId) {
        throw new AppError('not_found', 'That case was not found.');
      }
    } else {
      authorize(ability, 'update', 'Case', c);
      authorize(ability, 'create', 'ParticipationStatus', { organizationId: c.organizationId, athleteId: c.athleteId });
    }
    if (c.closedOn) throw new AppError('conflict', 'This case is closed; its status can no longer change.');
    const previous = await m.findOne(ParticipationStatusChange, {
      where: { caseId: c.id },
      order: { effectiveFrom: 'DESC', createdAt: 'DESC' },
    });
    if (input.cause.kind === 'clinician') {
      // The case version guards the status too, so two clinicians cannot set it at once unseen.
      await updateVersioned(m, CaseRecord, c.id, input.cause.version, { updatedAt: () => 'now()' }, 'case');
    } else if (input.cause.kind === 'case_opened' && previous) {
      throw new AppError('conflict', 'This case already has a status.');
    } else if (previous) {
      // A clinician's form opened before the emergency no longer matches the case: their save answers 409.
      await m
        .createQueryBuilder()
        .update(CaseRecord)
        .set({ version: () => 'version + 1', updatedAt: () => 'now()' } as never)
        .where('id = :id', { id: c.id })
        .execute();
    }
    const saved = await m.save(
      m.create(ParticipationStatusChange, {
        organizationId: c.organizationId,
        athleteId: c.athleteId,
        caseId: c.id,
        status: input.status,
        effectiveFrom: input.effectiveFrom,
        note: input.note,
        setBy: ctx.userId,
      }),
    );
    await ctx.audit({
      action: 'status.changed',
      subjectType: 'ParticipationStatus',
      subjectId: saved.id,
      athleteId: c.athleteId,
      before: previous ? { status: previous.status, effectiveFrom: previous.effectiveFrom } : null,
      after: {
        caseId: c.id,
        status: input.status,
        effectiveFrom: input.effectiveFrom,
        note: input.note,
        reason: CAUSE_WORDS[input.cause.kind],
        ...(input.cause.kind === 'emergency_report' ? { painReportId: input.cause.painReportId } : {}),
      },
    });
    await ctx.limitsChanged({ athleteIds: [c.athleteId], reason: limitsReason(input) });
    await tellStatusChange(ctx, c.athleteId, input);
    return saved;
  },
});

/** A clinician on the care team opens a case with its first status (which re-checks the athlete's sessions). */
export const openCase = orgCommand({
  name: 'openCase',
  changesLimits: true,
  async run(ctx, input: CaseCreateInput): Promise<CaseDto> {
    const { m } = ctx;
    const org = ctx.actor.organizationId;
    await requireMemberWithRole(m, org, input.athleteId, 'athlete', 'athleteId');
    authorize(ctx.ability, 'create', 'Case', { id: '', organizationId: org, athleteId: input.athleteId });
    const saved = await m.save(
      m.create(CaseRecord, {
        organizationId: org,
        athleteId: input.athleteId,
        bodyRegions: input.bodyRegions,
        onsetDate: input.onsetDate,
        diagnosis: input.diagnosis ?? null,
        clinicalNotes: input.clinicalNotes ?? null,
        reviewDate: input.reviewDate ?? null,
        openedBy: ctx.userId,
      }),
    );
    if (input.painReportId) {
      const linked = await m.update(
        PainReport,
        { id: input.painReportId, athleteId: input.athleteId, organizationId: org },
        { caseId: saved.id },
      );
      if (linked.affected !== 1) {
        throw new AppError('validation_failed', "Please check the form: painReportId must be one of this athlete's pain reports.", {
          painReportId: ["must be one of this athlete's pain reports"],
        });
      }
    }
    await ctx.audit({
      action: 'case.opened',
      subjectType: 'Case',
      subjectId: saved.id,
      athleteId: input.athleteId,
      after: redact(input, CLINICAL_FIELDS),
    });
    await callWithin(ctx, setStatus, {
      caseId: saved.id,
      status: input.status,
      effectiveFrom: input.statusEffectiveFrom,
      note: input.statusNote ?? null,
      cause: { kind: 'case_opened' },
    });
    return caseAsSeen(ctx, saved.id);
  },
});

/** The clinician's own fields of an open case; none of them changes what the athlete may do. */
export const updateCase = orgCommand({
  name: 'updateCase',
  async run(ctx, input: CaseUpdateInput & { caseId: string }): Promise<CaseDto> {
    const { caseId, version, ...changes } = input;
    const c = await loadCase(ctx.m, caseId, ctx.actor.organizationId);
    authorize(ctx.ability, 'update', 'Case', c);
    if (c.closedOn) throw new AppError('conflict', 'This case is closed. Open a new case for a new episode.');
    await updateVersioned(ctx.m, CaseRecord, c.id, version, { ...changes, updatedAt: () => 'now()' }, 'case');
    const before = Object.fromEntries(Object.keys(changes).map((k) => [k, c[k as keyof typeof changes]]));
    await ctx.audit({
      action: 'case.updated',
      subjectType: 'Case',
      subjectId: c.id,
      athleteId: c.athleteId,
      before: redact(before, CLINICAL_FIELDS),
      after: redact(changes, CLINICAL_FIELDS),
    });
    return caseAsSeen(ctx, c.id);
  },
});

/** The clinician's status form: one status change, then the case with its history. */
export const changeStatus = orgCommand({
  name: 'changeStatus',
  changesLimits: true,
  async run(ctx, input: { caseId: string; status: ParticipationStatus; effectiveFrom: string; note?: string; version: number }) {
    await callWithin(ctx, setStatus, {
      caseId: input.caseId,
      status: input.status,
      effectiveFrom: input.effectiveFrom,
      note: input.note ?? null,
      cause: { kind: 'clinician', version: input.version },
    });
    return { ...(await caseAsSeen(ctx, input.caseId)), statusHistory: await statusHistory(ctx.m, input.caseId) } satisfies CaseDetailDto;
  },
});

/** Closes a resolved case: its plan and status stop counting from the closing day. */
export const closeCase = orgCommand({
  name: 'closeCase',
  changesLimits: true,
  async run(ctx, input: CaseCloseInput & { caseId: string }): Promise<CaseDto> {
    const { caseId, ...body } = input;
    const c = await loadCase(ctx.m, caseId, ctx.actor.organizationId);
    authorize(ctx.ability, 'update', 'Case', c);
    if (c.closedOn) throw new AppError('conflict', 'This case is already closed.');
    if (body.closedOn > ctx.today) {
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
      ctx.m,
      CaseRecord,
      c.id,
      body.version,
      { closedOn: body.closedOn, closingNote: body.closingNote ?? null, updatedAt: () => 'now()' },
      'case',
    );
    await ctx.audit({
      action: 'case.closed',
      subjectType: 'Case',
      subjectId: c.id,
      athleteId: c.athleteId,
      before: { closedOn: null },
      after: body,
    });
    await ctx.limitsChanged({ athleteIds: [c.athleteId], reason: 'The clinician closed a case.' });
    return caseAsSeen(ctx, c.id);
  },
});

/**
 * One case with its status history. A command, not a query: a clinician's read of the clinical
 * notes is itself written to the audit trail (45 CFR 164.312(b)).
 */
export const viewCase = orgCommand({
  name: 'viewCase',
  async run(ctx, input: { caseId: string }): Promise<CaseDetailDto> {
    const [dto] = await listCases(ctx.m, ctx.ability, ctx.actor.organizationId, { caseId: input.caseId }, ctx.today, true);
    authorize(ctx.ability, 'read', 'Case', dto);
    const detail: CaseDetailDto = { ...dto };
    if ('statusNote' in dto) detail.statusHistory = await statusHistory(ctx.m, dto.id);
    // The way back to the reports behind the case: ids and times only, so this read discloses no narrative.
    if (ctx.ability.can('read', 'PainReport')) {
      const reports = await listPainReports(ctx.m, ctx.ability, ctx.actor.organizationId, { caseId: dto.id });
      detail.painReports = reports.map((r) => ({ id: r.id, reportedAt: r.reportedAt }));
    }
    if ('clinicalNotes' in dto) {
      await ctx.audit({ action: 'case.viewed', subjectType: 'Case', subjectId: dto.id, athleteId: dto.athleteId });
    }
    return detail;
  },
});
