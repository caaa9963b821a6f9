import type { ReportCell } from '../../../../../policies/load/injury-report';
import { INK, INK_2, LINE_DEEP, MUTED, RULE, SHADE } from '../../workload/components/chart-kit';

const ROW = 28;
const LABEL_W = 150;
const PLOT_W = 360;
const VALUE_W = 110;
const PAD_TOP = 24;

/**
 * One horizontal bar per row: the rate per 1,000 h, with its 95 % interval as a whisker. Withheld
 * rows are written out ("< 5", "not shown") rather than drawn, so nothing small can be read off the
 * picture. Plain SVG; the table beside it carries the same numbers for screen readers.
 */
export function RateChart({ title, cells, measure }: { title: string; cells: ReportCell[]; measure: 'incidence' | 'burden' }) {
  const rates = cells.map((c) => c[measure]);
  const max = Math.max(1e-9, ...rates.map((r) => r?.high ?? 0));
  const x = (v: number) => LABEL_W + (v / max) * PLOT_W;
  const height = PAD_TOP + cells.length * ROW + 8;
  const width = LABEL_W + PLOT_W + VALUE_W;
  const unit = measure === 'incidence' ? 'injuries per 1,000 h' : 'days lost per 1,000 h';
  return (
    <figure className="overflow-x-auto">
      <svg
        role="img"
        aria-label={`${title}: ${unit}, with 95 % intervals; the table below has the numbers`}
        viewBox={`0 0 ${width} ${height}`}
        width="100%"
        style={{ maxWidth: width }}
      >
        <text x={LABEL_W} y={14} fontSize={12} fill={INK_2}>
          {unit} (line: 95 % interval)
        </text>
        <line x1={LABEL_W} x2={LABEL_W} y1={PAD_TOP - 4} y2={height - 4} stroke={RULE} />
        {cells.map((c, i) => {
          const y = PAD_TOP + i * ROW;
          const r = c[measure];
          return (
            <g key={c.key}>
              <text x={LABEL_W - 8} y={y + 17} textAnchor="end" fontSize={12} fill={INK}>
                {c.label.length > 22 ? `${c.label.slice(0, 21)}…` : c.label}
              </text>
              {r ? (
                <>
                  <rect x={LABEL_W} y={y + 5} width={Math.max(1, x(r.value) - LABEL_W)} height={ROW - 10} fill={SHADE} stroke={INK_2} />
                  <line x1={x(r.low)} x2={x(r.high)} y1={y + ROW / 2} y2={y + ROW / 2} stroke={LINE_DEEP} strokeWidth={2} />
                  <line x1={x(r.low)} x2={x(r.low)} y1={y + 8} y2={y + ROW - 8} stroke={LINE_DEEP} strokeWidth={2} />
                  <line x1={x(r.high)} x2={x(r.high)} y1={y + 8} y2={y + ROW - 8} stroke={LINE_DEEP} strokeWidth={2} />
                  <text x={LABEL_W + PLOT_W + 8} y={y + 17} fontSize={12} fill={INK}>
                    {r.value.toFixed(measure === 'incidence' ? 2 : 1)}
                  </text>
                </>
              ) : (
                <text x={LABEL_W + 8} y={y + 17} fontSize={12} fill={MUTED}>
                  {c.hidden === 'small-count' ? '< 5 injuries: withheld' : c.hidden ? 'not shown' : 'no exposure recorded'}
                </text>
              )}
            </g>
          );
        })}
      </svg>
      <figcaption className="sr-only">{title}</figcaption>
    </figure>
  );
}
