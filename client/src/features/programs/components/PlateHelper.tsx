import { platesPerSide } from '../../../../../policies/load/plates';
import { toUnit } from '../../../../../policies/load/units';
import type { Unit } from '../../../../../policies/schemas';

const n = (v: number) => String(Number(v.toFixed(2)));

/**
 * What to put on each side of the bar for a load, in the lifter's own plates: kg plates on a 20 kg
 * bar for kg users, lb plates on a 45 lb bar for lb users. No collars counted. A load the helper
 * cannot read (not a number, over 1000 kg) gets a sentence, never NaN.
 */
export function PlateHelper({ loadKg, unit }: { loadKg: number; unit: Unit }) {
  const target = toUnit(loadKg, unit);
  const loading = platesPerSide(target, unit);
  if (!loading) return <p className="text-sm text-ink-2">The plates for this load cannot be worked out: check the planned load.</p>;
  if (target < loading.bar)
    return (
      <p className="text-sm text-ink-2">
        Lighter than the {n(loading.bar)} {unit} bar: use a lighter bar or dumbbells.
      </p>
    );
  return (
    <p className="text-sm tabular-nums">
      <span className="text-ink-2">
        On a {n(loading.bar)} {unit} bar, each side:{' '}
      </span>
      <span className="font-semibold">{loading.perSide.length ? `${loading.perSide.map(n).join(' + ')} ${unit}` : 'no plates'}</span>
      {loading.shortBy > 0 && (
        <span className="block text-ink-2">
          Plates make {n(loading.total)} {unit}, {n(loading.shortBy)} {unit} under the plan — closest without going over.
        </span>
      )}
    </p>
  );
}
