import type { RosterImportDto, RosterPreviewDto } from '../../../policies/dto';
import {
  applyToWorld,
  checkRosterFile,
  planRow,
  planWords,
  previewRoster,
  type CheckedRow,
  type RosterWorld,
} from '../../../policies/roster';
import { RosterImport } from '../entities';
import { orgCommand, type OrgCommandCtx } from '../core/command';
import { authorize } from '../core/authorize';
import { AppError } from '../core/errors';
import { applyRosterRow, loadRosterState, parseRosterCsv } from '../services/roster';

/**
 * Bringing a roster (a CSV of people, checked before anything is written). An admin uploads a CSV; the
 * preview checks every row (policies/roster.ts) against the organization and stores the checked rows, writing
 * nothing else. Starting the import queues one background job (services/roster-import-job.ts), which runs
 * `importRosterBatch` until every row is done: each batch is one transaction, planned again against the
 * database as it is then, so importing the same file twice changes nothing. Roster imports are the admin's:
 * whoever may invite may import.
 */

/** Rows per transaction: small enough that no request waits long on the rows a batch locks. */
export const ROSTER_BATCH = 25;

function mayImport(ctx: OrgCommandCtx): void {
  authorize(ctx.ability, 'create', 'Invitation', { id: '', organizationId: ctx.actor.organizationId });
}

export function toRosterImportDto(r: RosterImport): RosterImportDto {
  return {
    id: r.id,
    status: r.status,
    fileName: r.fileName,
    totalRows: r.totalRows,
    processed: r.processed,
    created: r.createdRows,
    updated: r.updatedRows,
    unchanged: r.unchangedRows,
    skipped: r.skippedRows,
    invitations: r.invitations,
    error: r.error,
    createdAt: r.createdAt.toISOString(),
    finishedAt: r.finishedAt?.toISOString() ?? null,
  };
}

/**
 * What importing the checked rows would do, planned in order against the organization as it is now:
 * the answer to the upload, and again when the page is reloaded before importing (getLastRosterCheck).
 */
export function toRosterPreviewDto(r: RosterImport, checked: CheckedRow[], world: RosterWorld, today: string): RosterPreviewDto {
  const { rows, counts } = previewRoster({ fileProblems: [], rows: checked }, world, today);
  return {
    import: toRosterImportDto(r),
    counts,
    rows: rows.map((p) => ({
      line: p.row.line,
      name: p.row.name,
      email: p.row.email,
      outcome: p.outcome,
      problems: p.problems,
      does: p.plan ? planWords(p.plan) : [],
    })),
  };
}

/**
 * Checks an uploaded file and keeps its checked rows as the admin's one check waiting to be imported:
 * an earlier check of theirs not yet imported is deleted (its rows are of an older file, and nothing
 * else points to it), so a reload shows the file checked last (getLastRosterCheck).
 */
export const previewRosterImport = orgCommand({
  name: 'previewRosterImport',
  async run(ctx, input: { bytes: Buffer; fileName: string | null; sha256: string }): Promise<RosterPreviewDto> {
    mayImport(ctx);
    const { header, records } = parseRosterCsv(input.bytes);
    const file = checkRosterFile(header, records, ctx.today);
    if (file.fileProblems.length)
      throw new AppError('validation_failed', `The file cannot be imported: ${file.fileProblems.join(' ')}`, { file: file.fileProblems });
    const [replaced]: [{ id: string }[], number] = await ctx.m.query(
      `DELETE FROM roster_imports WHERE organization_id = $1 AND created_by = $2 AND status = 'previewed' RETURNING id`,
      [ctx.actor.organizationId, ctx.userId],
    );
    const state = await loadRosterState(ctx.m, ctx.actor.organizationId);
    const saved = await ctx.m.save(
      ctx.m.create(RosterImport, {
        organizationId: ctx.actor.organizationId,
        createdBy: ctx.userId,
        status: 'previewed',
        fileName: input.fileName,
        fileSha256: input.sha256,
        rows: file.rows,
        totalRows: file.rows.length,
      }),
    );
    const preview = toRosterPreviewDto(saved, file.rows, state.world, ctx.today);
    await ctx.audit({
      action: 'roster.previewed',
      subjectType: 'RosterImport',
      subjectId: saved.id,
      after: {
        fileName: input.fileName,
        sha256: input.sha256,
        ...preview.counts,
        ...(replaced.length ? { replaces: replaced.map((r) => r.id) } : {}),
      },
    });
    return preview;
  },
});

async function lockedImport(ctx: OrgCommandCtx, id: string): Promise<RosterImport> {
  const found = await ctx.m
    .createQueryBuilder(RosterImport, 'r')
    .select([
      'r.id',
      'r.organizationId',
      'r.createdBy',
      'r.status',
      'r.fileName',
      'r.fileSha256',
      'r.totalRows',
      'r.processed',
      'r.createdRows',
      'r.updatedRows',
      'r.unchangedRows',
      'r.skippedRows',
      'r.invitations',
      'r.error',
      'r.createdAt',
      'r.startedAt',
      'r.finishedAt',
      'r.version',
    ])
    .where('r.id = :id AND r.organization_id = :org', { id, org: ctx.actor.organizationId })
    .setLock('pessimistic_write')
    .getOne();
  if (!found) throw new AppError('not_found', 'That roster import does not exist.');
  return found;
}

