import { useId, useRef, type KeyboardEvent, type ReactNode } from 'react';
import { cx } from './cx';

export interface TabItem<K extends string> {
  key: K;
  label: string;
  panel: ReactNode;
}

/**
 * Tabs with the keyboard behaviour people expect (arrow keys move between tabs, Tab goes into the
 * panel). Only the chosen panel is rendered; the parent owns which one that is.
 */
export function Tabs<K extends string>({
  label,
  items,
  selected,
  onSelect,
}: {
  label: string;
  items: TabItem<K>[];
  selected: K;
  onSelect: (key: K) => void;
}) {
  const base = useId();
  const refs = useRef<Array<HTMLButtonElement | null>>([]);
  const current = items.find((i) => i.key === selected) ?? items[0];

  function onKeyDown(e: KeyboardEvent, index: number) {
    const step = e.key === 'ArrowRight' ? 1 : e.key === 'ArrowLeft' ? -1 : 0;
    const to = e.key === 'Home' ? 0 : e.key === 'End' ? items.length - 1 : (index + step + items.length) % items.length;
    if (step === 0 && e.key !== 'Home' && e.key !== 'End') return;
    e.preventDefault();
    onSelect(items[to].key);
    refs.current[to]?.focus();
  }

  return (
    <div>
      <div role="tablist" aria-label={label} className="flex gap-1 overflow-x-auto border-b border-rule">
        {items.map((item, i) => {
          const active = item.key === current.key;
          return (
            <button
              key={item.key}
              ref={(el) => {
                refs.current[i] = el;
              }}
              type="button"
              role="tab"
              id={`${base}-tab-${item.key}`}
              aria-selected={active}
              aria-controls={`${base}-panel`}
              tabIndex={active ? 0 : -1}
              onClick={() => onSelect(item.key)}
              onKeyDown={(e) => onKeyDown(e, i)}
              className={cx(
                '-mb-px min-h-10 border-b-4 px-3 text-sm font-semibold whitespace-nowrap',
                active ? 'border-line text-ink' : 'border-transparent text-ink-2 hover:border-rule-strong',
              )}
            >
              {item.label}
            </button>
          );
        })}
      </div>
      <div
        role="tabpanel"
        id={`${base}-panel`}
        aria-labelledby={`${base}-tab-${current.key}`}
        tabIndex={0}
        className="pt-4 focus:outline-none focus-visible:outline-3"
      >
        {current.panel}
      </div>
    </div>
  );
}
