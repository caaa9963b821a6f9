import PDFDocument from 'pdfkit';
import { FLOOR_CAUTION, FLOOR_MARK_LEGEND, type FloorRow, type FloorSheet } from '../../../policies/load/floor-sheet';
import type { LetterPaper } from '../../../policies/letter-paper';
import { humanDate } from '../../../policies/words/dates';
import { fontFiles, writeText, type Weight } from '../../../templates/letter/font-runs';

/**
 * The floor sheet as a PDF: landscape on the organization's paper (A4 or US Letter, as its letters),
 * Public Sans embedded (the letter's fonts, with the same run splitting so every name prints), one
 * row per athlete, and the header — group, session, date, the mark's legend and the cautions — again
 * on every page, so any page taped up alone still says what it is.
 */

const PDF_SIZES: Record<LetterPaper, string> = { a4: 'A4', letter: 'LETTER' };
const INK = '#14202e';
const GREY = '#5b6470';
const ACCENT = '#c2571a';
const RULE = '#c9ced6';
const MARGIN = 32;

interface Columns {
  mark: number;
  athlete: number;
  state: number;
  sets: number;
  note: number;
}

/** A small filled diamond: the fitted mark (drawn, so it needs no glyph the font lacks). */
function diamond(doc: PDFKit.PDFDocument, x: number, y: number, size = 4) {
  doc
    .save()
    .moveTo(x, y - size)
    .lineTo(x + size, y)
    .lineTo(x, y + size)
    .lineTo(x - size, y)
    .closePath()
    .fill(ACCENT)
    .restore();
}

function columnsFor(doc: PDFKit.PDFDocument): Columns & { x: Columns } {
  const width = doc.page.width - 2 * MARGIN;
  const w = { mark: 16, athlete: 140, state: 88, note: 170, sets: 0 };
  w.sets = width - w.mark - w.athlete - w.state - w.note;
  const x = { mark: MARGIN, athlete: 0, state: 0, sets: 0, note: 0 };
  x.athlete = x.mark + w.mark;
  x.state = x.athlete + w.athlete;
  x.sets = x.state + w.state;
  x.note = x.sets + w.sets;
  return { ...w, x };
}

const PAD = 4;

function cellText(doc: PDFKit.PDFDocument, weight: Weight, size: number, color: string, text: string, x: number, y: number, width: number) {
  doc.y = y;
  writeText(doc.fontSize(size).fillColor(color), weight, text, { width, lineGap: 1 }, x);
  return doc.y;
}

function height(doc: PDFKit.PDFDocument, weight: Weight, size: number, text: string, width: number): number {
  return text ? doc.font(weight).fontSize(size).heightOfString(text.normalize('NFC'), { width, lineGap: 1 }) : 0;
}

/** The exercise column of one row: each exercise with its sets, and its plates in grey beneath. */
function setsLines(row: FloorRow): { title: string; plates: string; marked: boolean }[] {
  return row.lines.map((l) => ({ title: `${l.exercise}: ${l.sets}`, plates: l.plates ? `Plates — ${l.plates}` : '', marked: l.marked }));
}

function rowHeight(doc: PDFKit.PDFDocument, row: FloorRow, c: ReturnType<typeof columnsFor>): number {
  const setsWidth = c.sets - 2 * PAD - 10;
  const sets = setsLines(row).reduce(
    (sum, l) => sum + height(doc, 'Body', 11, l.title, setsWidth) + height(doc, 'Body', 9.5, l.plates, setsWidth) + 3,
    0,
  );
  const athlete = height(doc, 'Bold', 11.5, row.athleteName, c.athlete - 2 * PAD) + 12;
  const state = height(doc, 'Bold', 9.5, row.stateWords, c.state - 2 * PAD);
  const note = height(doc, 'Body', 8.5, row.note, c.note - 2 * PAD);
  return Math.max(sets, athlete, state, note, 14) + 2 * PAD;
}

function drawHeader(doc: PDFKit.PDFDocument, sheet: FloorSheet, c: ReturnType<typeof columnsFor>) {
  const width = doc.page.width - 2 * MARGIN;
  doc.y = MARGIN;
  writeText(doc.fillColor(INK).fontSize(8.5), 'Bold', sheet.organizationName.toUpperCase(), { characterSpacing: 0.8, width }, MARGIN);
  doc.y += 2;
  writeText(doc.fontSize(16), 'Bold', `Floor sheet — ${sheet.sessionTitle}`, { width }, MARGIN);
  writeText(
    doc.fontSize(10).fillColor(GREY),
    'Body',
    `${sheet.groupName} · ${sheet.programName} · ${humanDate(sheet.date)}`,
    { width },
    MARGIN,
  );
  if (!sheet.published)
    writeText(
      doc.fillColor(ACCENT),
      'Bold',
      'Not published yet: the sets may still change. Check with the coach before training.',
      { width },
      MARGIN,
    );
  doc.y += 3;
  const legendY = doc.y;
  diamond(doc, MARGIN + 4, legendY + 5);
  writeText(doc.fontSize(8.5).fillColor(INK), 'Body', FLOOR_MARK_LEGEND, { width: width - 14 }, MARGIN + 14);
  writeText(
    doc.fillColor(GREY),
    'Body',
    `${FLOOR_CAUTION} Loads are in each athlete's own unit; plates assume a 20 kg or 45 lb bar and no collars.`,
    { width },
    MARGIN,
  );
  doc.y += 6;
  const headY = doc.y;
  doc.font('Bold').fontSize(8.5).fillColor(GREY);
  for (const [key, label] of [
    ['athlete', 'Athlete'],
    ['state', 'State'],
    ['sets', 'Exercises and sets (load × reps)'],
    ['note', 'Note'],
  ] as const)
    doc.text(label, c.x[key] + PAD, headY, { width: c[key] - 2 * PAD, lineBreak: false });
  doc.y = headY + 12;
  doc
    .moveTo(MARGIN, doc.y)
    .lineTo(doc.page.width - MARGIN, doc.y)
    .lineWidth(1)
    .strokeColor(INK)
    .stroke();
}

