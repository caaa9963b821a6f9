/** `npm run bench`: the engine timings, the team fitting beside the engine, the letter PDF, e-mail throughput, the HTTP benchmark, then the first load in a browser. */
import { spawnSync } from 'node:child_process';

for (const file of [
  'bench/engine.ts',
  'bench/team-fit.ts',
  'bench/letter-pdf.ts',
  'bench/mail.ts',
  'bench/http.ts',
  'bench/first-load.ts',
]) {
  console.log(`\n=== ${file} ===`);
  const r = spawnSync('node', ['--import', 'tsx', file], { stdio: 'inherit' });
  if (r.status !== 0) process.exit(r.status ?? 1);
}
