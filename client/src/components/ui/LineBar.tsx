import { cx } from './cx';

export interface LineBarProps {
  /** What is measured, e.g. "Planned load, back squat". Names the meter. */
  label: string;
  value: number;
  /** The line the value must stay at or under. */
  limit: number;
  /** Right end of the scale; by default a little past the larger of value and limit. */
  max?: number;
  unit?: string;
  format?: (n: number) => string;
  /** Shows the label above the bar; off when a table column already names it. */
  showLabel?: boolean;
  className?: string;
}

const plain = (n: number) => (Number.isInteger(n) ? String(n) : n.toFixed(1));

/**
 * The product's motif: a bar against a thin marked limit line, with the number beside it. A breach is
 * the bar crossing the line (the part past it is hatched) plus words, never colour alone.
 */
export function LineBar({ label, value, limit, max, unit, format = plain, showLabel = true, className }: LineBarProps) {
  const scale = Math.max(max ?? Math.max(limit, value) * 1.2, 1e-9);
  const pct = (n: number) => `${Math.min(Math.max(n / scale, 0), 1) * 100}%`;
  const withUnit = (n: number) => (unit ? `${format(n)} ${unit}` : format(n));
  const over = value - limit;
  const breach = over > 0;
  const words = breach ? `over the line by ${withUnit(over)} (limit ${withUnit(limit)})` : `limit ${withUnit(limit)}`;

  return (
    <div className={cx('text-sm', className)}>
      {showLabel && <div className="mb-1 text-ink-2">{label}</div>}
      <div className="flex items-center gap-3">
        <div
          role="meter"
          aria-label={label}
          aria-valuemin={0}
          aria-valuemax={scale}
          aria-valuenow={value}
          aria-valuetext={`${withUnit(value)}, ${words}`}
          className="relative h-3 min-w-24 flex-1 rounded-sm bg-shade"
        >
          <div className="absolute inset-y-0 left-0 rounded-l-sm bg-ink-2" style={{ width: pct(Math.min(value, limit)) }} />
          {breach && (
            <div
              data-part="over"
              className="absolute inset-y-0 bg-[repeating-linear-gradient(135deg,var(--color-line-deep)_0_3px,transparent_3px_6px)]"
              style={{ left: pct(limit), width: `calc(${pct(value)} - ${pct(limit)})` }}
            />
          )}
          <div
            data-part="line"
            aria-hidden="true"
            className="absolute -inset-y-2 w-[3px] -translate-x-1/2 rounded-full bg-line"
            style={{ left: pct(limit) }}
          />
        </div>
        <span className="shrink-0 font-semibold tabular-nums">{withUnit(value)}</span>
      </div>
      <p className={cx('mt-1 tabular-nums', breach ? 'font-semibold text-line-deep' : 'text-muted')}>
        {breach ? `Over the line by ${withUnit(over)} — the limit is ${withUnit(limit)}` : `Limit ${withUnit(limit)}`}
      </p>
    </div>
  );
}
