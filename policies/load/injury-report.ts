import { BODY_REGION_LABELS, type BodyRegion } from '../body-regions';
import { addDays } from '../today';
import type { ParticipationStatus } from './patterns';
import { statusOnDate } from './status-on';

/**
 * The organization's injury report, following the definitions of the IOC consensus on recording and
 * reporting injury (Bahr et al. 2020, BJSM 54:372–389):
 *
 * - A **time-loss injury** is a case with at least one day at Out or Limited.
 * - **Days lost** are the days, from the onset date on, on which the case's status was not Full. A day
 *   at Limited counts as one whole day lost, the same as a day at Out: the athlete could not take full
 *   part in training or competition that day (the consensus measures severity as the days until return
 *   to full participation). Days before the case's first recorded status count as Full (only what was
 *   recorded counts); the closing day and the days after it count as Full. Days are counted up to the
 *   report's last day or today, whichever is earlier — an injury still not at Full then is `ongoing`.
 *   An injury belongs to the period of its onset date.
 * - **Exposure** is hours of training and competition: the athletes' own training logs plus the team
 *   session hours a coach records for a group (each athlete marked present gets the session's minutes).
 * - **Incidence** = injuries / exposure hours × 1,000; **burden** = days lost / exposure hours × 1,000.
 *   Each comes with a 95 % confidence interval for a Poisson rate by the exact (Garwood 1936) method:
 *   for a count k, lower = χ²(0.025; 2k) / 2 and upper = χ²(0.975; 2k + 2) / 2, divided by the hours
 *   and multiplied by 1,000. Days lost are not independent events, so the burden's interval is narrower
 *   than the truth; it is given by the same method, as is common practice, and the page says so.
 * - **Small cells** are suppressed so nobody can be picked out: an injury count from 1 to 4 shows as
 *   "< 5" with no days lost or rates; a row resting on fewer than {@link MIN_ATHLETES} athletes, or whose
 *   injuries are all one athlete's, is not shown at all; and where a breakdown adds up to the total
 *   (body region, month) and only one row is hidden, the next smallest is hidden too, so the hidden
 *   one cannot be worked out by subtraction.
 */

import { poissonExactInterval } from './poisson-interval';

export { poissonCdf, poissonExactInterval } from './poisson-interval';

/** Counts below this show as "< 5" (common practice in health statistics disclosure control). */
export const SMALL_COUNT = 5;
/** A row resting on fewer athletes than this is not shown (common practice: no cell of one or two people). */
export const MIN_ATHLETES = 3;

export interface Rate {
  /** Per 1,000 hours. */
  value: number;
  low: number;
  high: number;
}

/** A count per 1,000 exposure hours with its exact 95 % interval; null with no exposure. */
export function ratePer1000(count: number, hours: number): Rate | null {
  if (!(hours > 0)) return null;
  const { low, high } = poissonExactInterval(count);
  const per = 1000 / hours;
  return { value: count * per, low: low * per, high: high * per };
}

// ---------------------------------------------------------------------------------------------------
// Days lost

export interface CaseForReport {
  caseId: string;
  athleteId: string;
  onsetDate: string;
  closedOn: string | null;
  bodyRegions: BodyRegion[];
  statuses: { status: ParticipationStatus; effectiveFrom: string; createdAt: string }[];
}

export interface InjuryDays {
  timeLoss: boolean;
  daysLost: number;
  /** Not back at Full by the last day counted. */
  ongoing: boolean;
}

/** Days not at Full from onset up to `until` (inclusive), as defined at the top of this file. */
export function injuryDays(c: CaseForReport, until: string): InjuryDays {
  const statusOn = statusOnDate(c.statuses.map((s) => ({ ...s, caseId: c.caseId })));
  let daysLost = 0;
  let last: ParticipationStatus = 'full';
  for (let d = c.onsetDate; d <= until; d = addDays(d, 1)) {
    last = c.closedOn !== null && d >= c.closedOn ? 'full' : statusOn(d);
    if (last !== 'full') daysLost++;
  }
  return { timeLoss: daysLost > 0, daysLost, ongoing: last !== 'full' && daysLost > 0 };
}

