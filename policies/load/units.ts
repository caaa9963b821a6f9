import type { Unit } from '../schemas/common';
import { isFiniteNumber } from './guard';

/** 1 lb = 0.45359237 kg exactly (NIST SP 811). */
export const KG_PER_LB = 0.45359237;

/*
 * The conversions are plain arithmetic that other code (form parsing) feeds with whatever was typed:
 * a value that is not a number stays not a number (NaN in, NaN out, never a plausible 0) and an
 * unknown unit gives NaN, so the schemas refuse it and formatLoad says it in words.
 */
export const lbToKg = (lb: number) => lb * KG_PER_LB;
export const kgToLb = (kg: number) => kg / KG_PER_LB;

export function toUnit(kg: number, unit: Unit): number {
  return unit === 'kg' ? kg : unit === 'lb' ? kgToLb(kg) : Number.NaN;
}

export function fromUnit(value: number, unit: Unit): number {
  return unit === 'kg' ? value : unit === 'lb' ? lbToKg(value) : Number.NaN;
}

/** What formatLoad says for a load that cannot be shown (not a finite number, or an unknown unit). */
export const UNKNOWN_LOAD = 'an unknown load';

/**
 * A load for display: up to 2 decimals, trailing zeros dropped, with its unit. A cap is rounded down
 * so the number shown never exceeds the true limit (under a cap, round down, never to nearest).
 */
export function formatLoad(kg: number, unit: Unit, rounding: 'nearest' | 'down' = 'nearest'): string {
  const v = toUnit(kg, unit);
  if (!isFiniteNumber(v)) return UNKNOWN_LOAD;
  const shown = rounding === 'down' ? Math.floor(v * 100 + 1e-9) / 100 : Number(v.toFixed(2));
  return `${shown} ${unit}`;
}
