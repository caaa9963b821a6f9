import { useState } from 'react';
import type { BreakdownName, Hidden, Rate, ReportCell } from '../../../../../policies/load/injury-report';
import { MIN_ATHLETES, SMALL_COUNT } from '../../../../../policies/load/injury-report';
import { buttonClass } from '../../../components/ui/Button';
import { RadioGroup, TextField } from '../../../components/ui/Field';
import { ErrorNotice } from '../../../components/ui/Notice';
import { Facts, Loading, Panel } from '../../../components/ui/Panel';
import { addDaysIso, todayLocal } from '../../../lib/dates';
import { injuryReportCsvHref, useInjuryReport } from '../api/injury-report';
import { RateChart } from './RateChart';

const BREAKDOWNS: { value: BreakdownName; label: string }[] = [
  { value: 'month', label: 'Month of onset' },
  { value: 'bodyRegion', label: 'Body region' },
  { value: 'sport', label: 'Sport' },
  { value: 'group', label: 'Group' },
];

export const HIDDEN_WORDS: Record<Hidden, string> = {
  'small-count': `Fewer than ${SMALL_COUNT} injuries: numbers withheld`,
  'few-athletes': `Fewer than ${MIN_ATHLETES} athletes: row withheld`,
  'one-athlete': 'All one athlete’s injuries: row withheld',
  complement: 'Withheld so another row cannot be worked out',
};

const rateText = (r: Rate | null, places: number) =>
  r ? `${r.value.toFixed(places)} (${r.low.toFixed(places)}–${r.high.toFixed(places)})` : '—';

/**
 * The organization's injury report (policies/load/injury-report.ts): totals, a chart and a table by
 * month, body region, sport or group, and the CSV. Aggregates only, small cells withheld.
 */
