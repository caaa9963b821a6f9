import type { RosterImportDto } from '../../../policies/dto';
import { RosterImport } from '../entities';
import { orgQuery } from '../core/command';
import { authorize } from '../core/authorize';
import { AppError } from '../core/errors';
import { toRosterImportDto } from '../commands/roster';

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
