/**
 * First-load benchmark (targets: ≤ 170 kB of JavaScript gzipped before usable; LCP within 2× a static page
 * and under 2.5 s, Core Web Vitals): builds the client, serves it from the real server on the demo, and in
 * headless Chromium (Debian's, as the browser tests use) with a slow mobile profile — about 150 ms round
 * trip, 1.6 Mbps down, 750 kbps up (CDP Network.emulateNetworkConditions) and the CPU slowed 4×
 * (Emulation.setCPUThrottlingRate) — reports for the sign-in page and the demo athlete's home:
 *
 * - the JavaScript loaded before the screen is usable (its heading shown: the router renders a screen
 *   only once its code is in), as gzip -9 of each file and as the bytes that crossed the wire;
 * - Largest Contentful Paint, the median of several cold loads (a fresh browser context each time),
 *   side by side with a minimal static page served by the same server under the same profile (the
 *   practical floor: one HTML file and nothing else).
 *
 * Reported in the README; never asserted. FIRST_LOAD_RUNS sets the number of runs (default 5);
 * FIRST_LOAD_WATERFALL=1 also prints, for the first run of each page, every request with when it started
 * and ended (ms from the navigation), the way to see which round trip waits on which.
 */
import { mkdtemp, rm, unlink, writeFile } from 'node:fs/promises';
import { readFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import zlib from 'node:zlib';
import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core';
import { loadConfig } from '../server/src/config';
import { createLogger } from '../server/src/logger';
import { startServer } from '../server/src/server';
import { createDataSource } from '../server/src/data-source';
import { createStorage } from '../server/src/storage';
import { DEMO_PASSWORD, DEMO_PEOPLE, loadDemo } from '../server/src/seed/demo';
import { ROOT, buildClient, migrate, openDatabase } from '../scripts/runtime';

const RUNS = Number(process.env.FIRST_LOAD_RUNS ?? 5);
const WATERFALL = process.env.FIRST_LOAD_WATERFALL === '1';
const DIST = path.join(ROOT, 'client', 'dist');
const FLOOR = 'bench-floor.html';
/** The slow mobile profile the first-load targets are set against (bytes per second for CDP). */
const NETWORK = { offline: false, latency: 150, downloadThroughput: 1_600_000 / 8, uploadThroughput: 750_000 / 8 };
const CPU_SLOWDOWN = 4;
const PHONE = { viewport: { width: 390, height: 844 }, deviceScaleFactor: 2, isMobile: true, hasTouch: true };

/** The floor: what a page with no script at all costs on this server and profile. */
const FLOOR_PAGE = `<!doctype html>
<html lang="en"><head><meta charset="UTF-8"><meta name="viewport" content="width=device-width, initial-scale=1.0">
<title>Floor</title></head>
<body><main><h1>My profile</h1><p>A page with no script, no style sheet and no font: one HTML file, the least any page costs to show.</p></main></body></html>
`;

// Collects the largest-contentful-paint entries from the start of the page; the last one is the LCP.
// The element is kept as its tag and the start of its text, to say in the waterfall what the LCP was.
const LCP_OBSERVER = `
  window.__lcp = 0;
  window.__lcpElement = '';
  new PerformanceObserver((list) => {
    for (const entry of list.getEntries()) {
      window.__lcp = entry.startTime;
      const el = entry.element;
      window.__lcpElement = el ? el.tagName.toLowerCase() + ' "' + (el.textContent || '').trim().slice(0, 50) + '" (' + entry.size + ' px²)' : '';
    }
  }).observe({ type: 'largest-contentful-paint', buffered: true });
`;

interface Load {
  lcp: number;
  scripts: string[];
  wireBytes: number;
  /** When the screen was usable, and each request's start and end, in ms from the navigation. */
  usableAt: number;
  lcpElement: string;
  requests: { path: string; type: string; start: number; end: number }[];
}

const gzipCache = new Map<string, number>();
function gzippedSize(urlPath: string): number {
  let size = gzipCache.get(urlPath);
  if (size === undefined) {
    size = zlib.gzipSync(readFileSync(path.join(DIST, urlPath)), { level: 9 }).length;
    gzipCache.set(urlPath, size);
  }
  return size;
}

async function throttle(context: BrowserContext, page: Page): Promise<void> {
  const cdp = await context.newCDPSession(page);
  await cdp.send('Network.enable');
  await cdp.send('Network.emulateNetworkConditions', NETWORK);
  await cdp.send('Emulation.setCPUThrottlingRate', { rate: CPU_SLOWDOWN });
}

/** One cold load of `urlPath` under the profile, until `ready` is visible, then the LCP so far. */
async function coldLoad(context: BrowserContext, urlPath: string, ready: (page: Page) => Promise<void>): Promise<Load> {
  const page = await context.newPage();
  await page.addInitScript(LCP_OBSERVER);
  await throttle(context, page);
  const scripts: string[] = [];
  let wireBytes = 0;
  const pending: Promise<void>[] = [];
  const requests: Load['requests'] = [];
  const started = new Map<object, number>();
  let t0 = 0;
  const now = () => performance.now() - t0;
  page.on('request', (request) => started.set(request, now()));
  page.on('requestfinished', (request) => {
    const { pathname } = new URL(request.url());
    requests.push({ path: pathname, type: request.resourceType(), start: started.get(request) ?? 0, end: now() });
    if (request.resourceType() !== 'script') return;
    scripts.push(new URL(request.url()).pathname);
    pending.push(
      request.sizes().then((s) => {
        wireBytes += s.responseBodySize;
      }),
    );
  });
  t0 = performance.now();
  await page.goto(urlPath, { waitUntil: 'commit' });
  await ready(page);
  const usableAt = now();
  // The screen is usable: what was fetched so far is what it needed. Let late paints settle before
  // reading the LCP (a later, larger paint would replace the candidate).
  const usable = [...scripts];
  await page.waitForLoadState('networkidle');
  await page.waitForTimeout(500);
  const { lcp, lcpElement } = await page.evaluate(() => {
    const w = window as unknown as { __lcp: number; __lcpElement: string };
    return { lcp: w.__lcp, lcpElement: w.__lcpElement };
  });
  await Promise.all(pending);
  await page.close();
  return { lcp, lcpElement, scripts: usable, wireBytes, usableAt, requests };
}

async function signInByApi(context: BrowserContext, base: string, email: string): Promise<void> {
  const session = await context.request.get(`${base}/api/session`);
  const { csrfToken } = (await session.json()) as { csrfToken: string };
  const res = await context.request.post(`${base}/api/session`, {
    headers: { 'x-csrf-token': csrfToken },
    data: { email, password: DEMO_PASSWORD },
  });
  if (res.status() !== 200) throw new Error(`sign-in failed for ${email}: ${res.status()}`);
}

const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  const mid = Math.floor(s.length / 2);
  return s.length % 2 ? s[mid] : (s[mid - 1] + s[mid]) / 2;
};
const kB = (bytes: number) => (bytes / 1000).toFixed(1);

