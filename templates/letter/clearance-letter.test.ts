import { describe, expect, it } from 'vitest';
import { getDocument, OPS } from 'pdfjs-dist/legacy/build/pdf.mjs';
import { decisionWords, LETTER_CAUTION, renderLetterPdf, SAMPLE_LETTER, type LetterData } from './clearance-letter';

/** What a reader of the PDF gets: its text (line breaks as spaces), the fonts its pages draw with, and its XMP metadata. */
async function readPdf(bytes: Buffer) {
  const doc = await getDocument({ data: new Uint8Array(bytes), useSystemFonts: false, isEvalSupported: false }).promise;
  const meta = await doc.getMetadata();
  const lines: string[] = [];
  const fonts = new Map<string, { name: string; embedded: boolean }>();
  for (let n = 1; n <= doc.numPages; n++) {
    const page = await doc.getPage(n);
    const content = await page.getTextContent();
    lines.push(content.items.map((i) => ('str' in i ? i.str + (i.hasEOL ? ' ' : '') : '')).join(''));
    const ops = await page.getOperatorList();
    for (let i = 0; i < ops.fnArray.length; i++) {
      if (ops.fnArray[i] !== OPS.setFont) continue;
      const id = ops.argsArray[i][0] as string;
      const font = page.commonObjs.get(id) as { name: string; missingFile: boolean };
      fonts.set(id, { name: font.name, embedded: !font.missingFile });
    }
  }
  const text = lines.join(' ').replace(/\s+/g, ' ').trim();
  await doc.destroy();
  return {
    text,
    pages: doc.numPages,
    fonts: [...fonts.values()],
    metadata: meta.metadata as { get(name: string): unknown } | null,
    info: meta.info as Record<string, unknown>,
  };
}

const oneLine = (s: string) => s.replace(/\s+/g, ' ');

