import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { woffToSfnt } from './woff';

const require = createRequire(import.meta.url);

/**
 * Public Sans ships (in @fontsource) as separate files per script subset; pdfkit draws each run of
 * text with one font and does not fall back between fonts. So text is cut into runs by the subset
 * that holds each character, using the package's own unicode ranges, and each run is drawn with the
 * matching file. Names such as "Łucja Żółć" or "Nguyễn" then print instead of empty boxes.
 */
export const SUBSETS = ['latin', 'latin-ext', 'vietnamese'] as const;
export type Subset = (typeof SUBSETS)[number];

const UNICODE = require('@fontsource/public-sans/unicode.json') as Record<Subset, string>;

function parseRanges(spec: string): [number, number][] {
  return spec.split(',').map((part) => {
    const [from, to] = part.trim().replace(/^U\+/i, '').split('-');
    const start = parseInt(from, 16);
    return [start, to ? parseInt(to, 16) : start];
  });
}

const RANGES: [Subset, [number, number][]][] = SUBSETS.map((s) => [s, parseRanges(UNICODE[s])]);

export function subsetOf(codePoint: number): Subset {
  for (const [subset, ranges] of RANGES) if (ranges.some(([a, b]) => codePoint >= a && codePoint <= b)) return subset;
  return 'latin';
}

export interface FontRun {
  subset: Subset;
  text: string;
}

/** Splits text (normalized to composed form) into runs of one subset; spaces stay with the run they are in. */
export function fontRuns(text: string): FontRun[] {
  const runs: FontRun[] = [];
  for (const ch of text.normalize('NFC')) {
    const last = runs.at(-1);
    const subset = last && /\s/.test(ch) ? last.subset : subsetOf(ch.codePointAt(0)!);
    if (last && last.subset === subset) last.text += ch;
    else runs.push({ subset, text: ch });
  }
  return runs;
}

export type Weight = 'Body' | 'Bold';

/**
 * The fonts to register with pdfkit: each subset's WOFF file from the package, unwrapped once per
 * process into the plain font inside it (woff.ts: fontkit would otherwise inflate the glyph table
 * again for every glyph of every document).
 */
let loaded: { name: string; file: Buffer }[] | null = null;
export function fontFiles(): { name: string; file: Buffer }[] {
  loaded ??= (['Body', 'Bold'] as const).flatMap((weight) =>
    SUBSETS.map((subset) => ({
      name: fontName(weight, subset),
      file: woffToSfnt(
        readFileSync(require.resolve(`@fontsource/public-sans/files/public-sans-${subset}-${weight === 'Body' ? 400 : 700}-normal.woff`)),
      ),
    })),
  );
  return loaded;
}

export function fontName(weight: Weight, subset: Subset): string {
  return subset === 'latin' ? weight : `${weight}-${subset}`;
}

/** Draws `text` like `doc.text`, switching font file per run; the document is left in the weight's latin font. */
export function writeText(
  doc: PDFKit.PDFDocument,
  weight: Weight,
  text: string,
  options?: PDFKit.Mixins.TextOptions,
  x?: number,
): PDFKit.PDFDocument {
  const runs = fontRuns(text);
  if (runs.length <= 1) {
    doc.font(fontName(weight, runs[0]?.subset ?? 'latin'));
    if (x === undefined) doc.text(text.normalize('NFC'), options);
    else doc.text(text.normalize('NFC'), x, undefined, options);
  } else {
    runs.forEach((run, i) => {
      doc.font(fontName(weight, run.subset));
      const opts = { ...options, continued: i < runs.length - 1 };
      if (i === 0 && x !== undefined) doc.text(run.text, x, undefined, opts);
      else doc.text(run.text, opts);
    });
  }
  return doc.font(weight);
}
