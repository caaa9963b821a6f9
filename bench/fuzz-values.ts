/**
 * Near-valid input for the fuzz: a value that a route's own zod schema would accept (as far as its
 * shape goes; cross-field refinements are not solved), so that one edge value put into it reaches
 * the handler, the command and the database rather than stopping at validation.
 */
import { z } from 'zod';

export interface ValueSource {
  rand: () => number;
  /** A real id of the organization. */
  id: () => string;
}

const pickOf = <T>(src: ValueSource, xs: readonly T[]): T => xs[Math.floor(src.rand() * xs.length)];

function dateIn(src: ValueSource): string {
  const day = new Date(Date.UTC(2026, 0, 1) + Math.floor((src.rand() - 0.5) * 400) * 86_400_000);
  return day.toISOString().slice(0, 10);
}

/** A value of the schema's shape, or undefined when it cannot tell (an optional field is then left out). */
export function sampleOf(schema: z.ZodType, src: ValueSource, depth = 0): unknown {
  const def = (schema as unknown as { def: { type: string } & Record<string, unknown> }).def;
  if (depth > 12) return undefined;
  switch (def.type) {
    case 'object': {
      const out: Record<string, unknown> = {};
      for (const [k, v] of Object.entries((schema as z.ZodObject).shape)) {
        const optional = (v as z.ZodType).def.type === 'optional';
        if (optional && src.rand() < 0.4) continue;
        const val = k === 'timeZone' ? 'America/Chicago' : sampleOf(v as z.ZodType, src, depth + 1);
        if (val !== undefined) out[k] = val;
      }
      return out;
    }
    case 'optional':
    case 'nullable':
    case 'default':
    case 'prefault':
    case 'readonly':
    case 'catch':
      return sampleOf(def.innerType as z.ZodType, src, depth + 1);
    case 'pipe': {
      // An e-mail is a trimmed string piped into z.email(): the far end knows the format.
      const out = def.out as z.ZodType;
      const formatted = out.def.type === 'string' && (out as z.ZodString).format;
      return sampleOf(formatted ? out : (def.in as z.ZodType), src, depth + 1);
    }
    case 'string': {
      const s = schema as z.ZodString;
      if (s.format === 'uuid') return src.id();
      if (s.format === 'date') return dateIn(src);
      if (s.format === 'email') return `fuzz+${Math.floor(src.rand() * 1e6)}@test.example`;
      const min = s.minLength ?? 0;
      const max = s.maxLength ?? 40;
      const text = 'Fuzz text for a field';
      return text.padEnd(min, 'x').slice(0, Math.max(min, Math.min(max, text.length)));
    }
    case 'number': {
      const n = schema as z.ZodNumber;
      const lo = Number.isFinite(n.minValue) ? (n.minValue as number) : 0;
      const hi = Number.isFinite(n.maxValue) ? (n.maxValue as number) : lo + 10;
      // The least value half the time: a version of 1 (the demo's rows) or the smallest count.
      if (src.rand() < 0.5) return lo;
      const v = lo + Math.floor(src.rand() * (Math.min(hi, lo + 20) - lo + 1));
      return Math.max(lo, Math.min(hi, v));
    }
    case 'boolean':
      return src.rand() < 0.5;
    case 'enum':
      return pickOf(src, Object.values(def.entries as Record<string, string>));
    case 'literal':
      return (def.values as unknown[])[0];
    case 'array': {
      const a = schema as z.ZodArray<z.ZodType>;
      const min = (a.def.checks ?? []).map((c) => (c._zod.def as { minimum?: number }).minimum).find((m) => m !== undefined) ?? 0;
      const n = Math.max(min, Math.floor(src.rand() * 3));
      return Array.from({ length: n }, () => sampleOf(a.element, src, depth + 1)).filter((v) => v !== undefined);
    }
    case 'union':
      return sampleOf(pickOf(src, def.options as z.ZodType[]), src, depth + 1);
    case 'record': {
      const keyType = def.keyType as z.ZodType;
      if (keyType.def.type !== 'enum') return {};
      const key = sampleOf(keyType, src, depth + 1) as string;
      return { [key]: sampleOf(def.valueType as z.ZodType, src, depth + 1) };
    }
    default:
      return undefined;
  }
}

/** Every path to a leaf of a sampled value, so one of them can be replaced by an edge value. */
export function leafPaths(value: unknown, prefix: (string | number)[] = []): (string | number)[][] {
  if (value && typeof value === 'object') {
    const entries = Array.isArray(value) ? value.map((v, i) => [i, v] as const) : Object.entries(value);
    const paths = entries.flatMap(([k, v]) => leafPaths(v, [...prefix, k]));
    return paths.length ? paths : [prefix];
  }
  return [prefix];
}

/** `value` with the leaf at `path` replaced (a copy). */
export function replaceAt(value: unknown, path: (string | number)[], by: unknown): unknown {
  if (path.length === 0) return by;
  const copy = Array.isArray(value) ? [...value] : { ...(value as Record<string, unknown>) };
  const [head, ...rest] = path;
  (copy as Record<string | number, unknown>)[head] = replaceAt((value as Record<string | number, unknown>)[head], rest, by);
  return copy;
}