/** Queues the import of a previewed file (or resumes one that stopped); the job is sent in this transaction. */
export const startRosterImport = orgCommand({
  name: 'startRosterImport',
  async run(ctx, input: { id: string }): Promise<RosterImportDto> {
    mayImport(ctx);
    const r = await lockedImport(ctx, input.id);
    if (r.status !== 'previewed' && r.status !== 'failed')
      throw new AppError('conflict', r.status === 'done' ? 'This file has already been imported.' : 'This file is already being imported.');
    r.status = 'queued';
    r.error = null;
    r.startedAt ??= ctx.now;
    await ctx.m.update(RosterImport, { id: r.id }, { status: r.status, error: null, startedAt: r.startedAt, version: () => 'version + 1' });
    await ctx.audit({ action: 'roster.import_started', subjectType: 'RosterImport', subjectId: r.id, after: { rows: r.totalRows } });
    await ctx.deps.jobs?.sendRosterImport(ctx.m, r.id);
    return toRosterImportDto(r);
  },
});

/**
 * Imports the next batch of rows of a started import, in one transaction with its audit entries and
 * the invitations' e-mails. Rows are planned afresh, so one changed in the meantime (by an admin, or by
 * an earlier row of the same file) is only completed, never made twice. Answers whether rows remain.
 */
export const importRosterBatch = orgCommand({
  name: 'importRosterBatch',
  changesLimits: true,
  async run(ctx, input: { id: string; size?: number }): Promise<{ more: boolean }> {
    mayImport(ctx);
    const r = await lockedImport(ctx, input.id);
    if (r.status !== 'queued' && r.status !== 'running') {
      ctx.limitsUnchanged();
      return { more: false };
    }
    const size = input.size ?? ROSTER_BATCH;
    const [{ rows }]: { rows: RosterImport['rows'] | null }[] = await ctx.m.query(
      `SELECT jsonb_agg(e ORDER BY i) AS rows
         FROM roster_imports r, jsonb_array_elements(r."rows") WITH ORDINALITY AS t(e, i)
        WHERE r.id = $1 AND i > $2 AND i <= $2 + $3`,
      [r.id, r.processed, size],
    );
    const state = await loadRosterState(ctx.m, ctx.actor.organizationId);
    const coached: string[] = [];
    const counts = { created: 0, updated: 0, unchanged: 0, skipped: 0, invitations: 0 };
    for (const checked of rows ?? []) {
      const planned = planRow(checked, state.world, ctx.today);
      if (!planned.plan) counts.skipped += 1;
      else if (planned.outcome === 'unchanged') counts.unchanged += 1;
      else {
        const applied = await applyRosterRow(ctx, state, planned.row, planned.plan);
        applyToWorld(state.world, planned.row, planned.plan);
        counts[planned.outcome === 'create' ? 'created' : 'updated'] += 1;
        counts.invitations += applied.invitations;
        if (applied.coachChanged) coached.push(applied.athleteId);
      }
    }
    const processed = r.processed + (rows?.length ?? 0);
    const done = processed >= r.totalRows;
    await ctx.m.update(
      RosterImport,
      { id: r.id },
      {
        status: done ? 'done' : 'running',
        processed,
        createdRows: () => `created_rows + ${counts.created}`,
        updatedRows: () => `updated_rows + ${counts.updated}`,
        unchangedRows: () => `unchanged_rows + ${counts.unchanged}`,
        skippedRows: () => `skipped_rows + ${counts.skipped}`,
        invitations: () => `invitations + ${counts.invitations}`,
        finishedAt: done ? ctx.now : null,
        version: () => 'version + 1',
      },
    );
    if (done) {
      await ctx.audit({
        action: 'roster.imported',
        subjectType: 'RosterImport',
        subjectId: r.id,
        after: {
          rows: r.totalRows,
          created: r.createdRows + counts.created,
          updated: r.updatedRows + counts.updated,
          unchanged: r.unchangedRows + counts.unchanged,
          skipped: r.skippedRows + counts.skipped,
          invitations: r.invitations + counts.invitations,
        },
      });
    }
    // Who coaches an athlete decides who is told of their held sessions (commands/limits.ts).
    if (coached.length) await ctx.limitsChanged({ athleteIds: coached, reason: 'The roster import changed who coaches the athlete.' });
    else ctx.limitsUnchanged();
    return { more: !done };
  },
});

/** Marks an import stopped with the reason, so the page says so and the admin may start it again (it resumes). */
export const failRosterImport = orgCommand({
  name: 'failRosterImport',
  async run(ctx, input: { id: string; error: string }): Promise<void> {
    const r = await lockedImport(ctx, input.id);
    if (r.status === 'done') return;
    await ctx.m.update(RosterImport, { id: r.id }, { status: 'failed', error: input.error.slice(0, 500), version: () => 'version + 1' });
    await ctx.audit({
      action: 'roster.import_failed',
      subjectType: 'RosterImport',
      subjectId: r.id,
      after: { processed: r.processed, rows: r.totalRows, error: input.error.slice(0, 200) },
    });
  },
});
