import { useId, type ReactNode } from 'react';
import { cx } from './cx';

export interface PanelProps {
  title?: ReactNode;
  /** h2 by default; nested sections pass 3. */
  level?: 2 | 3;
  actions?: ReactNode;
  children: ReactNode;
  className?: string;
}

/** A titled section on a raised sheet. Its heading names the region for assistive technology. */
export function Panel({ title, level = 2, actions, children, className }: PanelProps) {
  const id = useId();
  const Heading = level === 2 ? 'h2' : 'h3';
  return (
    <section aria-labelledby={title ? id : undefined} className={cx('rounded-lg border border-rule bg-sheet p-4 sm:p-5', className)}>
      {(title || actions) && (
        <div className="mb-3 flex flex-wrap items-center justify-between gap-2">
          {title && (
            <Heading id={id} className={level === 2 ? 'text-lg font-bold' : 'text-base font-bold'}>
              {title}
            </Heading>
          )}
          {actions}
        </div>
      )}
      {children}
    </section>
  );
}

/** Says plainly that a part of the product is not built yet, without alarm. */
export function ComingLater({ title, children }: { title: string; children: ReactNode }) {
  return (
    <section className="rounded-lg border border-dashed border-rule-strong px-4 py-3 text-sm" aria-label={title}>
      <p className="font-semibold">{title}</p>
      <div className="mt-1 text-ink-2">{children}</div>
    </section>
  );
}

export function PageHeader({ title, children, actions }: { title: string; children?: ReactNode; actions?: ReactNode }) {
  return (
    <div className="mb-5 flex flex-wrap items-end justify-between gap-3">
      <div className="min-w-0">
        <h1 className="text-2xl font-bold tracking-tight">{title}</h1>
        {children && <div className="mt-1 max-w-prose text-sm text-ink-2">{children}</div>}
      </div>
      {actions && <div className="flex flex-wrap gap-2">{actions}</div>}
    </div>
  );
}

export function Loading({ what }: { what: string }) {
  return (
    <p role="status" className="py-4 text-sm text-muted">
      Loading {what}…
    </p>
  );
}

export function Badge({ children, tone = 'plain' }: { children: ReactNode; tone?: 'plain' | 'warn' }) {
  return (
    <span
      className={cx(
        'inline-flex items-center gap-1 rounded border px-1.5 py-0.5 text-xs font-semibold whitespace-nowrap',
        tone === 'warn' ? 'border-line-deep text-line-deep' : 'border-rule-strong text-ink-2',
      )}
    >
      {tone === 'warn' && <span aria-hidden="true">▲</span>}
      {children}
    </span>
  );
}

/**
 * Definition list for a record's facts: label, value. A long label wraps within 60 % of the width
 * rather than pushing the values off a phone's screen.
 */
export function Facts({ items }: { items: Array<{ label: string; value: ReactNode }> }) {
  return (
    <dl className="grid grid-cols-[fit-content(60%)_minmax(0,1fr)] gap-x-4 gap-y-1.5 text-sm">
      {items.map((item) => (
        <div key={item.label} className="contents">
          <dt className="text-muted">{item.label}</dt>
          <dd className="tabular-nums break-words">{item.value}</dd>
        </div>
      ))}
    </dl>
  );
}
