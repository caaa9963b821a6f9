import { useId, type KeyboardEvent } from 'react';
import { BODY_REGIONS, BODY_REGION_LABELS, type BodyRegion } from '../../../../../policies/body-regions';
import { fieldSentence } from '../../../lib/form-errors';
import { cx } from '../../../components/ui/cx';

/**
 * Our own figure: a stack of rounded blocks, one per body region, drawn on a 100 × 232 grid. Paired
 * parts are given for the side drawn on the viewer's left and mirrored for the other side.
 */
interface Block {
  x: number;
  y: number;
  w: number;
  h: number;
  r: number;
}

const mirror = (b: Block): Block => ({ ...b, x: 100 - b.x - b.w });

const CENTRE = {
  head: { x: 38, y: 4, w: 24, h: 24, r: 12 },
  neck: { x: 44, y: 29, w: 12, h: 9, r: 3 },
  chest: { x: 33, y: 39, w: 34, h: 32, r: 5 },
  belly: { x: 35, y: 73, w: 30, h: 26, r: 5 },
} satisfies Record<string, Block>;

/** Paired parts, drawn on the viewer's left. */
const SIDE = {
  shoulder: { x: 15, y: 38, w: 17, h: 15, r: 7 },
  upperArm: { x: 13, y: 55, w: 13, h: 17, r: 5 },
  elbow: { x: 10, y: 74, w: 16, h: 15, r: 7 },
  forearm: { x: 8, y: 91, w: 15, h: 19, r: 5 },
  wrist_hand: { x: 5, y: 112, w: 18, h: 20, r: 8 },
  hip_groin: { x: 33, y: 101, w: 16, h: 17, r: 5 },
  thigh: { x: 33, y: 120, w: 16, h: 37, r: 6 },
  knee: { x: 33, y: 159, w: 16, h: 16, r: 7 },
  lower_leg: { x: 34, y: 177, w: 15, h: 32, r: 6 },
  ankle_foot: { x: 31, y: 211, w: 18, h: 16, r: 6 },
} satisfies Record<string, Block>;

const PAIRED_PARTS = ['shoulder', 'elbow', 'wrist_hand', 'hip_groin', 'thigh', 'knee', 'lower_leg', 'ankle_foot'] as const;
const DECOR_PARTS = ['upperArm', 'forearm'] as const;

type View = 'front' | 'back';

interface Placed {
  region: BodyRegion;
  block: Block;
  /** The one copy each region has in the accessibility tree and the tab order; the rest are for pointers. */
  primary: boolean;
}

/**
 * On the front, the athlete's right side is on the viewer's left; on the back, their left is. Every
 * region is a button once (on the front, except the back itself); the back view repeats the limbs so
 * a tap on the back of a thigh works too, without a second button of the same name.
 */
function placed(view: View): Placed[] {
  const onViewerLeft = view === 'front' ? 'right' : 'left';
  const onViewerRight = view === 'front' ? 'left' : 'right';
  const front = view === 'front';
  const list: Placed[] = [
    { region: 'head', block: CENTRE.head, primary: front },
    { region: 'neck', block: CENTRE.neck, primary: front },
    { region: front ? 'chest_ribs' : 'upper_back', block: CENTRE.chest, primary: true },
    { region: front ? 'abdomen' : 'lower_back', block: CENTRE.belly, primary: true },
  ];
  for (const part of PAIRED_PARTS) {
    list.push({ region: `${part}_${onViewerLeft}` as BodyRegion, block: SIDE[part], primary: front });
    list.push({ region: `${part}_${onViewerRight}` as BodyRegion, block: mirror(SIDE[part]), primary: front });
  }
  return list;
}

