import { useId } from 'react';
import { BODY_REGIONS, BODY_REGION_LABELS, type BodyRegion } from '../../../../../policies/body-regions';
import { fieldSentence } from '../../../lib/form-errors';
import { cx } from '../../../components/ui/cx';

const SIDES = ['left', 'right'] as const;
const CENTRAL = BODY_REGIONS.filter((r) => !r.endsWith('_left') && !r.endsWith('_right'));
/** Paired regions share a row: the row is the part, the two columns the sides. */
const PAIRED = BODY_REGIONS.filter((r) => r.endsWith('_left')).map((r) => r.slice(0, -'_left'.length));

function partName(base: string): string {
  const words = BODY_REGION_LABELS[`${base}_left` as BodyRegion].replace(/^Left /, '');
  return words.charAt(0).toUpperCase() + words.slice(1);
}

const BOX = 'size-5 shrink-0 accent-ink';

/**
 * A compact grid of body regions: trunk and head as a short list, limbs as rows with a left and a
 * right column, so a clinician can tick "right knee" without reading 22 labels.
 */
export function BodyRegionPicker({
  value,
  onChange,
  onBlur,
  error,
  legend = 'Body regions',
}: {
  value: readonly BodyRegion[];
  onChange: (next: BodyRegion[]) => void;
  onBlur?: () => void;
  error?: string;
  legend?: string;
}) {
  const set = (region: BodyRegion, on: boolean) => onChange(BODY_REGIONS.filter((r) => (r === region ? on : value.includes(r))));
  const message = fieldSentence(legend, error);
  const errorId = useId();

  return (
    <fieldset className="min-w-0" aria-describedby={message ? errorId : undefined}>
      <legend className="text-sm font-semibold">{legend}</legend>
      <div
        className={cx(
          'mt-1 grid gap-x-6 gap-y-2 rounded-md border p-3 sm:w-fit sm:grid-cols-[auto_auto]',
          error ? 'border-line-deep' : 'border-rule',
        )}
      >
        <ul className="grid grid-cols-2 content-start gap-x-4 gap-y-1 sm:grid-cols-1">
          {CENTRAL.map((region) => (
            <li key={region}>
              <label className="flex min-h-8 items-center gap-2 text-sm">
                <input
                  type="checkbox"
                  className={BOX}
                  checked={value.includes(region)}
                  onChange={(e) => set(region, e.target.checked)}
                  onBlur={onBlur}
                />
                {BODY_REGION_LABELS[region]}
              </label>
            </li>
          ))}
        </ul>
        <table className="w-full border-collapse text-sm sm:w-72">
          <thead>
            <tr className="text-left text-muted">
              <th scope="col" className="py-1 pr-2 font-semibold">
                <span className="sr-only">Part</span>
              </th>
              <th scope="col" className="w-16 py-1 text-center font-semibold">
                Left
              </th>
              <th scope="col" className="w-16 py-1 text-center font-semibold">
                Right
              </th>
            </tr>
          </thead>
          <tbody>
            {PAIRED.map((base) => (
              <tr key={base} className="border-t border-rule">
                <th scope="row" className="py-0.5 pr-2 text-left font-normal">
                  {partName(base)}
                </th>
                {SIDES.map((side) => {
                  const region = `${base}_${side}` as BodyRegion;
                  return (
                    <td key={side} className="p-0 text-center">
                      <label className="flex min-h-9 cursor-pointer items-center justify-center">
                        <input
                          type="checkbox"
                          className={BOX}
                          checked={value.includes(region)}
                          onChange={(e) => set(region, e.target.checked)}
                          onBlur={onBlur}
                        />
                        <span className="sr-only">{BODY_REGION_LABELS[region]}</span>
                      </label>
                    </td>
                  );
                })}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      {message && (
        <p id={errorId} className="mt-1 flex items-start gap-1.5 text-sm font-semibold text-line-deep">
          <span aria-hidden="true">▲</span>
          <span>{message}</span>
        </p>
      )}
    </fieldset>
  );
}