describe('the clearance letter PDF, rendered from its sample data', () => {
  it('says the decision, its dates, the limits in force, the signature and the verification code, in plain words', async () => {
    const pdf = await renderLetterPdf(SAMPLE_LETTER);
    expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    const { text, pages } = await readPdf(pdf);
    expect(pages).toBe(1);
    for (const part of [
      'SAMPLE CLUB',
      'Clearance letter',
      'Sample Athlete',
      'Limited participation from 1 December 2026',
      'Valid until 31 December 2026 (next review).',
      'Limits on training',
      '• Hinge: up to 60% of your best lift, effort RPE 7 or easier',
      '• Jump / landing: not allowed for now',
      'Sample note for the family.',
      'Born 1 June 2010',
      'Sample Clinician — 1 December 2026, 09:00 (UTC)',
      'Contact: clinician@sample.example',
      'Sample Clinician, ATC, licence AT-000000',
      'Verification code: ABCD-EFGH-JKMN-PQRS-TVWX',
      'http://127.0.0.1:3000/check/ABCD-EFGH-JKMN-PQRS-TVWX',
    ]) {
      expect(text, part).toContain(part);
    }
    expect(text).not.toMatch(/DRAFT/);
  });

  it('ends with the caution, whole', async () => {
    const { text } = await readPdf(await renderLetterPdf(SAMPLE_LETTER));
    expect(text).toContain(oneLine(LETTER_CAUTION));
    expect(text.endsWith(oneLine(LETTER_CAUTION))).toBe(true);
  });

  it('draws every glyph in Public Sans, embedded in the file (no viewer substitutes a font)', async () => {
    const pdf = await renderLetterPdf(SAMPLE_LETTER);
    const { fonts } = await readPdf(pdf);
    expect(fonts.length).toBeGreaterThanOrEqual(2);
    for (const f of fonts) {
      expect(f.name, JSON.stringify(f)).toMatch(/^[A-Z]{6}\+PublicSans-(Regular|Bold)$/);
      expect(f.embedded, f.name).toBe(true);
    }
    expect(new Set(fonts.map((f) => f.name.split('+')[1]))).toEqual(new Set(['PublicSans-Regular', 'PublicSans-Bold']));
    // In the file itself: embedded TrueType programs, and none of the 14 standard fonts (never embedded).
    const raw = pdf.toString('latin1');
    expect(raw.match(/\/FontFile2 /g)?.length).toBe(2);
    expect(raw).not.toMatch(/\/BaseFont\s*\/(Helvetica|Times|Courier|Symbol|ZapfDingbats)/);
  });

  it('carries the PDF/A-2b markers: pdfaid in the XMP metadata, an output intent, a tagged structure and a language', async () => {
    const pdf = await renderLetterPdf(SAMPLE_LETTER);
    const { metadata, info } = await readPdf(pdf);
    expect(metadata, 'XMP metadata').not.toBeNull();
    expect(metadata!.get('pdfaid:part')).toBe('2');
    expect(metadata!.get('pdfaid:conformance')).toBe('B');
    expect(metadata!.get('dc:title')).toBe('Clearance letter — Sample Athlete');
    expect(info).toMatchObject({
      Language: 'en',
      Title: 'Clearance letter — Sample Athlete',
      Subject: 'Limited participation from 1 December 2026',
    });
    const raw = pdf.toString('latin1');
    expect(raw).toContain('/OutputIntents');
    expect(raw).toMatch(/\/GTS_PDFA1/);
    expect(raw).toMatch(/\/Type \/Catalog[^]*?\/MarkInfo \d+ 0 R[^]*?\/StructTreeRoot \d+ 0 R/);
    expect(raw).toMatch(/\/Marked true/);
  });

  it('a draft is marked DRAFT and has no verification code, no check link and no signature', async () => {
    const draft: LetterData = { ...SAMPLE_LETTER, draft: true };
    const { text } = await readPdf(await renderLetterPdf(draft));
    expect(text).toContain('DRAFT — not signed, not valid');
    expect(text).toContain('(not yet signed)');
    expect(text).not.toContain(SAMPLE_LETTER.verificationCode);
    expect(text).not.toContain('Verification code');
    expect(text).not.toContain('/check/');
    expect(text).not.toContain('09:00 (UTC)');
    // Still the decision, dates and caution: a draft is checked before it is signed.
    expect(text).toContain('Limited participation from 1 December 2026');
    expect(text).toContain(oneLine(LETTER_CAUTION));
  });

  it('a full decision with no end date says so, and lists no limits even if some were left on the record', async () => {
    const full: LetterData = { ...SAMPLE_LETTER, decision: 'full', validUntil: null, familyNote: '' };
    const { text } = await readPdf(await renderLetterPdf(full));
    expect(text).toContain('Full participation from 1 December 2026');
    expect(text).toContain('Valid until a clinician changes it.');
    expect(text).not.toContain('Limits on training');
    expect(text).not.toContain('Hinge');
    expect(text).not.toContain('A note for the family');
  });

  it('a long list of limits flows onto a second page rather than off the first', async () => {
    const limits = Array.from({ length: 30 }, (_, i) => `Limit number ${i + 1}: ${'a plain-words rule, '.repeat(8)}end`);
    const { text, pages } = await readPdf(await renderLetterPdf({ ...SAMPLE_LETTER, limits }));
    expect(pages).toBeGreaterThan(1);
    for (const l of limits) expect(text).toContain(l);
    expect(text).toContain(SAMPLE_LETTER.verificationCode);
    expect(text).toContain(oneLine(LETTER_CAUTION));
  });
});

describe('decisionWords', () => {
  it('names the decision and its first day without time zones moving the date', () => {
    expect(decisionWords({ decision: 'full', effectiveFrom: '2026-01-01' })).toBe('Full participation from 1 January 2026');
    expect(decisionWords({ decision: 'limited', effectiveFrom: '2026-12-31' })).toBe('Limited participation from 31 December 2026');
  });
});

describe('names outside basic Latin', () => {
  it('prints Polish and Vietnamese names with glyphs from the matching Public Sans files', async () => {
    const latinOnly = await readPdf(await renderLetterPdf(SAMPLE_LETTER));
    const { text, fonts } = await readPdf(
      await renderLetterPdf({ ...SAMPLE_LETTER, athleteName: 'Łucja Żółć-Nguyễn', signature: 'Đặng Thu' }),
    );
    expect(text).toContain('Łucja Żółć-Nguyễn');
    expect(text).toContain('Đặng Thu');
    // The latin-ext and vietnamese files are embedded and drawn with, besides the latin ones.
    expect(fonts.length).toBeGreaterThan(latinOnly.fonts.length);
    expect(fonts.every((f) => f.embedded)).toBe(true);
  });
});