// ---------------------------------------------------------------------------------------------------
// The report

export interface ExposureEntry {
  athleteId: string;
  date: string;
  minutes: number;
  /** The group a team session was recorded for; null for the athlete's own training log. */
  groupId: string | null;
  kind: 'training' | 'practice' | 'competition';
}

export interface AthleteForReport {
  id: string;
  sport: string | null;
  groups: { id: string; name: string }[];
}

export interface ReportInput {
  from: string;
  to: string;
  today: string;
  cases: CaseForReport[];
  exposure: ExposureEntry[];
  athletes: AthleteForReport[];
}

export type Hidden = 'small-count' | 'few-athletes' | 'one-athlete' | 'complement';

export interface ReportCell {
  key: string;
  label: string;
  /** The count, or null when suppressed; `injuriesText` is what to print ("< 5", "12", "not shown"). */
  injuries: number | null;
  injuriesText: string;
  daysLost: number | null;
  hours: number | null;
  incidence: Rate | null;
  burden: Rate | null;
  /** Why numbers are missing; null when all are shown. A row hidden whole has `hours` null too. */
  hidden: Hidden | null;
}

export type BreakdownName = 'bodyRegion' | 'sport' | 'group' | 'month';

export interface InjuryReport {
  from: string;
  to: string;
  /** The last day counted: the report's last day or today, whichever is earlier. */
  countedUntil: string;
  total: ReportCell;
  /** Hours split by kind (training logs, team practice, competition), for the whole organization. */
  hoursByKind: { training: number; practice: number; competition: number };
  ongoing: number | null;
  breakdowns: Record<BreakdownName, ReportCell[]>;
}

interface Tally {
  key: string;
  label: string;
  injuries: number;
  daysLost: number;
  minutes: number;
  injured: Set<string>;
  people: Set<string>;
}

const tally = (key: string, label: string): Tally => ({
  key,
  label,
  injuries: 0,
  daysLost: 0,
  minutes: 0,
  injured: new Set(),
  people: new Set(),
});

/** A body region with left and right taken together (fewer, larger cells). */
export function regionKey(region: BodyRegion | undefined): { key: string; label: string } {
  if (!region) return { key: 'unrecorded', label: 'Not recorded' };
  const side = /_(left|right)$/.exec(region);
  if (!side) return { key: region, label: BODY_REGION_LABELS[region] };
  const key = region.slice(0, -side[0].length);
  const label = BODY_REGION_LABELS[region].replace(/^(Left|Right) /, '');
  return { key, label: label.charAt(0).toUpperCase() + label.slice(1) };
}

const round = (n: number, places: number) => Math.round(n * 10 ** places) / 10 ** places;

function toCell(t: Tally): ReportCell {
  const hours = t.minutes / 60;
  if (t.people.size < MIN_ATHLETES && (t.people.size > 0 || t.injuries > 0)) return hiddenCell(t.key, t.label, 'few-athletes');
  if (t.injuries >= SMALL_COUNT && t.injured.size < 2) return hiddenCell(t.key, t.label, 'one-athlete');
  if (t.injuries > 0 && t.injuries < SMALL_COUNT)
    return {
      key: t.key,
      label: t.label,
      injuries: null,
      injuriesText: `< ${SMALL_COUNT}`,
      daysLost: null,
      hours: round(hours, 1),
      incidence: null,
      burden: null,
      hidden: 'small-count',
    };
  return {
    key: t.key,
    label: t.label,
    injuries: t.injuries,
    injuriesText: String(t.injuries),
    daysLost: t.daysLost,
    hours: round(hours, 1),
    incidence: ratePer1000(t.injuries, hours),
    burden: ratePer1000(t.daysLost, hours),
    hidden: null,
  };
}