function Figure({
  view,
  selected,
  onToggle,
  invalid,
}: {
  view: View;
  selected: readonly BodyRegion[];
  onToggle: (region: BodyRegion) => void;
  invalid: boolean;
}) {
  const titleId = useId();
  const onKey = (e: KeyboardEvent, region: BodyRegion) => {
    if (e.key === 'Enter' || e.key === ' ') {
      e.preventDefault();
      onToggle(region);
    }
  };
  return (
    <figure className="m-0 min-w-0">
      <figcaption id={titleId} className="text-center text-sm font-semibold">
        {view === 'front' ? 'Front' : 'Back'}
      </figcaption>
      <svg
        viewBox="0 0 100 240"
        className="mx-auto block h-auto w-full max-w-[11rem] touch-manipulation"
        aria-labelledby={titleId}
        role="group"
      >
        {DECOR_PARTS.flatMap((part) => [SIDE[part], mirror(SIDE[part])]).map((b, i) => (
          <rect
            key={i}
            x={b.x}
            y={b.y}
            width={b.w}
            height={b.h}
            rx={b.r}
            className="fill-shade stroke-rule-strong"
            strokeWidth={1}
            aria-hidden="true"
          />
        ))}
        {placed(view).map(({ region, block: b, primary }) => {
          const on = selected.includes(region);
          const common = {
            x: b.x,
            y: b.y,
            width: b.w,
            height: b.h,
            rx: b.r,
            strokeWidth: on ? 2 : 1.2,
            onClick: () => onToggle(region),
            'data-region': region,
            className: cx(
              'cursor-pointer outline-none transition-colors',
              on ? 'fill-ink stroke-ink' : cx('fill-sheet hover:fill-shade', invalid ? 'stroke-line-deep' : 'stroke-ink-2'),
              'focus-visible:stroke-line focus-visible:[stroke-width:3.5]',
            ),
          };
          return primary ? (
            <rect
              key={region}
              {...common}
              role="button"
              tabIndex={0}
              aria-pressed={on}
              aria-label={BODY_REGION_LABELS[region]}
              onKeyDown={(e) => onKey(e, region)}
            />
          ) : (
            <rect key={region} {...common} aria-hidden="true" />
          );
        })}
        <g aria-hidden="true" className="fill-muted text-[9px] font-semibold">
          <text x="4" y="238">
            {view === 'front' ? 'R' : 'L'}
          </text>
          <text x="96" y="238" textAnchor="end">
            {view === 'front' ? 'L' : 'R'}
          </text>
        </g>
      </svg>
    </figure>
  );
}

/** The list, in the order people think of it: trunk and head first, then limbs left before right. */
const LIST_ORDER: BodyRegion[] = [
  ...BODY_REGIONS.filter((r) => !r.endsWith('_left') && !r.endsWith('_right')),
  ...BODY_REGIONS.filter((r) => r.endsWith('_left') || r.endsWith('_right')),
];

/**
 * "Where does it hurt?": two tappable pictures (front and back) and, for anyone who prefers it, the
 * same places as a list of tick boxes. Both edit one value.
 */
export function BodyMap({
  value,
  onChange,
  error,
  legend = 'Where does it hurt?',
}: {
  value: readonly BodyRegion[];
  onChange: (next: BodyRegion[]) => void;
  error?: string;
  legend?: string;
}) {
  const id = useId();
  const message = fieldSentence(legend, error);
  const set = (region: BodyRegion, on: boolean) => onChange(BODY_REGIONS.filter((r) => (r === region ? on : value.includes(r))));
  const toggle = (region: BodyRegion) => set(region, !value.includes(region));
  const chosen = BODY_REGIONS.filter((r) => value.includes(r));

  return (
    <div role="group" aria-labelledby={`${id}-legend`} aria-describedby={[`${id}-hint`, message ? `${id}-error` : ''].join(' ').trim()}>
      <p id={`${id}-legend`} className="text-base font-semibold">
        {legend}
      </p>
      <p id={`${id}-hint`} className="text-sm text-muted">
        Tap each place that hurts; tap again to undo. R and L are your right and left.
      </p>
      <div className="mt-2 grid grid-cols-2 gap-3 rounded-lg border border-rule bg-paper p-2">
        <Figure view="front" selected={value} onToggle={toggle} invalid={!!message} />
        <Figure view="back" selected={value} onToggle={toggle} invalid={!!message} />
      </div>
      <p aria-live="polite" className="mt-2 text-sm">
        <span className="font-semibold">Chosen: </span>
        {chosen.length ? chosen.map((r) => BODY_REGION_LABELS[r]).join(', ') : 'nothing yet'}
      </p>
      {message && (
        <p id={`${id}-error`} className="mt-1 flex items-start gap-1.5 text-sm font-semibold text-line-deep">
          <span aria-hidden="true">▲</span>
          <span>{message}</span>
        </p>
      )}
      <fieldset className="mt-3 min-w-0">
        <legend className="text-sm font-semibold">The same places as a list</legend>
        <ul className="mt-1 grid grid-cols-1 gap-x-4 min-[360px]:grid-cols-2">
          {LIST_ORDER.map((region) => (
            <li key={region}>
              <label className="flex min-h-11 cursor-pointer items-center gap-2 text-sm">
                <input
                  type="checkbox"
                  className="size-5 shrink-0 accent-ink"
                  checked={value.includes(region)}
                  onChange={(e) => set(region, e.target.checked)}
                />
                {BODY_REGION_LABELS[region]}
              </label>
            </li>
          ))}
        </ul>
      </fieldset>
    </div>
  );
}
