import { floorSheetFileName } from '../../../policies/load/floor-sheet';
import { orgCommand } from '../core/command';
import { floorSheetFor } from '../queries/floor-sheet';
import { renderFloorSheetCsv } from '../services/floor-sheet-csv';
import { renderFloorSheetPdf } from '../services/floor-sheet-pdf';

/**
 * Download a team session's floor sheet (PDF or CSV). A read, but the download is recorded: the sheet
 * names every athlete of the group beside their limits-fitted loads, and it leaves the app on paper.
 */
export const downloadFloorSheet = orgCommand<{ id: string; format: 'pdf' | 'csv' }, { body: Buffer | string; filename: string }>({
  name: 'floor_sheet.download',
  async run(ctx, { id, format }) {
    const sheet = await floorSheetFor(ctx.m, ctx.actor, id);
    await ctx.audit({
      action: 'floor_sheet.downloaded',
      subjectType: 'ProgramSession',
      subjectId: sheet.teamSessionId,
      after: { format, date: sheet.date, athletes: sheet.rows.length },
    });
    const body = format === 'pdf' ? await renderFloorSheetPdf(sheet) : renderFloorSheetCsv(sheet);
    return { body, filename: floorSheetFileName(sheet, format) };
  },
});