function hiddenCell(key: string, label: string, hidden: Hidden): ReportCell {
  return { key, label, injuries: null, injuriesText: 'not shown', daysLost: null, hours: null, incidence: null, burden: null, hidden };
}

/**
 * Where the rows add up to the total, one hidden row could be worked out by subtraction: hide the
 * next smallest shown row with injuries as well.
 */
function protectComplement(cells: ReportCell[], totalShown: boolean): ReportCell[] {
  if (!totalShown) return cells;
  const hidden = cells.filter((c) => c.hidden !== null && c.hidden !== 'few-athletes');
  const anyHidden = cells.some((c) => c.hidden !== null);
  if (!anyHidden || hidden.length > 1 || cells.filter((c) => c.hidden !== null).length > 1) return cells;
  const shown = cells.filter((c) => c.hidden === null && (c.injuries ?? 0) > 0).sort((a, b) => (a.injuries ?? 0) - (b.injuries ?? 0));
  const victim = shown[0];
  if (!victim) return cells;
  return cells.map((c) => (c === victim ? { ...hiddenCell(c.key, c.label, 'complement'), hours: c.hours } : c));
}

const monthOf = (day: string) => day.slice(0, 7);
const MONTH_NAMES = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'];
const monthLabel = (month: string) => `${MONTH_NAMES[Number(month.slice(5, 7)) - 1]} ${month.slice(0, 4)}`;

/** Builds the report: only time-loss injuries with onset in [from, to] and exposure dated in it count. */
export function buildInjuryReport(input: ReportInput): InjuryReport {
  const countedUntil = input.to < input.today ? input.to : input.today;
  const athletes = new Map(input.athletes.map((a) => [a.id, a]));
  const total = tally('total', 'All athletes');
  const byRegion = new Map<string, Tally>();
  const bySport = new Map<string, Tally>();
  const byGroup = new Map<string, Tally>();
  const byMonth = new Map<string, Tally>();
  const hoursByKind = { training: 0, practice: 0, competition: 0 };
  const get = (m: Map<string, Tally>, key: string, label: string) => {
    let t = m.get(key);
    if (!t) m.set(key, (t = tally(key, label)));
    return t;
  };
  const sportOf = (a: AthleteForReport | undefined) =>
    a?.sport?.trim() ? { key: a.sport.trim().toLowerCase(), label: a.sport.trim() } : { key: 'none', label: 'No sport recorded' };

  // Every month of the period gets a row, even with nothing in it.
  for (let d = input.from; d <= input.to; d = addDays(`${monthOf(d)}-01`, 32).slice(0, 8) + '01')
    get(byMonth, monthOf(d), monthLabel(monthOf(d)));

  for (const e of input.exposure) {
    if (e.date < input.from || e.date > input.to || !(e.minutes > 0)) continue;
    const a = athletes.get(e.athleteId);
    const add = (t: Tally) => {
      t.minutes += e.minutes;
      t.people.add(e.athleteId);
    };
    add(total);
    hoursByKind[e.kind] += e.minutes / 60;
    const s = sportOf(a);
    add(get(bySport, s.key, s.label));
    add(get(byMonth, monthOf(e.date), monthLabel(monthOf(e.date))));
    // A team session counts for its own group; an athlete's own training for each group they are in.
    for (const g of a?.groups ?? []) if (e.groupId === null || e.groupId === g.id) add(get(byGroup, g.id, g.name));
  }
  // Region rows share the whole organization's exposure: the body region is not an exposure.
  let ongoing = 0;
  const injuries: { c: CaseForReport; days: InjuryDays }[] = [];
  for (const c of input.cases) {
    if (c.onsetDate < input.from || c.onsetDate > input.to) continue;
    const days = injuryDays(c, countedUntil);
    if (!days.timeLoss) continue;
    injuries.push({ c, days });
    if (days.ongoing) ongoing++;
  }
  const hit = (t: Tally, c: CaseForReport, days: InjuryDays) => {
    t.injuries++;
    t.daysLost += days.daysLost;
    t.injured.add(c.athleteId);
    t.people.add(c.athleteId);
  };
  for (const { c, days } of injuries) {
    const a = athletes.get(c.athleteId);
    hit(total, c, days);
    const r = regionKey(c.bodyRegions[0]);
    hit(get(byRegion, r.key, r.label), c, days);
    const s = sportOf(a);
    hit(get(bySport, s.key, s.label), c, days);
    hit(get(byMonth, monthOf(c.onsetDate), monthLabel(monthOf(c.onsetDate))), c, days);
    for (const g of a?.groups ?? []) hit(get(byGroup, g.id, g.name), c, days);
  }
  for (const t of byRegion.values()) {
    t.minutes = total.minutes;
    for (const p of total.people) t.people.add(p);
  }

  const totalCell = toCell(total);
  const totalShown = totalCell.hidden === null;
  const cells = (m: Map<string, Tally>, sort: 'label' | 'key') =>
    [...m.values()].sort((a, b) => (sort === 'key' ? a.key.localeCompare(b.key) : a.label.localeCompare(b.label))).map(toCell);
  return {
    from: input.from,
    to: input.to,
    countedUntil,
    total: totalCell,
    hoursByKind: {
      training: round(hoursByKind.training, 1),
      practice: round(hoursByKind.practice, 1),
      competition: round(hoursByKind.competition, 1),
    },
    ongoing: totalShown && (ongoing === 0 || ongoing >= SMALL_COUNT) ? ongoing : null,
    breakdowns: {
      bodyRegion: protectComplement(cells(byRegion, 'label'), totalShown),
      sport: cells(bySport, 'label'),
      group: cells(byGroup, 'label'),
      month: protectComplement(cells(byMonth, 'key'), totalShown),
    },
  };
}

