import PDFDocument from 'pdfkit';
import QRCode from 'qrcode';
import type { LetterPaper } from '../../policies/letter-paper';
import { nameWithCredential } from '../../policies/letters';
import { fontFiles, writeText } from './font-runs';

export interface LetterData {
  organizationName: string;
  athleteName: string;
  /** YYYY-MM-DD, printed so the letter names the athlete unmistakably; null when not recorded. */
  athleteDateOfBirth: string | null;
  decision: 'full' | 'limited';
  effectiveFrom: string;
  validUntil: string | null;
  limits: string[];
  clinicianName: string;
  credential: string;
  licenceNumber: string;
  /** How to reach the signing clinician (their e-mail address), printed once under the signature. */
  clinicianContact: string;
  signature: string;
  signedAt: string;
  familyNote: string;
  verificationCode: string;
  checkUrl: string;
  /** The organization's paper (policies/letter-paper.ts). */
  paper: LetterPaper;
  /** The organization's IANA zone: the signing time is printed on its clock, not UTC. */
  timeZone: string;
  /** Draft previews carry a watermark and no code. */
  draft?: boolean;
}

export const LETTER_CAUTION =
  'Loadline records the decision of the athlete’s licensed clinician; it does not diagnose, treat or replace professional care. ' +
  'Follow local law, your governing body’s rules and your organization’s policies. Stop a session and tell the clinician if pain rises past the ceiling they set. ' +
  'Warning signs — new numbness between the legs, new trouble controlling bladder or bowel, legs getting weaker, fever with back pain — mean stop and get urgent medical care now.';

export const SAMPLE_LETTER: LetterData = {
  organizationName: 'Sample Club',
  athleteName: 'Sample Athlete',
  athleteDateOfBirth: '2010-06-01',
  decision: 'limited',
  effectiveFrom: '2026-12-01',
  validUntil: '2026-12-31',
  limits: ['Hinge: up to 60% of your best lift, effort RPE 7 or easier', 'Jump / landing: not allowed for now'],
  clinicianName: 'Sample Clinician',
  credential: 'ATC',
  licenceNumber: 'AT-000000',
  clinicianContact: 'clinician@sample.example',
  signature: 'Sample Clinician',
  signedAt: '2026-12-01T09:00:00.000Z',
  familyNote: 'Sample note for the family.',
  verificationCode: 'ABCD-EFGH-JKMN-PQRS-TVWX',
  checkUrl: 'http://127.0.0.1:3000/check/ABCD-EFGH-JKMN-PQRS-TVWX',
  paper: 'a4',
  timeZone: 'UTC',
};

/** pdfkit's names for the papers: ISO 216 A4 is 595.28 × 841.89 pt, ANSI Letter 612 × 792 pt. */
const PDF_SIZES: Record<LetterPaper, string> = { a4: 'A4', letter: 'LETTER' };

const MONTHS = ['January', 'February', 'March', 'April', 'May', 'June', 'July', 'August', 'September', 'October', 'November', 'December'];
const day = (iso: string) => {
  const [y, m, d] = iso.slice(0, 10).split('-').map(Number);
  return `${d} ${MONTHS[m - 1]} ${y}`;
};

/**
 * An instant on the organization's clock: "1 December 2026, 03:00 (America/Chicago time)". The zone is
 * named, so a reader elsewhere knows which clock it is.
 */
export function timeInZone(iso: string, timeZone: string): string {
  const parts = Object.fromEntries(
    new Intl.DateTimeFormat('en-GB', {
      timeZone,
      year: 'numeric',
      month: '2-digit',
      day: '2-digit',
      hour: '2-digit',
      minute: '2-digit',
      hourCycle: 'h23',
    })
      .formatToParts(new Date(iso))
      .map((p) => [p.type, p.value]),
  );
  const zone = timeZone === 'UTC' ? 'UTC' : `${timeZone.replaceAll('_', ' ')} time`;
  return `${day(`${parts.year}-${parts.month}-${parts.day}`)}, ${parts.hour}:${parts.minute} (${zone})`;
}

export function decisionWords(d: Pick<LetterData, 'decision' | 'effectiveFrom'>): string {
  return `${d.decision === 'full' ? 'Full participation' : 'Limited participation'} from ${day(d.effectiveFrom)}`;
}

/**
 * The letter as a PDF (PDF/A-2b markers, Public Sans embedded, tagged). Returns the bytes; the
 * caller stores them and their SHA-256 and never renders the signed letter again.
 */