function drawRow(doc: PDFKit.PDFDocument, row: FloorRow, c: ReturnType<typeof columnsFor>, top: number, h: number) {
  if (row.marked) diamond(doc, c.x.mark + 7, top + PAD + 6, 5);
  cellText(doc, 'Bold', 11.5, INK, row.athleteName, c.x.athlete + PAD, top + PAD, c.athlete - 2 * PAD);
  cellText(doc, 'Body', 8.5, GREY, `Loads in ${row.unit}`, c.x.athlete + PAD, doc.y, c.athlete - 2 * PAD);
  cellText(doc, 'Bold', 9.5, row.marked ? ACCENT : INK, row.stateWords, c.x.state + PAD, top + PAD, c.state - 2 * PAD);
  let y = top + PAD;
  const setsWidth = c.sets - 2 * PAD - 10;
  for (const l of setsLines(row)) {
    if (l.marked) diamond(doc, c.x.sets + PAD + 3, y + 7, 3.5);
    y = cellText(doc, 'Body', 11, INK, l.title, c.x.sets + PAD + 10, y, setsWidth);
    if (l.plates) y = cellText(doc, 'Body', 9.5, GREY, l.plates, c.x.sets + PAD + 10, y, setsWidth);
    y += 3;
  }
  if (row.note) cellText(doc, 'Body', 8.5, INK, row.note, c.x.note + PAD, top + PAD, c.note - 2 * PAD);
  doc
    .moveTo(MARGIN, top + h)
    .lineTo(doc.page.width - MARGIN, top + h)
    .lineWidth(0.5)
    .strokeColor(RULE)
    .stroke();
}

export async function renderFloorSheetPdf(sheet: FloorSheet & { paper: LetterPaper }): Promise<Buffer> {
  const doc = new PDFDocument({
    size: PDF_SIZES[sheet.paper],
    layout: 'landscape',
    margins: { top: MARGIN, bottom: MARGIN, left: MARGIN, right: MARGIN },
    bufferPages: true,
    pdfVersion: '1.7',
    tagged: true,
    lang: 'en',
    displayTitle: true,
    info: {
      Title: `Floor sheet — ${sheet.groupName.normalize('NFC')} — ${sheet.sessionTitle.normalize('NFC')} — ${sheet.date}`,
      Author: sheet.organizationName,
      Creator: 'Loadline',
    },
  } as PDFKit.PDFDocumentOptions);
  for (const f of fontFiles()) doc.registerFont(f.name, f.file);
  const chunks: Buffer[] = [];
  doc.on('data', (chunk: Buffer) => chunks.push(chunk));
  const done = new Promise<Buffer>((resolve) => doc.on('end', () => resolve(Buffer.concat(chunks))));

  const c = columnsFor(doc);
  // Room kept at the foot of each page for its page number.
  const bottom = () => doc.page.height - MARGIN - 14;
  drawHeader(doc, sheet, c);
  if (sheet.rows.length === 0) cellText(doc, 'Body', 10, GREY, 'This group has no athletes.', MARGIN + PAD, doc.y + PAD, 400);
  for (const row of sheet.rows) {
    const h = rowHeight(doc, row, c);
    if (doc.y + h > bottom()) {
      doc.addPage();
      drawHeader(doc, sheet, c);
    }
    const top = doc.y;
    drawRow(doc, row, c, top, h);
    doc.y = top + h;
  }
  const range = doc.bufferedPageRange();
  for (let i = range.start; i < range.start + range.count; i++) {
    doc.switchToPage(i);
    doc.page.margins.bottom = 0;
    doc
      .font('Body')
      .fontSize(8)
      .fillColor(GREY)
      .text(`Floor sheet · ${humanDate(sheet.date)} · page ${i + 1} of ${range.count}`, MARGIN, doc.page.height - MARGIN - 8, {
        width: doc.page.width - 2 * MARGIN,
        align: 'right',
        lineBreak: false,
      });
  }
  doc.end();
  return done;
}
