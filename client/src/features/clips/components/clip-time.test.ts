import { describe, expect, it } from 'vitest';
import { FRAME_SECONDS, clipTimeWords, formatClipTime, parseClipTime, stepTime, toMs } from './clip-time';

describe('formatClipTime', () => {
  it('writes mm:ss.s with leading zeros', () => {
    expect(formatClipTime(0)).toBe('00:00.0');
    expect(formatClipTime(1500)).toBe('00:01.5');
    expect(formatClipTime(65_300)).toBe('01:05.3');
  });
  it('does not let float noise drop a tenth: 1.4 s + 3 frames reads 00:01.5', () => {
    expect(formatClipTime((1.4 + 3 * FRAME_SECONDS) * 1000)).toBe('00:01.5');
    expect(formatClipTime(1499.9999)).toBe('00:01.5');
  });
  it('cuts rather than rounds, so the last tenth before a minute never reads :60', () => {
    expect(formatClipTime(59_960)).toBe('00:59.9');
  });
  it('shows dashes for an unknown time (a WebM clip before its length is found)', () => {
    expect(formatClipTime(Number.POSITIVE_INFINITY)).toBe('--:--.-');
    expect(formatClipTime(Number.NaN)).toBe('--:--.-');
  });
});

describe('clipTimeWords', () => {
  it('says the time for a screen reader', () => {
    expect(clipTimeWords(1500)).toBe('1.5 seconds');
    expect(clipTimeWords(65_300)).toBe('1 minute 5.3 seconds');
  });
});

describe('stepTime', () => {
  it('moves one frame (1/30 s) either way', () => {
    expect(stepTime(1, 1, 10)).toBeCloseTo(1 + 1 / 30, 9);
    expect(stepTime(1, -1, 10)).toBeCloseTo(1 - 1 / 30, 9);
  });
  it('stops at the start and at a known end', () => {
    expect(stepTime(0.01, -1, 10)).toBe(0);
    expect(stepTime(9.99, 1, 10)).toBe(10);
  });
  it('has no end to stop at while the length is unknown', () => {
    expect(stepTime(2, 1, Number.POSITIVE_INFINITY)).toBeCloseTo(2 + 1 / 30, 9);
  });
});

describe('parseClipTime and toMs', () => {
  it('reads seconds or m:ss.s', () => {
    expect(parseClipTime('1.5')).toBe(1.5);
    expect(parseClipTime('1,5')).toBe(1.5);
    expect(parseClipTime('1:05.3')).toBeCloseTo(65.3, 9);
    expect(parseClipTime(' 2 ')).toBe(2);
  });
  it('refuses what is not a time', () => {
    expect(parseClipTime('')).toBeNull();
    expect(parseClipTime('abc')).toBeNull();
    expect(parseClipTime('1:75')).toBeNull();
    expect(parseClipTime('-1')).toBeNull();
  });
  it('pins notes in whole milliseconds', () => {
    expect(toMs(1.4 + 3 * FRAME_SECONDS)).toBe(1500);
    expect(toMs(-0.2)).toBe(0);
  });
});
