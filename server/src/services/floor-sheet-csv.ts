import { stringify } from 'csv-stringify/sync';
import { FLOOR_CSV_COLUMNS, floorCsvRecords, type FloorSheet } from '../../../policies/load/floor-sheet';

/**
 * The floor sheet as CSV: the same rows as the PDF (policies/load/floor-sheet.ts), one record per
 * athlete and exercise. Names, titles and notes are typed by people, so a cell that a spreadsheet
 * would read as a formula (starting with = + - @, a tab or a carriage return) is prefixed with a
 * quote by csv-stringify's escape_formulas (OWASP "CSV Injection").
 */
export function renderFloorSheetCsv(sheet: FloorSheet): string {
  return stringify(floorCsvRecords(sheet), { header: true, columns: [...FLOOR_CSV_COLUMNS], escape_formulas: true, bom: true });
}
