/** The player steps by one frame of a 30 frames-a-second clip; phones record at 30 by default. */
export const FRAME_SECONDS = 1 / 30;

export const SPEEDS = [0.25, 0.5, 1] as const;
export type Speed = (typeof SPEEDS)[number];

/**
 * A time in a clip as mm:ss.s ("01:05.3"). Whole milliseconds first, then tenths cut (not rounded),
 * so 1.49999 s from float arithmetic still reads 00:01.5 and 59.96 s never reads 00:60.0.
 */
export function formatClipTime(ms: number): string {
  if (!Number.isFinite(ms) || ms < 0) return '--:--.-';
  const tenths = Math.floor(Math.round(ms) / 100);
  const minutes = Math.floor(tenths / 600);
  const seconds = Math.floor((tenths % 600) / 10);
  const tenth = tenths % 10;
  return `${String(minutes).padStart(2, '0')}:${String(seconds).padStart(2, '0')}.${tenth}`;
}

/** The same time in words for screen readers: "1 minute 5.3 seconds". */
export function clipTimeWords(ms: number): string {
  if (!Number.isFinite(ms) || ms < 0) return 'unknown';
  const tenths = Math.floor(Math.round(ms) / 100);
  const minutes = Math.floor(tenths / 600);
  const seconds = (tenths % 600) / 10;
  const secondWords = `${seconds.toFixed(1)} seconds`;
  return minutes > 0 ? `${minutes} minute${minutes === 1 ? '' : 's'} ${secondWords}` : secondWords;
}

/** Seconds on the video's clock to whole milliseconds, the unit notes are pinned in. */
export const toMs = (seconds: number) => Math.max(0, Math.round(seconds * 1000));

/** Where one frame step lands: never before the start, never past the end when the end is known. */
export function stepTime(current: number, frames: number, duration: number): number {
  const next = current + frames * FRAME_SECONDS;
  const end = Number.isFinite(duration) && duration > 0 ? duration : Number.POSITIVE_INFINITY;
  return Math.min(Math.max(next, 0), end);
}

/**
 * Reads what a person types in the "go to" box: seconds ("1.5"), or minutes and seconds ("1:05.3").
 * Returns seconds, or null when it is not a time.
 */
export function parseClipTime(text: string): number | null {
  const t = text.trim();
  const m = /^(?:(\d{1,2}):)?(\d{1,4}(?:[.,]\d+)?)$/.exec(t);
  if (!m) return null;
  const minutes = m[1] ? Number(m[1]) : 0;
  const seconds = Number(m[2].replace(',', '.'));
  if (m[1] && seconds >= 60) return null;
  return minutes * 60 + seconds;
}