async function measure(browser: Browser, base: string) {
  const athleteEmail = DEMO_PEOPLE.find((p) => p.key === 'maya')!.email;
  const newContext = () => browser.newContext({ ...PHONE, baseURL: base });
  const results: Record<'signIn' | 'athlete' | 'floor', Load[]> = { signIn: [], athlete: [], floor: [] };
  for (let run = 1; run <= RUNS; run++) {
    // Interleaved, so a slow moment of this shared machine falls on all three alike.
    let context = await newContext();
    results.floor.push(
      await coldLoad(context, `/${FLOOR}`, (page) => page.getByRole('heading', { name: 'My profile' }).waitFor({ timeout: 60_000 })),
    );
    await context.close();

    context = await newContext();
    results.signIn.push(
      await coldLoad(context, '/sign-in', (page) =>
        page.getByRole('heading', { name: 'Sign in to Loadline' }).waitFor({ timeout: 60_000 }),
      ),
    );
    await context.close();

    // Signed in first, at full speed (the session cookie only; the browser's cache stays empty).
    context = await newContext();
    await signInByApi(context, base, athleteEmail);
    results.athlete.push(
      await coldLoad(context, '/', (page) => page.getByRole('heading', { level: 1, name: 'My profile' }).waitFor({ timeout: 60_000 })),
    );
    await context.close();
    console.log(
      `[first-load] run ${run}/${RUNS}: LCP floor ${results.floor.at(-1)!.lcp.toFixed(0)} ms, sign-in ${results.signIn.at(-1)!.lcp.toFixed(0)} ms, athlete's home ${results.athlete.at(-1)!.lcp.toFixed(0)} ms`,
    );
  }
  return results;
}

