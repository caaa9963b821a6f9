/**
 * Letter PDF render time: the clearance letter (templates/letter/clearance-letter.ts, pdfkit with
 * Public Sans) rendered from its sample data, one after another. Target: under 100 ms. The first
 * render (fonts read and parsed) is reported apart from the rest. Reported in the README; never asserted.
 */
import { renderLetterPdf, SAMPLE_LETTER } from '../templates/letter/clearance-letter';

const runs = Number(process.env.BENCH_RUNS ?? 50);
let t = performance.now();
const first = await renderLetterPdf(SAMPLE_LETTER);
const firstMs = performance.now() - t;
const times: number[] = [];
for (let i = 0; i < runs; i++) {
  t = performance.now();
  await renderLetterPdf(SAMPLE_LETTER);
  times.push(performance.now() - t);
}
times.sort((a, b) => a - b);
const at = (q: number) => times[Math.min(times.length - 1, Math.floor(q * times.length))].toFixed(1);
console.log(
  `letter PDF (${(first.length / 1024).toFixed(0)} kB): first ${firstMs.toFixed(1)} ms; then ${runs} renders: ` +
    `min ${times[0].toFixed(1)} ms, median ${at(0.5)} ms, p95 ${at(0.95)} ms, max ${times.at(-1)!.toFixed(1)} ms`,
);