export async function renderLetterPdf(d: LetterData): Promise<Buffer> {
  const qr = d.draft ? null : await QRCode.toBuffer(d.checkUrl, { type: 'png', margin: 1, width: 240, errorCorrectionLevel: 'M' });
  const doc = new PDFDocument({
    size: PDF_SIZES[d.paper],
    margins: { top: 56, bottom: 56, left: 60, right: 60 },
    pdfVersion: '1.7',
    subset: 'PDF/A-2b',
    tagged: true,
    lang: 'en',
    displayTitle: true,
    info: {
      Title: `Clearance letter — ${d.athleteName.normalize('NFC')}`,
      Author: d.organizationName,
      Subject: decisionWords(d),
      Creator: 'Loadline',
    },
  } as PDFKit.PDFDocumentOptions);
  // Public Sans from the installed package (pdfkit reads .woff, not .woff2), one file per script subset.
  for (const f of fontFiles()) doc.registerFont(f.name, f.file);
  const chunks: Buffer[] = [];
  doc.on('data', (c: Buffer) => chunks.push(c));
  const done = new Promise<Buffer>((resolve) => doc.on('end', () => resolve(Buffer.concat(chunks))));

  const ink = '#14202e';
  const accent = '#c2571a';
  const grey = '#5b6470';
  writeText(doc.fillColor(ink).fontSize(11), 'Bold', d.organizationName.toUpperCase(), { characterSpacing: 1 });
  doc
    .moveTo(60, doc.y + 6)
    .lineTo(doc.page.width - 60, doc.y + 6)
    .lineWidth(2)
    .strokeColor(accent)
    .stroke();
  doc.moveDown(1.2);
  doc.font('Bold').fontSize(22).text('Clearance letter');
  if (d.draft) doc.font('Bold').fontSize(12).fillColor(accent).text('DRAFT — not signed, not valid').fillColor(ink);
  doc.moveDown(0.8);
  doc.font('Body').fontSize(11).fillColor(grey).text('Athlete');
  writeText(doc.fontSize(14).fillColor(ink), 'Bold', d.athleteName);
  if (d.athleteDateOfBirth)
    doc
      .font('Body')
      .fontSize(11)
      .text(`Born ${day(d.athleteDateOfBirth)}`);
  doc.moveDown(0.6);
  doc.font('Body').fontSize(11).fillColor(grey).text('Decision');
  doc.font('Bold').fontSize(14).fillColor(ink).text(decisionWords(d));
  doc
    .font('Body')
    .fontSize(11)
    .text(d.validUntil ? `Valid until ${day(d.validUntil)} (next review).` : 'Valid until a clinician changes it.');
  if (d.decision === 'limited' && d.limits.length) {
    doc.moveDown(0.6);
    doc.font('Bold').fontSize(12).text('Limits on training');
    doc.font('Body').fontSize(11);
    for (const l of d.limits) writeText(doc, 'Body', `•  ${l}`, { indent: 6 });
  }
  if (d.familyNote) {
    doc.moveDown(0.6);
    doc.font('Bold').fontSize(12).text('A note for the family');
    writeText(doc.fontSize(11), 'Body', d.familyNote);
  }
  doc.moveDown(1);
  doc.font('Bold').fontSize(12).text('Signed');
  writeText(doc.fontSize(11), 'Body', d.draft ? '(not yet signed)' : `${d.signature} — ${timeInZone(d.signedAt, d.timeZone)}`);
  writeText(doc, 'Body', `${nameWithCredential(d.clinicianName, d.credential)}, licence ${d.licenceNumber}`);
  if (d.clinicianContact) writeText(doc, 'Body', `Contact: ${d.clinicianContact}`);
  doc.moveDown(1);
  if (!d.draft && qr) {
    const y = doc.y;
    doc.image(qr, 60, y, { width: 96 });
    doc.font('Bold').fontSize(12).text('Check this letter', 172, y);
    doc.font('Body').fontSize(11).text(`Verification code: ${d.verificationCode}`, 172);
    doc.text(d.checkUrl, 172);
    doc.text('The check page shows only whether the letter is valid, its dates and decision — never medical details.', 172);
    doc.x = 60;
    doc.y = Math.max(doc.y, y + 104);
  }
  doc.moveDown(1);
  doc.font('Body').fontSize(9).fillColor(grey).text(LETTER_CAUTION, 60);
  doc.end();
  return done;
}
