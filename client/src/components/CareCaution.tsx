import { STANDING_CAUTION } from '../../../policies/cautions';

/** The standing caution, on every page. Short, in plain words, never behind a click. */
export function CareCaution() {
  return <p className="text-xs text-ink-2">{STANDING_CAUTION}</p>;
}
