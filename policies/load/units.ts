import type { Unit } from '../schemas/common';

/** 1 lb = 0.45359237 kg exactly (NIST SP 811). */
export const KG_PER_LB = 0.45359237;

export const lbToKg = (lb: number) => lb * KG_PER_LB;
export const kgToLb = (kg: number) => kg / KG_PER_LB;

export function toUnit(kg: number, unit: Unit): number {
  return unit === 'kg' ? kg : kgToLb(kg);
}

export function fromUnit(value: number, unit: Unit): number {
  return unit === 'kg' ? value : lbToKg(value);
}

/**
 * A load for display: up to 2 decimals, trailing zeros dropped, with its unit. A cap is rounded down
 * so the number shown never exceeds the true limit (under a cap, round down, never to nearest).
 */
export function formatLoad(kg: number, unit: Unit, rounding: 'nearest' | 'down' = 'nearest'): string {
  const v = toUnit(kg, unit);
  const shown = rounding === 'down' ? Math.floor(v * 100 + 1e-9) / 100 : Number(v.toFixed(2));
  return `${shown} ${unit}`;
}
