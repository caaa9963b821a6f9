import { describe, expect, it } from 'vitest';
import {
  buildInjuryReport,
  injuryDays,
  injuryReportCsvRecords,
  poissonExactInterval,
  ratePer1000,
  regionKey,
  type AthleteForReport,
  type CaseForReport,
  type ExposureEntry,
} from './injury-report';

/**
 * Exact (Garwood 1936) 95 % limits for a Poisson count, the chi-square form χ²(0.025; 2k)/2 and
 * χ²(0.975; 2k+2)/2, as computed with SciPy 1.17 (`scipy.stats.chi2.ppf`). The same limits are
 * tabulated in standard references (e.g. k = 0 → 0 to 3.689, k = 1 → 0.0253 to 5.572,
 * k = 10 → 4.795 to 18.39).
 */
const GARWOOD: [number, number, number][] = [
  [0, 0, 3.6889],
  [1, 0.0253, 5.5716],
  [2, 0.2422, 7.2247],
  [3, 0.6187, 8.7673],
  [4, 1.0899, 10.2416],
  [5, 1.6235, 11.6683],
  [10, 4.7954, 18.3904],
  [18, 10.6679, 28.4478],
  [50, 37.111, 65.9188],
  [100, 81.364, 121.6268],
  [270, 238.7519, 304.2015],
];

describe('exact Poisson interval (Garwood 1936; values from SciPy 1.17 scipy.stats.chi2.ppf)', () => {
  it.each(GARWOOD)('k = %i → %f to %f', (k, low, high) => {
    const ci = poissonExactInterval(k);
    expect(ci.low).toBeCloseTo(low, 3);
    expect(ci.high).toBeCloseTo(high, 3);
  });

  it('refuses a count that is not a whole number', () => {
    expect(() => poissonExactInterval(-1)).toThrow();
    expect(() => poissonExactInterval(1.5)).toThrow();
  });
});

describe('incidence and burden per 1,000 h (Bahr et al. 2020, BJSM 54:372–389)', () => {
  it('18 injuries in 12,000 h → 1.5 per 1,000 h, 95 % CI 0.89 to 2.37 (computed from the definitions)', () => {
    const r = ratePer1000(18, 12000)!;
    expect(r.value).toBeCloseTo(1.5, 10);
    expect(r.low).toBeCloseTo(0.889, 3);
    expect(r.high).toBeCloseTo(2.371, 3);
  });
  it('270 days lost in 12,000 h → 22.5 days per 1,000 h (computed from the definitions)', () => {
    const r = ratePer1000(270, 12000)!;
    expect(r.value).toBeCloseTo(22.5, 10);
    expect(r.low).toBeCloseTo(238.7519 / 12, 3);
    expect(r.high).toBeCloseTo(304.2015 / 12, 3);
  });
  it('3 injuries in 1,500 h → 2.0 per 1,000 h (computed from the definitions)', () => {
    expect(ratePer1000(3, 1500)!.value).toBeCloseTo(2.0, 10);
  });
  it('no exposure, no rate', () => {
    expect(ratePer1000(3, 0)).toBeNull();
  });
});

const at = (effectiveFrom: string, status: 'out' | 'limited' | 'full', createdAt = `${effectiveFrom}T08:00:00Z`) => ({
  status,
  effectiveFrom,
  createdAt,
});
const kase = (over: Partial<CaseForReport> = {}): CaseForReport => ({
  caseId: 'c1',
  athleteId: 'a1',
  onsetDate: '2026-09-01',
  closedOn: null,
  bodyRegions: ['knee_left'],
  statuses: [],
  ...over,
});

describe('days lost (Bahr et al. 2020: days from onset until return to full participation)', () => {
  it('Out 3 days then Limited 4 days then Full: 7 days lost — a Limited day counts as a whole day', () => {
    const c = kase({ statuses: [at('2026-09-01', 'out'), at('2026-09-04', 'limited'), at('2026-09-08', 'full')] });
    expect(injuryDays(c, '2026-09-30')).toEqual({ timeLoss: true, daysLost: 7, ongoing: false });
  });
  it('a case that never left Full is not a time-loss injury', () => {
    expect(injuryDays(kase({ statuses: [at('2026-09-01', 'full')] }), '2026-09-30')).toEqual({
      timeLoss: false,
      daysLost: 0,
      ongoing: false,
    });
  });
  it('days before the first recorded status count as Full; closing the case ends the days lost', () => {
    const c = kase({ statuses: [at('2026-09-03', 'out')], closedOn: '2026-09-10' });
    expect(injuryDays(c, '2026-09-30').daysLost).toBe(7); // 3rd to 9th
  });
  it('still Limited at the last day counted: ongoing, days up to that day', () => {
    const c = kase({ statuses: [at('2026-09-01', 'limited')] });
    expect(injuryDays(c, '2026-09-10')).toEqual({ timeLoss: true, daysLost: 10, ongoing: true });
  });
  it('a later decision replaces an earlier one from its own date on', () => {
    const c = kase({
      statuses: [
        at('2026-09-01', 'out', '2026-09-01T08:00:00Z'),
        at('2026-09-01', 'limited', '2026-09-01T09:00:00Z'),
        at('2026-09-03', 'full'),
      ],
    });
    expect(injuryDays(c, '2026-09-30').daysLost).toBe(2);
  });
});

describe('regions with sides taken together', () => {
  it('left and right knee are one row', () => {
    expect(regionKey('knee_left')).toEqual({ key: 'knee', label: 'Knee' });
    expect(regionKey('knee_right').key).toBe('knee');
    expect(regionKey('lower_back')).toEqual({ key: 'lower_back', label: 'Lower back' });
  });
});