export function InjuryReportView({ orgId }: { orgId: string }) {
  const today = todayLocal();
  const [from, setFrom] = useState(addDaysIso(today, -364));
  const [to, setTo] = useState(today);
  const [breakdown, setBreakdown] = useState<BreakdownName>('month');
  const [measure, setMeasure] = useState<'incidence' | 'burden'>('incidence');
  const valid = /^\d{4}-\d{2}-\d{2}$/.test(from) && /^\d{4}-\d{2}-\d{2}$/.test(to) && from <= to;
  const report = useInjuryReport(orgId, from, to, valid);
  const r = report.data;
  const cells: ReportCell[] = r ? r.breakdowns[breakdown] : [];
  const label = BREAKDOWNS.find((b) => b.value === breakdown)!.label;
  return (
    <div className="space-y-5">
      <Panel title="Period">
        <div className="flex flex-wrap items-end gap-3">
          <TextField label="From" type="date" value={from} onChange={(e) => setFrom(e.target.value)} />
          <TextField
            label="To"
            type="date"
            value={to}
            onChange={(e) => setTo(e.target.value)}
            error={valid ? undefined : 'must be a date on or after From'}
          />
          {valid && (
            <a href={injuryReportCsvHref(orgId, from, to)} download className={buttonClass('secondary', 'sm')}>
              Download CSV
            </a>
          )}
        </div>
      </Panel>
      {!valid ? null : report.isPending ? (
        <Loading what="the injury report" />
      ) : report.isError ? (
        <ErrorNotice error={report.error} />
      ) : (
        r && (
          <>
            <Panel title="Whole organization">
              <Facts
                items={[
                  { label: 'Time-loss injuries', value: r.total.injuriesText },
                  { label: 'Days lost', value: r.total.daysLost ?? '—' },
                  { label: 'Exposure hours', value: r.total.hours?.toLocaleString('en-GB') ?? '—' },
                  { label: 'Incidence per 1,000 h (95 % interval)', value: rateText(r.total.incidence, 2) },
                  { label: 'Burden: days lost per 1,000 h (95 % interval)', value: rateText(r.total.burden, 1) },
                  {
                    label: 'Hours by kind',
                    value: `training logs ${r.hoursByKind.training} · team practice ${r.hoursByKind.practice} · competition ${r.hoursByKind.competition}`,
                  },
                  { label: 'Not back to full by the last day counted', value: r.ongoing === null ? `< ${SMALL_COUNT}` : r.ongoing },
                ]}
              />
              {r.total.hidden && <p className="mt-2 text-sm text-muted">{HIDDEN_WORDS[r.total.hidden]}.</p>}
            </Panel>
            <Panel title="Breakdown">
              <div className="flex flex-wrap gap-6">
                <RadioGroup legend="By" name="breakdown" options={BREAKDOWNS} value={breakdown} onChange={setBreakdown} />
                <RadioGroup
                  legend="Show"
                  name="measure"
                  options={[
                    { value: 'incidence', label: 'Incidence' },
                    { value: 'burden', label: 'Burden' },
                  ]}
                  value={measure}
                  onChange={setMeasure}
                />
              </div>
              {cells.length === 0 ? (
                <p className="mt-3 text-sm text-muted">Nothing recorded in this period.</p>
              ) : (
                <>
                  <RateChart
                    title={`${measure === 'incidence' ? 'Incidence' : 'Burden'} by ${label.toLowerCase()}`}
                    cells={cells}
                    measure={measure}
                  />
                  {/* Scrolls sideways on a phone inside its own focusable region, as DataTable does. */}
                  <div className="overflow-x-auto" role="region" aria-label={`Table by ${label.toLowerCase()}`} tabIndex={0}>
                    <table className="mt-3 w-full text-sm">
                      <caption className="text-left font-semibold">By {label.toLowerCase()}</caption>
                      <thead>
                        <tr className="text-left">
                          <th scope="col">{label}</th>
                          <th scope="col">Injuries</th>
                          <th scope="col">Days lost</th>
                          <th scope="col">Hours</th>
                          <th scope="col">Incidence per 1,000 h</th>
                          <th scope="col">Days lost per 1,000 h</th>
                          <th scope="col">Note</th>
                        </tr>
                      </thead>
                      <tbody>
                        {cells.map((c) => (
                          <tr key={c.key} className="border-t border-rule">
                            <th scope="row" className="text-left font-normal">
                              {c.label}
                            </th>
                            <td>{c.injuriesText}</td>
                            <td>{c.daysLost ?? '—'}</td>
                            <td>{c.hours ?? '—'}</td>
                            <td>{rateText(c.incidence, 2)}</td>
                            <td>{rateText(c.burden, 1)}</td>
                            <td className="text-muted">{c.hidden ? HIDDEN_WORDS[c.hidden] : ''}</td>
                          </tr>
                        ))}
                      </tbody>
                    </table>
                  </div>
                </>
              )}
            </Panel>
            <Panel title="How these numbers are counted">
              <ul className="list-disc space-y-1 pl-5 text-sm">
                <li>
                  Definitions follow the IOC consensus on recording and reporting injury in sport (Bahr et al. 2020, BJSM 54:372–389). An
                  injury is a case with at least one day at Out or Limited, counted in the month of its onset.
                </li>
                <li>
                  Days lost are the days from onset on which the case was not at Full; a Limited day counts as a whole day lost, like an Out
                  day. Days are counted up to the end of the period or today, whichever is earlier.
                </li>
                <li>
                  Exposure is the athletes&apos; own training logs plus the practice and competition hours coaches record for their groups.
                  Incidence is injuries per 1,000 h; burden is days lost per 1,000 h. Intervals are exact 95 % Poisson intervals (Garwood);
                  the burden&apos;s interval treats each day as a separate event, so it is narrower than the truth.
                </li>
                <li>
                  To protect privacy, counts from 1 to {SMALL_COUNT - 1} show as &ldquo;&lt; {SMALL_COUNT}&rdquo;, rows resting on fewer
                  than {MIN_ATHLETES} athletes or on one athlete&apos;s injuries are not shown, and a second row may be withheld so a hidden
                  one cannot be worked out.
                </li>
                <li>This report describes the programme as a whole. Decisions about any one athlete stay with their licensed clinician.</li>
              </ul>
            </Panel>
          </>
        )
      )}
    </div>
  );
}
