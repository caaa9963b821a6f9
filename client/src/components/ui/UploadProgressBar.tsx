import { Button } from './Button';

function size(bytes: number): string {
  if (bytes >= 1024 * 1024) return `${(bytes / (1024 * 1024)).toFixed(1)} MB`;
  return `${Math.max(1, Math.round(bytes / 1024))} kB`;
}

/**
 * How far an upload has got, as a bar with the percentage and bytes beside it, and a way to stop it.
 * At 100% the bytes are sent but the server is still checking and storing them, and it says so.
 */
export function UploadProgressBar({
  label,
  percent,
  loaded,
  total,
  onCancel,
}: {
  label: string;
  percent: number;
  loaded: number;
  total: number;
  onCancel?: () => void;
}) {
  const sent = percent >= 100;
  return (
    <div className="rounded-md border border-rule bg-sheet p-3 text-sm">
      <div className="flex flex-wrap items-center gap-3">
        <div
          role="progressbar"
          aria-label={label}
          aria-valuemin={0}
          aria-valuemax={100}
          aria-valuenow={percent}
          aria-valuetext={`${percent}%`}
          className="relative h-3 min-w-32 flex-1 overflow-hidden rounded-sm bg-shade"
        >
          <div className="absolute inset-y-0 left-0 bg-ink-2 transition-[width]" style={{ width: `${percent}%` }} />
        </div>
        <span className="w-12 shrink-0 text-right font-semibold tabular-nums">{percent}%</span>
        {onCancel && !sent && (
          <Button variant="secondary" size="sm" onClick={onCancel}>
            Cancel upload
          </Button>
        )}
      </div>
      <p className="mt-1 text-muted tabular-nums" aria-live="polite">
        {sent ? 'Sent. Checking and storing the file…' : `${size(loaded)} of ${size(total)} sent`}
      </p>
    </div>
  );
}
