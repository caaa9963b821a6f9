import { useId, type ReactNode } from 'react';
import { format, parseISO } from 'date-fns';
import { cx } from '../../../components/ui/cx';

/**
 * The chart palette is the app's (client/src/index.css): SVG attributes cannot read CSS variables,
 * so the values are repeated here. Ink and greys carry the data; the burnt orange is only ever the line.
 */
export const INK = '#14202e';
export const INK_2 = '#3b4756';
export const MUTED = '#5a6472';
export const SHADE = '#ece6db';
export const RULE = '#d8d0c2';
export const RULE_STRONG = '#8a8175';
export const LINE = '#c2571a';
export const SHEET = '#fffdf8';

export const LINE_DEEP = '#9a4210';

export const AXIS_TICK = { fill: INK_2, fontSize: 12 };

/** useId() gives characters that don't belong in url(#…) references. */
export const svgId = (reactId: string) => `c${reactId.replace(/[^a-zA-Z0-9_-]/g, '')}`;

/** '2026-03-14' → '14 Mar' for axis ticks. */
export const shortDate = (iso: string) => format(parseISO(iso), 'd MMM');

/** '2026-03-09'..'2026-03-15' → '9–15 Mar' (or '30 Mar–5 Apr'). */
export function weekSpan(start: string, end: string): string {
  const a = parseISO(start);
  const b = parseISO(end);
  return a.getMonth() === b.getMonth() ? `${format(a, 'd')}–${format(b, 'd MMM')}` : `${format(a, 'd MMM')}–${format(b, 'd MMM')}`;
}

/** The index of the last point where `key` has a value: where a line's name is written. */
export function lastIndexWith<T>(rows: readonly T[], key: keyof T): number {
  for (let i = rows.length - 1; i >= 0; i--) {
    const v = rows[i][key];
    if (v !== null && v !== undefined) return i;
  }
  return -1;
}

/**
 * A label content function for a Line: writes `name` once, beside the point at `index`, so each line
 * is named on the chart itself rather than only in a colour key. `side` 'before' writes it to the
 * left of the point (for the last point, so it stays inside the plot).
 */
export function endLabel(name: string, index: number, color: string = INK, dy = 4, side: 'before' | 'after' = 'before') {
  return function EndLabel(props: { index?: number; viewBox?: unknown }) {
    const box = props.viewBox as { x?: number; y?: number } | undefined;
    if (props.index !== index || box?.x === undefined || box.y === undefined) return null;
    return (
      <text
        x={box.x + (side === 'before' ? -8 : 8)}
        y={box.y + dy}
        textAnchor={side === 'before' ? 'end' : 'start'}
        fontSize={12}
        fontWeight={600}
        fill={color}
        paintOrder="stroke"
        stroke={SHEET}
        strokeWidth={3}
      >
        {name}
      </text>
    );
  };
}

/** A key entry drawn with the same shape and dash as the chart, so the key reads without colour. */
export function KeyItem({ children, swatch }: { children: ReactNode; swatch: ReactNode }) {
  return (
    <li className="inline-flex items-center gap-1.5">
      <svg width="28" height="14" viewBox="0 0 28 14" aria-hidden="true" focusable="false">
        {swatch}
      </svg>
      {children}
    </li>
  );
}

export interface ChartTableColumn<T> {
  header: string;
  cell: (row: T) => ReactNode;
}

/**
 * A chart with its heading, a one-line reading of it, a key in shapes and dashes, and the numbers
 * behind it as a table (for screen readers, and for anyone who wants the figures).
 */
export function ChartFigure<T>({
  title,
  level = 2,
  summary,
  keyItems,
  children,
  rows,
  columns,
  rowKey,
  empty,
  className,
}: {
  title: string;
  level?: 2 | 3;
  summary?: ReactNode;
  keyItems?: ReactNode;
  children: ReactNode;
  rows: readonly T[];
  columns: ChartTableColumn<T>[];
  rowKey: (row: T) => string;
  /** Shown instead of the chart when there is nothing to draw. */
  empty?: string;
  className?: string;
}) {
  const id = useId();
  const Heading = level === 2 ? 'h2' : 'h3';
  return (
    <section aria-labelledby={id} className={cx('rounded-lg border border-rule bg-sheet p-4 sm:p-5', className)}>
      <Heading id={id} className={level === 2 ? 'text-lg font-bold' : 'text-base font-bold'}>
        {title}
      </Heading>
      {summary && <div className="mt-1 text-sm text-ink-2">{summary}</div>}
      {rows.length === 0 && empty ? (
        <p className="mt-3 text-sm text-ink-2">{empty}</p>
      ) : (
        <>
          {keyItems && <ul className="mt-2 flex flex-wrap gap-x-4 gap-y-1 text-sm">{keyItems}</ul>}
          {/* The drawing is one image to assistive technology; the table below carries the figures. */}
          <div className="mt-2" role="img" aria-label={`Chart: ${title}. The numbers are in the table under it.`}>
            {children}
          </div>
          <details className="mt-2 text-sm">
            <summary className="cursor-pointer font-semibold">The numbers behind “{title}”</summary>
            <div className="mt-2 overflow-x-auto">
              <table className="w-full border-collapse text-left tabular-nums">
                <caption className="sr-only">{title}</caption>
                <thead>
                  <tr className="border-b border-rule bg-shade">
                    {columns.map((c) => (
                      <th key={c.header} scope="col" className="px-2 py-1 font-semibold whitespace-nowrap">
                        {c.header}
                      </th>
                    ))}
                  </tr>
                </thead>
                <tbody>
                  {rows.map((row) => (
                    <tr key={rowKey(row)} className="border-b border-rule last:border-b-0">
                      {columns.map((c) => (
                        <td key={c.header} className="px-2 py-1 whitespace-nowrap">
                          {c.cell(row)}
                        </td>
                      ))}
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
          </details>
        </>
      )}
    </section>
  );
}
