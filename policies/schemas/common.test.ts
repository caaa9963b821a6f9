import { describe, expect, it } from 'vitest';
import {
  CaseUpdateSchema,
  ExerciseCreateSchema,
  IsoDateSchema,
  LetterCreateSchema,
  OrganizationSettingsSchema,
  PlanVersionParamsSchema,
  TrainingLogCreateSchema,
  VersionSchema,
  line,
  text,
  wholeNumber,
  wholeNumberText,
  AuditQuerySchema,
  DisplayNameSchema,
  EmailSchema,
  PainScoreSchema,
} from './index';

const errorsOf = (r: { success: boolean; error?: { issues: { message: string }[] } }) => r.error?.issues.map((i) => i.message) ?? [];

describe('shared bounds: every value fits the column it is stored in (ASVS 5.0 V2.2.1)', () => {
  it('ASVS 5.0 V2.2.1: a whole number stays within PostgreSQL integer (int4): 2^31 and -2^31-1 are refused', () => {
    const int4 = wholeNumber();
    expect(int4.safeParse(2 ** 31 - 1).success).toBe(true);
    expect(int4.safeParse(-(2 ** 31)).success).toBe(true);
    expect(int4.safeParse(2 ** 31).success).toBe(false);
    expect(int4.safeParse(-(2 ** 31) - 1).success).toBe(false);
    expect(int4.safeParse(1.5).success).toBe(false);
    expect(int4.safeParse(Number.NaN).success).toBe(false);
  });

  it('ASVS 5.0 V2.2.1: a row version is 1 … 2^31-1; a missing one "is required"', () => {
    expect(VersionSchema.safeParse(1).success).toBe(true);
    expect(VersionSchema.safeParse(2 ** 31).success).toBe(false);
    expect(VersionSchema.safeParse(0).success).toBe(false);
    expect(VersionSchema.safeParse(-1).success).toBe(false);
    expect(errorsOf(VersionSchema.safeParse(undefined))).toEqual(['is required']);
    expect(CaseUpdateSchema.safeParse({ version: 2 ** 31 }).success).toBe(false);
  });

  it('ASVS 5.0 V2.2.1: a whole number in a path or query is digits only, then bounded', () => {
    const n = wholeNumberText(1, 500);
    expect(n.safeParse('42').data).toBe(42);
    for (const bad of ['', '0', '501', '1e3', '0x10', ' 5', '5 ', '-1', '2147483648', ['5'], '1'.repeat(40)]) {
      expect(n.safeParse(bad).success, JSON.stringify(bad)).toBe(false);
    }
    expect(PlanVersionParamsSchema.safeParse({ orgId: crypto.randomUUID(), id: crypto.randomUUID(), version: '2147483648' }).success).toBe(
      false,
    );
    expect(AuditQuerySchema.safeParse({ limit: '1e2' }).success).toBe(false);
    expect(AuditQuerySchema.parse({}).limit).toBe(100);
  });

  it('ASVS 5.0 V2.2.1: dates run from 1900-01-01 to 2100-12-31; year 0000 and 9999 are refused', () => {
    for (const ok of ['1900-01-01', '2000-02-29', '2100-12-31']) expect(IsoDateSchema.safeParse(ok).success, ok).toBe(true);
    for (const bad of ['0000-01-01', '1899-12-31', '2101-01-01', '9999-12-31', '2023-02-29', '2024-13-01', '+010000-01-01']) {
      expect(IsoDateSchema.safeParse(bad).success, bad).toBe(false);
    }
    expect(errorsOf(IsoDateSchema.safeParse('0000-01-01'))).toContain('must be between 1900-01-01 and 2100-12-31');
  });

  it('ASVS 5.0 V2.2.1: text refuses U+0000 and unpaired surrogates, keeps paired ones, and holds the column length', () => {
    const t = text(10);
    expect(t.safeParse('ok 💪').success).toBe(true);
    expect(t.parse('  padded  ')).toBe('padded');
    for (const bad of ['a\u0000b', 'a\uD800b', 'a\uDC00', '\uD83D', 'x'.repeat(11)])
      expect(t.safeParse(bad).success, JSON.stringify(bad)).toBe(false);
    expect(errorsOf(t.safeParse('a\u0000'))).toEqual(['must not contain a null character or a broken (unpaired surrogate) character']);
    expect(errorsOf(text(5).safeParse(undefined))).toEqual(['is required']);
    expect(line(20).safeParse('two\nlines').success).toBe(false);
    expect(line(20).safeParse('').success).toBe(false);
  });

  it('ASVS 5.0 V2.2.1: the request schemas apply the text bounds to every stored field', () => {
    const nul = 'a\u0000b';
    expect(DisplayNameSchema.safeParse(nul).success).toBe(false);
    expect(EmailSchema.safeParse(`a${'\u0000'}@test.example`).success).toBe(false);
    expect(
      TrainingLogCreateSchema.safeParse({
        athleteId: crypto.randomUUID(),
        date: '2026-01-01',
        durationMinutes: 30,
        sessionRpe: 5,
        painBefore: 0,
        painDuring: 0,
        notes: nul,
      }).success,
    ).toBe(false);
    expect(
      ExerciseCreateSchema.safeParse({
        name: 'Squat\uD800',
        equipment: 'barbell',
        ballistic: false,
        steps: { kind: 'increment', step: 2.5, unit: 'kg' },
      }).success,
    ).toBe(false);
    expect(OrganizationSettingsSchema.safeParse({ timeZone: 'x'.repeat(10_000), version: 1 }).success).toBe(false);
    expect(OrganizationSettingsSchema.safeParse({ version: 2 ** 31 }).success).toBe(false);
    const letter = {
      athleteId: crypto.randomUUID(),
      decision: 'full',
      effectiveFrom: '2026-01-01',
      credential: 'PT',
      licenceNumber: 'L1',
      familyNote: nul,
    };
    expect(LetterCreateSchema.safeParse(letter).success).toBe(false);
    expect(LetterCreateSchema.safeParse({ ...letter, familyNote: '' }).success).toBe(true);
  });
});

describe('an empty field says it is required, not that it is wrong', () => {
  const messages = (r: { success: boolean; error?: { issues: { message: string }[] } }) => r.error?.issues.map((i) => i.message) ?? [];

  it('an empty e-mail is required; a wrong one is not a valid address', () => {
    expect(messages(EmailSchema.safeParse(''))).toEqual(['is required']);
    expect(messages(EmailSchema.safeParse('maya@'))).toEqual(['must be a valid e-mail address']);
  });

  it('an empty number (a cleared number input gives NaN) is required, with the range; a wrong type is not a number', () => {
    expect(messages(PainScoreSchema.safeParse(Number.NaN))).toEqual(['is required (a number from 0 to 10)']);
    expect(messages(PainScoreSchema.safeParse(undefined))).toEqual(['is required (a number from 0 to 10)']);
    expect(messages(PainScoreSchema.safeParse('7'))).toEqual(['must be a number from 0 to 10']);
  });
});
