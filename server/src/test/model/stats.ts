/**
 * With MODEL_STATS set, how often each kind of step ended each way (and how many holds the
 * invariant saw), printed after the runs: to see what the generators actually reach.
 */
const counts = new Map<string, number>();

export function count(key: string): void {
  if (process.env.MODEL_STATS) counts.set(key, (counts.get(key) ?? 0) + 1);
}

export function printStats(): void {
  if (process.env.MODEL_STATS) console.log([...counts].sort(([a], [b]) => (a < b ? -1 : 1)));
}
