import { useId, useRef, useState } from 'react';
import { Button } from './Button';

/** A read-only value with a copy button, e.g. an invitation link. Falls back to selecting the text. */
export function CopyField({ label, value, buttonLabel = 'Copy' }: { label: string; value: string; buttonLabel?: string }) {
  const id = useId();
  const inputRef = useRef<HTMLInputElement>(null);
  const [state, setState] = useState<'idle' | 'copied' | 'select'>('idle');

  async function copy() {
    try {
      await navigator.clipboard.writeText(value);
      setState('copied');
    } catch {
      inputRef.current?.select();
      setState('select');
    }
  }

  return (
    <div>
      <label htmlFor={id} className="block text-sm font-semibold">
        {label}
      </label>
      <div className="mt-1 flex flex-wrap gap-2">
        <input
          ref={inputRef}
          id={id}
          readOnly
          value={value}
          onFocus={(e) => e.currentTarget.select()}
          className="min-h-10 min-w-0 flex-1 rounded-md border border-rule-strong bg-paper px-3 font-mono text-xs"
        />
        <Button variant="secondary" onClick={() => void copy()}>
          {buttonLabel}
        </Button>
      </div>
      <p aria-live="polite" className="mt-1 text-sm text-muted">
        {state === 'copied' && 'Copied.'}
        {state === 'select' && 'Copying is blocked here: the link is selected, press Ctrl+C (or ⌘C) to copy it.'}
      </p>
    </div>
  );
}
