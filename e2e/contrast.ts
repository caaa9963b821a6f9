import type { Locator } from '@playwright/test';

/**
 * Contrast as WCAG 2.1 defines it, for colours read from the browser with getComputedStyle.
 * - "relative luminance" (https://www.w3.org/TR/WCAG21/#dfn-relative-luminance): each sRGB channel
 *   c = C/255 is linearised as c/12.92 when c <= 0.03928, else ((c + 0.055)/1.055)^2.4, and
 *   L = 0.2126 R + 0.7152 G + 0.0722 B.
 * - "contrast ratio" (https://www.w3.org/TR/WCAG21/#dfn-contrast-ratio): (L1 + 0.05) / (L2 + 0.05),
 *   L1 the lighter. Success criterion 1.4.3 asks 4.5:1 for text.
 */
export interface Rgba {
  r: number;
  g: number;
  b: number;
  a: number;
}

/** Reads the colour forms Chromium's computed styles use: rgb(), rgba() and color(srgb …). */
export function parseColor(text: string): Rgba {
  const rgb = /^rgba?\(\s*([\d.]+)[,\s]+([\d.]+)[,\s]+([\d.]+)(?:\s*[,/]\s*([\d.]+%?))?\s*\)$/.exec(text.trim());
  if (rgb) return { r: Number(rgb[1]), g: Number(rgb[2]), b: Number(rgb[3]), a: alpha(rgb[4]) };
  const srgb = /^color\(srgb\s+([\d.]+)\s+([\d.]+)\s+([\d.]+)(?:\s*\/\s*([\d.]+%?))?\s*\)$/.exec(text.trim());
  if (srgb) return { r: Number(srgb[1]) * 255, g: Number(srgb[2]) * 255, b: Number(srgb[3]) * 255, a: alpha(srgb[4]) };
  throw new Error(`Cannot read the colour "${text}"`);
}

function alpha(text: string | undefined): number {
  if (text === undefined) return 1;
  return text.endsWith('%') ? Number(text.slice(0, -1)) / 100 : Number(text);
}

/** A translucent colour painted over an opaque one (source-over). */
export function over(top: Rgba, under: Rgba): Rgba {
  const mix = (t: number, u: number) => t * top.a + u * (1 - top.a);
  return { r: mix(top.r, under.r), g: mix(top.g, under.g), b: mix(top.b, under.b), a: 1 };
}

export function relativeLuminance({ r, g, b }: Rgba): number {
  const lin = (channel: number) => {
    const c = channel / 255;
    return c <= 0.03928 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4;
  };
  return 0.2126 * lin(r) + 0.7152 * lin(g) + 0.0722 * lin(b);
}

export function contrastRatio(a: Rgba, b: Rgba): number {
  const [light, dark] = [relativeLuminance(a), relativeLuminance(b)].sort((x, y) => y - x);
  return (light + 0.05) / (dark + 0.05);
}

/**
 * The text colour of an element and every colour that may be under its text: the first opaque
 * background-color found walking up from it, with translucent fills above it composited on, and every
 * colour of any background-image (a gradient or hatching) met on the way, since text can land on
 * any of them. A button whose text sits on hatching is judged by its worst stripe.
 */
export async function textAndBackgrounds(target: Locator): Promise<{ text: string; layers: string[][] }> {
  return target.evaluate((el) => {
    const layers: string[][] = [];
    for (let node: Element | null = el; node; node = node.parentElement) {
      const style = getComputedStyle(node);
      const image = style.backgroundImage;
      const colours = image && image !== 'none' ? (image.match(/(rgba?|color)\([^)]*\)/g) ?? []) : [];
      layers.push([style.backgroundColor, ...colours]);
      const a = /rgba?\([^)]*[,/]\s*([\d.]+)\s*\)/.exec(style.backgroundColor);
      if (style.backgroundColor !== 'transparent' && (!a || Number(a[1]) === 1) && colours.length === 0) break;
    }
    return { text: getComputedStyle(el).color, layers };
  });
}

/** The lowest contrast between the text and any colour it may be drawn on. */
export function worstContrast({ text, layers }: { text: string; layers: string[][] }): number {
  // Compose from the bottom (the opaque ancestor) up; each layer's image colours are candidates of their own.
  let bases: Rgba[] = [{ r: 255, g: 255, b: 255, a: 1 }];
  for (const layer of [...layers].reverse()) {
    const [fill, ...images] = layer.map(parseColor);
    const filled = bases.map((b) => over(fill, b));
    bases = images.length ? images.flatMap((img) => filled.map((b) => over(img, b))) : filled;
  }
  const ink = parseColor(text);
  return Math.min(...bases.map((b) => contrastRatio(over(ink, b), b)));
}
