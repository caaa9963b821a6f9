import { describe, expect, it } from 'vitest';
import { floorCsvRecords, floorRow, floorSheetFileName, linePlates, plateWords, setsWords, type FloorSetInput } from './floor-sheet';
import { KG_PER_LB } from './units';

const set = (reps: number, loadKg: number | null, over: Partial<FloorSetInput> = {}): FloorSetInput => ({
  reps,
  loadKg,
  percent: null,
  targetRpe: null,
  ...over,
});

describe('floor sheet: plates per side', () => {
  // Bar masses: 20 kg men's bar (IWF Technical and Competition Rules, equipment: the bar); 45 lb bar
  // and 45…2.5 lb plates (common practice in pound gyms). Check values are hand arithmetic:
  // (load − bar) / 2 per side.
  it.each([
    // 100 kg: (100 − 20) / 2 = 40 kg a side = 25 + 15 (IWF disc masses 25, 20, 15, 10 … kg).
    [100, 'kg', '25 + 15 kg a side'],
    // 75 kg: 27.5 kg a side = 25 + 2.5.
    [75, 'kg', '25 + 2.5 kg a side'],
    // 82.5 kg: 31.25 kg a side = 25 + 5 + 1.25 (the fractional 1.25 kg plate, common practice).
    [82.5, 'kg', '25 + 5 + 1.25 kg a side'],
    // 20 kg: the bar alone.
    [20, 'kg', 'empty 20 kg bar'],
    [15, 'kg', 'lighter than the 20 kg bar'],
  ] as const)('%s %s → %s', (kg, unit, words) => {
    expect(plateWords(kg, unit)).toBe(words);
  });

  it('pounds: 225 lb is two 45 lb plates a side, 135 lb one (common practice)', () => {
    expect(plateWords(225 * KG_PER_LB, 'lb')).toBe('45 + 45 lb a side');
    expect(plateWords(135 * KG_PER_LB, 'lb')).toBe('45 lb a side');
  });

  it('a kg load read by a pound athlete: the closest load the pound plates make under it, said so', () => {
    // 82.5 kg = 181.88 lb (NIST SP 811: 1 lb = 0.45359237 kg); (181.88 − 45) / 2 = 68.44 lb a side;
    // pound plates make at most 67.5 lb a side under that, so the bar holds 45 + 2 × 67.5 = 180 lb.
    const words = plateWords(82.5, 'lb');
    expect(words).toMatch(/ lb a side \(makes 180 lb\)$/);
    const plates = words
      .replace(/ lb a side.*$/, '')
      .split(' + ')
      .map(Number);
    expect(plates.reduce((a, b) => a + b, 0)).toBe(67.5);
  });

  it('an unreadable load says so instead of a number', () => {
    expect(plateWords(Number.NaN, 'kg')).toBe('plates: check the planned load');
    expect(plateWords(5000, 'kg')).toBe('plates: check the planned load');
  });

  it('one plate line per distinct load of a row; body weight has none', () => {
    expect(linePlates([set(5, 75), set(5, 75), set(3, 82.5), set(8, null)], 'kg')).toBe(
      '75 kg: 25 + 2.5 kg a side; 82.5 kg: 25 + 5 + 1.25 kg a side',
    );
  });
});