/** CSV rows (header first) of the report: the same cells as the page, suppressed values left out. */
export function injuryReportCsvRecords(report: InjuryReport): string[][] {
  const fix = (n: number | null | undefined, places: number) => (n === null || n === undefined ? '' : n.toFixed(places));
  const rows: string[][] = [
    [
      'Breakdown',
      'Row',
      'Time-loss injuries',
      'Days lost',
      'Exposure hours',
      'Incidence per 1000 h',
      'Incidence 95% low',
      'Incidence 95% high',
      'Burden days per 1000 h',
      'Burden 95% low',
      'Burden 95% high',
      'Note',
    ],
  ];
  const NOTES: Record<Hidden, string> = {
    'small-count': 'fewer than 5 injuries: numbers withheld',
    'few-athletes': `fewer than ${MIN_ATHLETES} athletes: row withheld`,
    'one-athlete': 'all one athlete: row withheld',
    complement: 'withheld so another row cannot be worked out',
  };
  const line = (breakdown: string, c: ReportCell) => [
    breakdown,
    c.label,
    c.injuriesText,
    c.daysLost === null ? '' : String(c.daysLost),
    fix(c.hours, 1),
    fix(c.incidence?.value, 2),
    fix(c.incidence?.low, 2),
    fix(c.incidence?.high, 2),
    fix(c.burden?.value, 1),
    fix(c.burden?.low, 1),
    fix(c.burden?.high, 1),
    c.hidden ? NOTES[c.hidden] : '',
  ];
  rows.push(line('Total', report.total));
  const names: [BreakdownName, string][] = [
    ['bodyRegion', 'Body region'],
    ['sport', 'Sport'],
    ['group', 'Group'],
    ['month', 'Month of onset'],
  ];
  for (const [key, name] of names) for (const c of report.breakdowns[key]) rows.push(line(name, c));
  return rows;
}
