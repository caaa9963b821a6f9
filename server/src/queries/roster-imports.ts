import { DataSource } from 'typeorm';
import type { RosterImportDto, RosterLastCheckDto } from '../../../policies/dto';
import { RosterImport } from '../entities';
import { orgQuery } from '../core/command';
import { authorize } from '../core/authorize';
import { AppError } from '../core/errors';
import { toRosterImportDto, toRosterPreviewDto } from '../commands/roster';
import { loadRosterState } from '../services/roster';

/** A roster import's progress and counts (polled by the page); the rows themselves are not sent again. */
export const getRosterImport = orgQuery({
  name: 'getRosterImport',
  async run(ctx, input: { id: string }): Promise<RosterImportDto> {
    authorize(ctx.ability, 'create', 'Invitation', { id: '', organizationId: ctx.actor.organizationId });
    const found = await ctx.db.getRepository(RosterImport).findOne({
      where: { id: input.id, organizationId: ctx.actor.organizationId },
      select: {
        id: true,
        status: true,
        fileName: true,
        totalRows: true,
        processed: true,
        createdRows: true,
        updatedRows: true,
        unchangedRows: true,
        skippedRows: true,
        invitations: true,
        error: true,
        createdAt: true,
        finishedAt: true,
      },
    });
    if (!found) throw new AppError('not_found', 'That roster import does not exist.');
    return toRosterImportDto(found);
  },
});

/**
 * The reader's last checked file not yet imported (previewRosterImport keeps one per admin), planned
 * again against the people here now, so a reload of the page shows it with its import button. None once
 * it is started or when there is none.
 */
export const getLastRosterCheck = orgQuery({
  name: 'getLastRosterCheck',
  async run(ctx, _input: void): Promise<RosterLastCheckDto> {
    authorize(ctx.ability, 'create', 'Invitation', { id: '', organizationId: ctx.actor.organizationId });
    const m = ctx.db instanceof DataSource ? ctx.db.manager : ctx.db;
    const found = await m.getRepository(RosterImport).findOne({
      where: { organizationId: ctx.actor.organizationId, createdBy: ctx.userId, status: 'previewed' },
      order: { createdAt: 'DESC' },
    });
    if (!found) return { preview: null };
    const state = await loadRosterState(m, ctx.actor.organizationId);
    return { preview: toRosterPreviewDto(found, found.rows, state.world, ctx.today) };
  },
});