describe('floor sheet: sets and rows', () => {
  it('counts alike neighbours together and keeps the order', () => {
    expect(setsWords([set(5, 75, { targetRpe: 7 }), set(5, 75, { targetRpe: 7 }), set(5, 75, { targetRpe: 7 }), set(3, 80)], 'kg')).toBe(
      '3 sets of 75 kg × 5 at RPE 7, 80 kg × 3',
    );
    expect(setsWords([set(1, null, { targetRpe: 8 }), set(1, null, { targetRpe: 8 })], 'kg')).toBe('2 sets of body weight × 1 at RPE 8');
    expect(setsWords([set(5, null, { percent: 75 })], 'kg')).toBe('75 % of 1RM × 5 (no 1RM on record: set the load with the coach)');
    expect(setsWords([set(10, 40, { warmUp: true })], 'lb')).toBe('88.18 lb × 10 (warm-up)');
  });

  const squat = { name: 'Back squat', barbell: true, sets: [set(5, 75), set(5, 75)], changed: false };
  const base = { athleteName: 'A', unit: 'kg' as const, exercises: [squat], dropped: [], held: false, needsReview: false };

  it('marks fitted rows and their changed lines; as written and Out are not marked', () => {
    const fitted = floorRow({ ...base, state: 'fitted', exercises: [squat, { ...squat, name: 'Deadlift', changed: true }] });
    expect(fitted.marked).toBe(true);
    expect(fitted.lines.map((l) => l.marked)).toEqual([false, true]);
    expect(fitted.stateWords).toBe('Fitted');
    expect(floorRow({ ...base, state: 'as_written' }).marked).toBe(false);
    const out = floorRow({ ...base, state: 'out', exercises: [] });
    expect(out).toMatchObject({ marked: false, lines: [], stateWords: 'Out', note: 'Out on this date: nothing planned.' });
  });

  it('a dropped set is noted; a held row shows no loads', () => {
    const r = floorRow({ ...base, state: 'needs_decision', dropped: ['Sprint 20 m: Sprint not allowed'] });
    expect(r.note).toBe('Dropped: Sprint 20 m: Sprint not allowed.');
    expect(r.marked).toBe(true);
    expect(r.stateWords).toBe('Needs a decision');
    // Once the coach accepted the drop, the sheet no longer asks for a decision; the row stays marked.
    const accepted = floorRow({ ...base, state: 'needs_decision', dropped: ['x'], reviewed: true });
    expect(accepted).toMatchObject({ stateWords: 'Fitted, part left out', marked: true, note: 'Dropped: x.' });
    const held = floorRow({ ...base, state: 'fitted', held: true });
    expect(held.lines).toEqual([]);
    expect(held.note).toMatch(/^On hold/);
  });

  it('a swap names the exercise it replaces', () => {
    const r = floorRow({
      ...base,
      state: 'fitted',
      exercises: [{ ...squat, name: 'Goblet squat', barbell: false, changed: true, insteadOf: 'Back squat' }],
    });
    expect(r.lines[0]).toMatchObject({ exercise: 'Goblet squat (instead of Back squat)', plates: '', marked: true });
  });

  it('CSV records: one per athlete and exercise, the note once', () => {
    const row = floorRow({ ...base, state: 'needs_decision', dropped: ['x'], exercises: [squat, { ...squat, name: 'Deadlift' }] });
    const out = floorRow({ ...base, athleteName: 'B', state: 'out', exercises: [] });
    const records = floorCsvRecords({
      organizationName: 'o',
      groupName: 'g',
      programName: 'p',
      sessionTitle: 't',
      date: '2026-12-07',
      published: false,
      rows: [row, out],
    });
    expect(records).toEqual([
      ['A', 'Needs a decision', 'yes', 'kg', 'Back squat', '2 sets of 75 kg × 5', '75 kg: 25 + 2.5 kg a side', 'Dropped: x.'],
      ['A', 'Needs a decision', 'yes', 'kg', 'Deadlift', '2 sets of 75 kg × 5', '75 kg: 25 + 2.5 kg a side', ''],
      ['B', 'Out', '', 'kg', '', '', '', 'Out on this date: nothing planned.'],
    ]);
  });

  it('file names are plain ASCII', () => {
    expect(floorSheetFileName({ date: '2026-12-07', sessionTitle: 'Squad lift: "Day 1" / Łódź' }, 'pdf')).toBe(
      'floor-sheet-2026-12-07-squad-lift-day-1-odz.pdf',
    );
    expect(floorSheetFileName({ date: 'x', sessionTitle: '' }, 'csv')).toBe('floor-sheet-session.csv');
  });
});