/** A squad of n athletes in one group and sport, each with `hours` of practice in September. */
function squad(n: number, sport: string, group: string, hours: number, prefix = sport) {
  const athletes: AthleteForReport[] = [];
  const exposure: ExposureEntry[] = [];
  for (let i = 0; i < n; i++) {
    const id = `${prefix}-${i}`;
    athletes.push({ id, sport, groups: [{ id: group, name: group }] });
    exposure.push({ athleteId: id, date: '2026-09-15', minutes: hours * 60, groupId: group, kind: 'practice' });
  }
  return { athletes, exposure };
}
const outFor = (id: string, athleteId: string, onset: string, days: number, region: CaseForReport['bodyRegions'][0] = 'knee_left') =>
  kase({
    caseId: id,
    athleteId,
    onsetDate: onset,
    bodyRegions: [region],
    statuses: [at(onset, 'out'), at(`2026-09-${String(Number(onset.slice(8)) + days).padStart(2, '0')}`, 'full')],
  });

describe('the report (Bahr et al. 2020 definitions) with small cells suppressed', () => {
  // 40 athletes × 300 h = 12,000 h; 18 injuries, 15 days each = 270 days lost.
  const a = squad(40, 'Soccer', 'Varsity', 300);
  const cases = Array.from({ length: 18 }, (_, i) =>
    outFor(`c${i}`, `Soccer-${i}`, '2026-09-02', 15, i < 10 ? 'knee_left' : 'ankle_foot_right'),
  );
  const report = buildInjuryReport({
    from: '2026-09-01',
    to: '2026-09-30',
    today: '2026-12-01',
    cases,
    exposure: a.exposure,
    athletes: a.athletes,
  });

  it('18 injuries in 12,000 h → 1.5 per 1,000 h; 270 days lost → 22.5 days per 1,000 h (Bahr et al. 2020)', () => {
    expect(report.total.injuries).toBe(18);
    expect(report.total.daysLost).toBe(270);
    expect(report.total.hours).toBe(12000);
    expect(report.total.incidence!.value).toBeCloseTo(1.5, 10);
    expect(report.total.burden!.value).toBeCloseTo(22.5, 10);
    expect(report.hoursByKind).toEqual({ training: 0, practice: 12000, competition: 0 });
  });

  it('breaks down by region (sides together), sport, group and month', () => {
    expect(report.breakdowns.bodyRegion.map((c) => [c.label, c.injuries])).toEqual([
      ['Ankle / foot', 8],
      ['Knee', 10],
    ]);
    expect(report.breakdowns.sport[0]).toMatchObject({ label: 'Soccer', injuries: 18 });
    expect(report.breakdowns.group[0]).toMatchObject({ label: 'Varsity', injuries: 18 });
    expect(report.breakdowns.month.map((c) => c.key)).toEqual(['2026-09']);
  });

  it('counts from 1 to 4 show as "< 5" with no days or rates', () => {
    const r = buildInjuryReport({
      from: '2026-09-01',
      to: '2026-09-30',
      today: '2026-12-01',
      cases: cases.slice(0, 3),
      exposure: a.exposure,
      athletes: a.athletes,
    });
    expect(r.total).toMatchObject({ injuries: null, injuriesText: '< 5', daysLost: null, incidence: null, hidden: 'small-count' });
    expect(JSON.stringify(r)).not.toContain('"injuries":3');
  });

  it('a row resting on fewer than 3 athletes is not shown', () => {
    const b = squad(2, 'Rowing', 'Pair', 100);
    const r = buildInjuryReport({
      from: '2026-09-01',
      to: '2026-09-30',
      today: '2026-12-01',
      cases,
      exposure: [...a.exposure, ...b.exposure],
      athletes: [...a.athletes, ...b.athletes],
    });
    const rowing = r.breakdowns.sport.find((c) => c.label === 'Rowing')!;
    expect(rowing).toMatchObject({ hidden: 'few-athletes', hours: null, injuriesText: 'not shown' });
  });

  it('a row whose injuries are all one athlete’s is not shown', () => {
    const b = squad(5, 'Tennis', 'Tennis', 100);
    const repeats = Array.from({ length: 6 }, (_, i) => outFor(`t${i}`, 'Tennis-0', `2026-09-${String(i + 1).padStart(2, '0')}`, 1));
    const r = buildInjuryReport({
      from: '2026-09-01',
      to: '2026-09-30',
      today: '2026-12-01',
      cases: [...cases, ...repeats],
      exposure: [...a.exposure, ...b.exposure],
      athletes: [...a.athletes, ...b.athletes],
    });
    expect(r.breakdowns.sport.find((c) => c.label === 'Tennis')).toMatchObject({ hidden: 'one-athlete', injuries: null });
  });

  it('one hidden row of a breakdown that adds up to the total hides the next smallest too', () => {
    const extra = [outFor('h1', 'Soccer-20', '2026-09-03', 2, 'lower_back'), outFor('h2', 'Soccer-21', '2026-09-03', 2, 'lower_back')];
    const r = buildInjuryReport({
      from: '2026-09-01',
      to: '2026-09-30',
      today: '2026-12-01',
      cases: [...cases, ...extra],
      exposure: a.exposure,
      athletes: a.athletes,
    });
    const rows = Object.fromEntries(r.breakdowns.bodyRegion.map((c) => [c.key, c.hidden]));
    expect(rows).toEqual({ ankle_foot: 'complement', knee: null, lower_back: 'small-count' });
  });

  it('the CSV carries the same cells, withheld numbers left empty', () => {
    const rows = injuryReportCsvRecords(report);
    expect(rows[0][0]).toBe('Breakdown');
    expect(rows[1].slice(0, 6)).toEqual(['Total', 'All athletes', '18', '270', '12000.0', '1.50']);
  });
});
