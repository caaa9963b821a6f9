/** JSON with object keys sorted at every level, so equal values always give equal text (and hashes). */
export function canonicalJson(value: unknown): string {
  if (value === null || typeof value !== 'object') return JSON.stringify(value ?? null);
  if (Array.isArray(value)) return `[${value.map(canonicalJson).join(',')}]`;
  const entries = Object.entries(value as Record<string, unknown>)
    .filter(([, v]) => v !== undefined)
    .sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
  return `{${entries.map(([k, v]) => `${JSON.stringify(k)}:${canonicalJson(v)}`).join(',')}}`;
}

/** Plain JSON data (dates as ISO strings), the same shape PostgreSQL's jsonb will hand back. */
export function toPlainJson<T>(value: T): unknown {
  return value === undefined ? null : JSON.parse(JSON.stringify(value));
}
