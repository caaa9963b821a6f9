import { useId } from 'react';
import { Bar, BarChart, CartesianGrid, LabelList, ReferenceArea, Tooltip, XAxis, YAxis } from 'recharts';
import type { WorkloadDto } from '../../../../../policies/dto';
import { formatDate } from '../../../lib/format';
import { AXIS_TICK, ChartFigure, INK, INK_2, KeyItem, RULE, RULE_STRONG, svgId, shortDate, weekSpan } from './chart-kit';

const pctChange = (now: number, before: number) => (before > 0 ? Math.round(((now - before) / before) * 100) : null);

/** Weekly totals of session load (effort × minutes), each bar labelled with its number. */
export function WeeklyLoadChart({ weeks, level }: { weeks: WorkloadDto['weeks']; level?: 2 | 3 }) {
  const rows = weeks.some((w) => w.total > 0)
    ? weeks.map((w, i) => ({ ...w, label: shortDate(w.start), change: i > 0 ? pctChange(w.total, weeks[i - 1].total) : null }))
    : [];
  const last = rows.at(-1);
  return (
    <ChartFigure
      title="Weekly load"
      level={level}
      summary={
        last
          ? `Each bar is seven days of session load (effort × minutes, in arbitrary units), marked with the day it starts. Latest: ${last.total}${
              last.change !== null ? `, ${last.change >= 0 ? `${last.change}% more` : `${-last.change}% less`} than the week before` : ''
            }.`
          : undefined
      }
      empty="No sessions logged in these weeks yet."
      rows={rows}
      rowKey={(r) => r.start}
      columns={[
        { header: 'Week', cell: (r) => weekSpan(r.start, r.end) },
        { header: 'Total (AU)', cell: (r) => r.total },
        { header: 'Change', cell: (r) => (r.change === null ? '—' : `${r.change > 0 ? '+' : ''}${r.change}%`) },
      ]}
    >
      <BarChart
        data={rows}
        responsive
        style={{ width: '100%', height: 220 }}
        margin={{ top: 20, right: 4, bottom: 0, left: 0 }}
        accessibilityLayer={false}
      >
        <CartesianGrid stroke={RULE} vertical={false} />
        <XAxis dataKey="label" tick={AXIS_TICK} stroke={RULE_STRONG} interval="preserveStartEnd" minTickGap={8} />
        <YAxis tick={AXIS_TICK} stroke={RULE_STRONG} width={44} allowDecimals={false} />
        <Bar dataKey="total" name="Weekly load" fill={INK_2} maxBarSize={48} isAnimationActive={false}>
          <LabelList dataKey="total" position="top" fill={INK} fontSize={12} fontWeight={600} />
        </Bar>
        <Tooltip />
      </BarChart>
    </ChartFigure>
  );
}

/** Stage shading alternates two hatch directions, so neighbouring stages read apart without colour. */
function StagePatterns({ id }: { id: string }) {
  return (
    <defs>
      <pattern id={`${id}-a`} width="8" height="8" patternUnits="userSpaceOnUse" patternTransform="rotate(45)">
        <rect width="8" height="8" fill="#f3ede3" />
        <line x1="0" y1="0" x2="0" y2="8" stroke={RULE} strokeWidth="3" />
      </pattern>
      <pattern id={`${id}-b`} width="8" height="8" patternUnits="userSpaceOnUse" patternTransform="rotate(-45)">
        <rect width="8" height="8" fill="#f3ede3" />
        <line x1="0" y1="0" x2="0" y2="8" stroke={RULE} strokeWidth="1.5" />
      </pattern>
    </defs>
  );
}

/**
 * Daily session load with the clinician's stages shaded behind the bars and named at the top, so a
 * change of load can be read against a change of plan.
 */
export function DailyLoadChart({ daily, stages, level }: { daily: WorkloadDto['daily']; stages: WorkloadDto['stages']; level?: 2 | 3 }) {
  const id = svgId(useId());
  const first = daily[0]?.date;
  const last = daily.at(-1)?.date;
  const shown =
    first && last
      ? stages
          .map((s, i) => ({
            ...s,
            name: s.label || `Stage ${i + 1}`,
            x1: s.startDate < first ? first : s.startDate,
            x2: s.endDate > last ? last : s.endDate,
          }))
          .filter((s) => s.x1 <= s.x2)
      : [];
  const trainingDays = daily.filter((d) => d.load > 0).length;
  return (
    <ChartFigure
      title="Daily load"
      level={level}
      summary={
        <>
          {`${trainingDays} training ${trainingDays === 1 ? 'day' : 'days'} of ${daily.length}; rest days count as 0.`}
          {shown.length > 0 &&
            ` Hatched bands are the clinician's plan stages: ${shown.map((s) => `${s.name} (${formatDate(s.startDate)} – ${formatDate(s.endDate)})`).join('; ')}.`}
        </>
      }
      keyItems={
        <>
          <KeyItem swatch={<rect x="8" y="1" width="12" height="12" fill={INK_2} />}>Session load (AU)</KeyItem>
          {shown.length > 0 && (
            <KeyItem
              swatch={
                <>
                  <StagePatterns id={`${id}k`} />
                  <rect x="1" y="1" width="26" height="12" fill={`url(#${id}k-a)`} stroke={RULE_STRONG} />
                </>
              }
            >
              Plan stage
            </KeyItem>
          )}
        </>
      }
      rows={daily.filter((d) => d.load > 0)}
      rowKey={(r) => r.date}
      empty="No sessions logged in this period yet."
      columns={[
        { header: 'Date', cell: (r) => formatDate(r.date) },
        { header: 'Load (AU)', cell: (r) => r.load },
        { header: 'Stage', cell: (r) => shown.find((s) => s.startDate <= r.date && r.date <= s.endDate)?.name ?? '—' },
      ]}
    >
      <BarChart
        data={daily}
        responsive
        style={{ width: '100%', height: 240 }}
        margin={{ top: 22, right: 4, bottom: 0, left: 0 }}
        accessibilityLayer={false}
      >
        <StagePatterns id={id} />
        {shown.map((s, i) => (
          <ReferenceArea
            key={`${s.startDate}-${i}`}
            x1={s.x1}
            x2={s.x2}
            fill={`url(#${id}-${i % 2 === 0 ? 'a' : 'b'})`}
            fillOpacity={1}
            stroke={RULE_STRONG}
            strokeDasharray="3 3"
            ifOverflow="extendDomain"
            label={{ value: s.name, position: 'insideTopLeft', fill: INK, fontSize: 12, fontWeight: 600 }}
          />
        ))}
        <CartesianGrid stroke={RULE} vertical={false} />
        <XAxis dataKey="date" tickFormatter={shortDate} tick={AXIS_TICK} stroke={RULE_STRONG} minTickGap={16} />
        <YAxis tick={AXIS_TICK} stroke={RULE_STRONG} width={40} allowDecimals={false} />
        <Bar dataKey="load" name="Session load" fill={INK_2} maxBarSize={16} isAnimationActive={false} />
        <Tooltip labelFormatter={(d) => formatDate(String(d))} />
      </BarChart>
    </ChartFigure>
  );
}
