import { Bar, CartesianGrid, ComposedChart, Line, Tooltip, XAxis, YAxis } from 'recharts';
import type { WorkloadDto } from '../../../../../policies/dto';
import { formatDate } from '../../../lib/format';
import {
  AXIS_TICK,
  ChartFigure,
  INK,
  INK_2,
  KeyItem,
  LINE,
  LINE_DEEP,
  RULE,
  RULE_STRONG,
  SHADE,
  SHEET,
  endLabel,
  lastIndexWith,
  shortDate,
} from './chart-kit';

interface Row {
  date: string;
  load: number;
  during: number;
  nextMorning: number | null;
  ceiling: number;
}

/** One point per training day: the day's total load, its highest pain, and the lowest ceiling in force. */
export function painRows(pain: WorkloadDto['pain']): Row[] {
  const byDate = new Map<string, Row>();
  for (const p of pain) {
    const row = byDate.get(p.date);
    if (!row) {
      byDate.set(p.date, { date: p.date, load: p.load, during: p.during, nextMorning: p.nextMorning, ceiling: p.ceiling });
      continue;
    }
    row.load += p.load;
    row.during = Math.max(row.during, p.during);
    row.ceiling = Math.min(row.ceiling, p.ceiling);
    if (p.nextMorning !== null) row.nextMorning = Math.max(row.nextMorning ?? 0, p.nextMorning);
  }
  return [...byDate.values()].sort((a, b) => (a.date < b.date ? -1 : 1));
}

/**
 * Pain during and the next morning (0–10, right scale) against each day's session load (bars, left
 * scale), with the clinician's ceiling as the orange line. Solid line with dots = during; dashed line
 * with open squares = next morning: the two read apart in greyscale.
 */
export function PainLoadChart({ pain, level, summary }: { pain: WorkloadDto['pain']; level?: 2 | 3; summary?: string }) {
  const rows = painRows(pain);
  const over = rows.filter((r) => r.during > r.ceiling).length;
  return (
    <ChartFigure
      title="Pain and load"
      level={level}
      summary={
        summary ??
        (rows.length
          ? `${rows.length} training ${rows.length === 1 ? 'day' : 'days'}; pain during went past the ceiling on ${over === 0 ? 'none of them' : over === 1 ? 'one' : over}.`
          : undefined)
      }
      empty="No sessions logged in this period yet."
      keyItems={
        <>
          <KeyItem swatch={<rect x="6" y="2" width="16" height="10" fill={SHADE} stroke={RULE_STRONG} />}>Session load</KeyItem>
          <KeyItem
            swatch={
              <>
                <line x1="0" y1="7" x2="28" y2="7" stroke={INK} strokeWidth="2" />
                <circle cx="14" cy="7" r="4" fill={INK} />
              </>
            }
          >
            Pain during
          </KeyItem>
          <KeyItem
            swatch={
              <>
                <line x1="0" y1="7" x2="28" y2="7" stroke={INK_2} strokeWidth="2" strokeDasharray="5 3" />
                <rect x="10" y="3" width="8" height="8" fill={SHEET} stroke={INK_2} strokeWidth="2" />
              </>
            }
          >
            Pain next morning
          </KeyItem>
          <KeyItem swatch={<line x1="0" y1="7" x2="28" y2="7" stroke={LINE} strokeWidth="3" />}>Pain ceiling</KeyItem>
        </>
      }
      rows={rows}
      rowKey={(r) => r.date}
      columns={[
        { header: 'Date', cell: (r) => formatDate(r.date) },
        { header: 'Load (AU)', cell: (r) => r.load },
        { header: 'Pain during', cell: (r) => `${r.during}/10${r.during > r.ceiling ? ' — past the ceiling' : ''}` },
        { header: 'Next morning', cell: (r) => (r.nextMorning === null ? '—' : `${r.nextMorning}/10`) },
        { header: 'Ceiling', cell: (r) => `${r.ceiling}/10` },
      ]}
    >
      <ComposedChart
        data={rows}
        responsive
        style={{ width: '100%', height: 260 }}
        margin={{ top: 12, right: 4, bottom: 0, left: 0 }}
        accessibilityLayer={false}
      >
        <CartesianGrid stroke={RULE} vertical={false} />
        <XAxis dataKey="date" tickFormatter={shortDate} tick={AXIS_TICK} stroke={RULE_STRONG} minTickGap={12} />
        <YAxis yAxisId="load" tick={AXIS_TICK} stroke={RULE_STRONG} width={40} allowDecimals={false} />
        <YAxis
          yAxisId="pain"
          orientation="right"
          domain={[0, 10]}
          ticks={[0, 2, 4, 6, 8, 10]}
          tick={AXIS_TICK}
          stroke={RULE_STRONG}
          width={24}
        />
        <Bar
          yAxisId="load"
          dataKey="load"
          name="Session load"
          fill={SHADE}
          stroke={RULE_STRONG}
          maxBarSize={28}
          isAnimationActive={false}
        />
        <Line
          yAxisId="pain"
          type="stepAfter"
          dataKey="ceiling"
          name="Pain ceiling"
          stroke={LINE}
          strokeWidth={3}
          dot={false}
          isAnimationActive={false}
          label={endLabel('Ceiling', 0, LINE_DEEP, -8, 'after')}
        />
        <Line
          yAxisId="pain"
          dataKey="during"
          name="Pain during"
          stroke={INK}
          strokeWidth={2}
          dot={{ symbol: 'circle', r: 4, fill: INK, stroke: INK }}
          isAnimationActive={false}
          label={endLabel('During', lastIndexWith(rows, 'during'), INK, -10)}
        />
        <Line
          yAxisId="pain"
          dataKey="nextMorning"
          name="Pain next morning"
          stroke={INK_2}
          strokeWidth={2}
          strokeDasharray="6 4"
          connectNulls
          dot={{ symbol: 'square', r: 4, fill: SHEET, stroke: INK_2, strokeWidth: 2 }}
          isAnimationActive={false}
          label={endLabel('Next morning', lastIndexWith(rows, 'nextMorning'), INK_2, 18)}
        />
        <Tooltip labelFormatter={(d) => formatDate(String(d))} />
      </ComposedChart>
    </ChartFigure>
  );
}