function waterfall(name: string, load: Load) {
  console.log(
    `\nRequests of the ${name}, first run (ms from the navigation; usable at ${load.usableAt.toFixed(0)}, LCP ${load.lcp.toFixed(0)}: ${load.lcpElement}):`,
  );
  for (const r of [...load.requests].sort((a, b) => a.start - b.start)) {
    console.log(`${r.start.toFixed(0).padStart(6)} → ${r.end.toFixed(0).padStart(6)}  ${r.type.padEnd(10)} ${r.path}`);
  }
}

function report(results: Record<'signIn' | 'athlete' | 'floor', Load[]>) {
  const floorLcp = median(results.floor.map((l) => l.lcp));
  const row = (name: string, loads: Load[]) => {
    // The files are the same on every run; the first run's list stands for all.
    const scripts = loads[0].scripts;
    const gz = scripts.reduce((sum, s) => sum + gzippedSize(s), 0);
    const wire = median(loads.map((l) => l.wireBytes));
    const lcp = median(loads.map((l) => l.lcp));
    return `| ${name} | ${scripts.length} | ${kB(gz)} | ${kB(wire)} | ${lcp.toFixed(0)} | ${(lcp / floorLcp).toFixed(2)} |`;
  };
  console.log(
    `\nFirst load, ${RUNS} cold runs each (median), ${NETWORK.latency} ms RTT, 1.6 Mbps down, 750 kbps up, CPU ${CPU_SLOWDOWN}× slower, 390 px phone:\n`,
  );
  console.log('| page | JS files before usable | JS gzip -9 kB | JS on the wire kB | LCP ms | LCP ÷ floor |');
  console.log('| --- | --- | --- | --- | --- | --- |');
  console.log(row('sign-in page', results.signIn));
  console.log(row("athlete's home (demo athlete)", results.athlete));
  console.log(`| floor: static page, same server | 0 | 0 | 0 | ${floorLcp.toFixed(0)} | 1.00 |`);
  for (const [name, loads] of [
    ['sign-in page', results.signIn],
    ["athlete's home", results.athlete],
  ] as const) {
    const largest = [...loads[0].scripts].sort((a, b) => gzippedSize(b) - gzippedSize(a)).slice(0, 5);
    if (WATERFALL) waterfall(name, loads[0]);
    console.log(
      `\nLargest JS before the ${name} is usable: ${largest.map((s) => `${path.basename(s)} ${kB(gzippedSize(s))} kB`).join(', ')}`,
    );
  }
}

async function main() {
  const db = await openDatabase('loadline_bench_first_load', true);
  const storageDir = await mkdtemp(path.join(os.tmpdir(), 'loadline-bench-uploads-'));
  let browser: Browser | null = null;
  let server: Awaited<ReturnType<typeof startServer>> | null = null;
  try {
    await migrate(db.ownerUrl, db.url);
    const config = loadConfig({
      DATABASE_URL: db.url,
      SESSION_SECRET: 'bench-secret-bench-secret-bench-secret-42',
      PORT: '0',
      LOG_LEVEL: 'silent',
      STORAGE_DIR: storageDir,
    });
    const seed = createDataSource(db.url, 2);
    await seed.initialize();
    console.log('[first-load] loading the demo…');
    await loadDemo(seed, { config, storage: createStorage(config), mail: false });
    await seed.destroy();
    console.log('[first-load] building the client…');
    await buildClient();
    await writeFile(path.join(DIST, FLOOR), FLOOR_PAGE);
    server = await startServer(config, createLogger('silent'));
    browser = await chromium.launch({
      executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
      args: ['--no-sandbox', '--disable-gpu', '--disable-dev-shm-usage', '--disable-quic', '--no-first-run'],
    });
    report(await measure(browser, server.url));
  } finally {
    await browser?.close();
    await server?.stop();
    await unlink(path.join(DIST, FLOOR)).catch(() => undefined);
    await rm(storageDir, { recursive: true, force: true });
    db.cluster?.stop();
  }
}

await main();
