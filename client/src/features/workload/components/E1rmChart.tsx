import { CartesianGrid, Line, LineChart, Symbols, Tooltip, XAxis, YAxis } from 'recharts';
import type { WorkloadDto } from '../../../../../policies/dto';
import type { Unit } from '../../../../../policies/schemas';
import { toUnit } from '../../../../../policies/load/units';
import { formatDate } from '../../../lib/format';
import {
  AXIS_TICK,
  ChartFigure,
  INK,
  INK_2,
  KeyItem,
  MUTED,
  RULE,
  RULE_STRONG,
  SHEET,
  endLabel,
  lastIndexWith,
  shortDate,
} from './chart-kit';

/** Each lift gets its own dash and marker shape, so the lines part without colour. */
const STYLES = [
  { dash: undefined, symbol: 'circle', color: INK },
  { dash: '7 4', symbol: 'square', color: INK_2 },
  { dash: '2 3', symbol: 'triangle', color: INK },
  { dash: '10 3 2 3', symbol: 'diamond', color: MUTED },
  { dash: '4 4', symbol: 'cross', color: INK_2 },
] as const;

const MAX_LIFTS = STYLES.length;

interface Series {
  key: string;
  name: string;
  points: WorkloadDto['e1rm'];
}

/** Lifts grouped by name (case apart), the most often estimated first. */
export function liftSeries(e1rm: WorkloadDto['e1rm']): Series[] {
  const byKey = new Map<string, Series>();
  for (const p of e1rm) {
    const key = p.exercise.trim().toLowerCase();
    const s = byKey.get(key) ?? { key, name: p.exercise.trim(), points: [] };
    s.points.push(p);
    byKey.set(key, s);
  }
  return [...byKey.values()].sort((a, b) => b.points.length - a.points.length || a.name.localeCompare(b.name));
}

const round1 = (n: number) => Math.round(n * 10) / 10;

/**
 * Estimated 1RM per lift over time, in the reader's unit. A hollow marker is an estimate from more
 * than 10 reps, which is less reliable (Reynolds et al. 2006).
 */
export function E1rmChart({ e1rm, unit, level }: { e1rm: WorkloadDto['e1rm']; unit: Unit; level?: 2 | 3 }) {
  const all = liftSeries(e1rm);
  const series = all.slice(0, MAX_LIFTS);
  const dates = [...new Set(series.flatMap((s) => s.points.map((p) => p.date)))].sort();
  const rows = dates.map((date) => {
    const row: Record<string, string | number | boolean | null> = { date };
    series.forEach((s, i) => {
      const p = s.points.find((x) => x.date === date);
      row[`s${i}`] = p ? round1(toUnit(p.value, unit)) : null;
      row[`s${i}low`] = p?.lowReliability ?? false;
    });
    return row;
  });
  const tableRows = all.flatMap((s) => s.points.map((p) => ({ ...p, name: s.name }))).sort((a, b) => (a.date < b.date ? -1 : 1));

  return (
    <ChartFigure
      title="Estimated 1RM per lift"
      level={level}
      summary={
        <>
          Best estimate of each day, from logged sets (load and reps, with RPE when given), in {unit}. Hollow markers come from sets of more
          than 10 reps and are less reliable.
          {all.length > MAX_LIFTS && ` The chart shows the ${MAX_LIFTS} lifts logged most often; the table has all of them.`}
        </>
      }
      empty="No logged sets to estimate from in this period."
      keyItems={series.map((s, i) => (
        <KeyItem
          key={s.key}
          swatch={
            <>
              <line x1="0" y1="7" x2="28" y2="7" stroke={STYLES[i].color} strokeWidth="2" strokeDasharray={STYLES[i].dash} />
              <Symbols cx={14} cy={7} type={STYLES[i].symbol} size={40} fill={STYLES[i].color} />
            </>
          }
        >
          {s.name}
        </KeyItem>
      ))}
      rows={tableRows}
      rowKey={(r) => `${r.name}|${r.date}`}
      columns={[
        { header: 'Date', cell: (r) => formatDate(r.date) },
        { header: 'Lift', cell: (r) => r.name },
        { header: `Estimated 1RM (${unit})`, cell: (r) => round1(toUnit(r.value, unit)) },
        { header: 'Reliability', cell: (r) => (r.lowReliability ? 'lower (more than 10 reps)' : 'usual') },
      ]}
    >
      <LineChart
        data={rows}
        responsive
        style={{ width: '100%', height: 260 }}
        margin={{ top: 12, right: 4, bottom: 0, left: 0 }}
        accessibilityLayer={false}
      >
        <CartesianGrid stroke={RULE} vertical={false} />
        <XAxis dataKey="date" tickFormatter={shortDate} tick={AXIS_TICK} stroke={RULE_STRONG} minTickGap={12} />
        <YAxis tick={AXIS_TICK} stroke={RULE_STRONG} width={44} domain={['auto', 'auto']} unit={` ${unit}`} />
        {series.map((s, i) => {
          const style = STYLES[i];
          const key = `s${i}`;
          return (
            <Line
              key={s.key}
              dataKey={key}
              name={s.name}
              stroke={style.color}
              strokeWidth={2}
              strokeDasharray={style.dash}
              connectNulls
              isAnimationActive={false}
              label={endLabel(s.name, lastIndexWith(rows, key), style.color, -10)}
              dot={(props) => {
                const { cx, cy, payload, index } = props;
                if (typeof cx !== 'number' || typeof cy !== 'number' || payload?.[key] === null) return <g key={`${key}-${index}`} />;
                const low = payload?.[`${key}low`] === true;
                return (
                  <Symbols
                    key={`${key}-${index}`}
                    cx={cx}
                    cy={cy}
                    type={style.symbol}
                    size={56}
                    fill={low ? SHEET : style.color}
                    stroke={style.color}
                    strokeWidth={2}
                  />
                );
              }}
            />
          );
        })}
        <Tooltip labelFormatter={(d) => formatDate(String(d))} />
      </LineChart>
    </ChartFigure>
  );
}
