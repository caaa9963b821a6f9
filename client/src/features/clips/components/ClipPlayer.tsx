import { useId, useState, type KeyboardEvent, type RefObject } from 'react';
import type { ClipNoteDto } from '../../../../../policies/dto';
import { Button } from '../../../components/ui/Button';
import { cx } from '../../../components/ui/cx';
import { SPEEDS, clipTimeWords, formatClipTime, parseClipTime, toMs } from './clip-time';
import type { VideoClock } from './use-video-clock';

const FRAME_TIP = 'Moves 1/30 of a second: the player counts 30 frames a second.';

/**
 * Our own controls around a plain <video> (no browser controls): play and pause, a position bar
 * with the notes marked on it, single-frame steps, three speeds and a "go to" box. The picture
 * itself takes the keyboard too: space plays or pauses, the arrow keys step a frame.
 */
export function ClipPlayer({
  videoRef,
  src,
  clock,
  notes,
  label,
}: {
  videoRef: RefObject<HTMLVideoElement | null>;
  src: string;
  clock: VideoClock;
  notes: readonly ClipNoteDto[];
  /** Names the video for assistive technology, e.g. "Back squat, 14 Mar 2026". */
  label: string;
}) {
  const known = Number.isFinite(clock.duration) && clock.duration > 0;
  const durationMs = known ? toMs(clock.duration) : Number.NaN;
  const scrubId = useId();
  const hintId = useId();

  function onKeyDown(e: KeyboardEvent<HTMLDivElement>) {
    if (e.target !== e.currentTarget) return;
    if (e.key === ' ' || e.key === 'k') {
      e.preventDefault();
      clock.togglePlay();
    } else if (e.key === 'ArrowLeft' || e.key === 'ArrowRight') {
      e.preventDefault();
      clock.step(e.key === 'ArrowLeft' ? -1 : 1);
    }
  }

  return (
    <div className="space-y-3">
      <div
        tabIndex={0}
        role="group"
        aria-label={`Video: ${label}`}
        aria-describedby={hintId}
        onKeyDown={onKeyDown}
        className="overflow-hidden rounded-lg bg-ink"
      >
        {/* Metadata only up front: clips may be large and phones on mobile data; the server answers ranges. */}
        <video
          ref={videoRef}
          src={src}
          preload="metadata"
          playsInline
          onClick={clock.togglePlay}
          className="mx-auto block max-h-[60vh] w-full bg-ink object-contain"
        />
      </div>
      <p id={hintId} className="sr-only">
        Space plays or pauses; the left and right arrow keys step one frame (1/30 of a second).
      </p>

      <div>
        <label htmlFor={scrubId} className="sr-only">
          Position in the clip
        </label>
        <div className="relative">
          <input
            id={scrubId}
            type="range"
            min={0}
            max={known ? clock.duration : 1}
            step="any"
            value={known ? Math.min(clock.time, clock.duration) : 0}
            disabled={!known}
            aria-valuetext={known ? `${clipTimeWords(toMs(clock.time))} of ${clipTimeWords(durationMs)}` : 'length not known yet'}
            onChange={(e) => clock.seek(Number(e.currentTarget.value))}
            className="relative z-10 block h-8 w-full cursor-pointer accent-ink disabled:cursor-not-allowed"
          />
          {known && (
            <div aria-hidden="true" className="pointer-events-none absolute inset-x-2 top-0 h-2">
              {notes.map((n) => (
                <span
                  key={n.id}
                  className="absolute top-0 h-2 w-[3px] -translate-x-1/2 rounded-full bg-line"
                  style={{ left: `${Math.min(100, (n.atMs / durationMs) * 100)}%` }}
                />
              ))}
            </div>
          )}
        </div>
        <p className="flex flex-wrap justify-between gap-2 text-sm tabular-nums">
          <span>
            <span className="font-semibold" data-testid="clip-clock">
              {formatClipTime(toMs(clock.time))}
            </span>
            <span className="text-muted"> / {clock.measuring ? 'measuring…' : formatClipTime(durationMs)}</span>
          </span>
          {notes.length > 0 && (
            <span className="text-muted">
              <span aria-hidden="true" className="text-line">
                |
              </span>{' '}
              marks a note
            </span>
          )}
        </p>
      </div>

      <div className="flex flex-wrap items-center gap-2">
        <Button variant="primary" onClick={clock.togglePlay} disabled={clock.measuring} className="min-w-24">
          <span aria-hidden="true">{clock.playing ? '❚❚' : '▶'}</span>
          {clock.playing ? 'Pause' : 'Play'}
        </Button>
        <Button variant="secondary" onClick={() => clock.step(-1)} title={FRAME_TIP} aria-label="Back one frame">
          <span aria-hidden="true">◀|</span> Frame
        </Button>
        <Button variant="secondary" onClick={() => clock.step(1)} title={FRAME_TIP} aria-label="Forward one frame">
          Frame <span aria-hidden="true">|▶</span>
        </Button>
        <div role="group" aria-label="Playback speed" className="flex items-center gap-1">
          <span className="mr-1 text-sm text-muted" aria-hidden="true">
            Speed
          </span>
          {SPEEDS.map((s) => (
            <button
              key={s}
              type="button"
              aria-pressed={clock.speed === s}
              aria-label={`Speed ${s}×`}
              onClick={() => clock.setSpeed(s)}
              className={cx(
                'min-h-10 min-w-12 rounded-md border px-2 text-sm font-semibold tabular-nums',
                clock.speed === s ? 'border-ink bg-ink text-paper' : 'border-rule-strong bg-sheet text-ink hover:bg-shade',
              )}
            >
              {s}×
            </button>
          ))}
        </div>
      </div>
      <p className="text-xs text-muted">Frame steps move 1/30 of a second: the player counts 30 frames a second.</p>
      <GoToTime onGo={clock.seek} />
    </div>
  );
}

/** Type a time to jump there, e.g. to find a moment someone mentioned. */
function GoToTime({ onGo }: { onGo: (seconds: number) => void }) {
  const id = useId();
  const [text, setText] = useState('');
  const [problem, setProblem] = useState<string | null>(null);
  return (
    <form
      aria-label="Go to a time"
      className="text-sm"
      onSubmit={(e) => {
        e.preventDefault();
        const seconds = parseClipTime(text);
        if (seconds === null) {
          setProblem('Write seconds (1.5) or minutes and seconds (1:05.3).');
          return;
        }
        setProblem(null);
        onGo(seconds);
      }}
    >
      <label htmlFor={id} className="block font-semibold">
        Go to (seconds, or m:ss.s)
      </label>
      <div className="mt-1 flex flex-wrap gap-2">
        <input
          id={id}
          inputMode="decimal"
          value={text}
          onChange={(e) => setText(e.currentTarget.value)}
          aria-invalid={problem ? true : undefined}
          aria-describedby={problem ? `${id}-problem` : undefined}
          className="block min-h-10 w-32 rounded-md border border-rule-strong bg-sheet px-3 tabular-nums"
        />
        <Button type="submit" variant="secondary">
          Go
        </Button>
      </div>
      {problem && (
        <p id={`${id}-problem`} className="mt-1 font-semibold text-line-deep">
          {problem}
        </p>
      )}
    </form>
  );
}
