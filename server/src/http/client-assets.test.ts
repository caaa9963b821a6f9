import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import os from 'node:os';
import path from 'node:path';
import zlib from 'node:zlib';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { useHarness } from '../test/harness';

// A built client of our own: a page that names a hashed script, and a plain file beside the page.
const dist = mkdtempSync(path.join(os.tmpdir(), 'loadline-client-dist-'));
const page = `<!doctype html><html><head><script type="module" src="/assets/index-Ab12Cd34.js"></script></head><body>${'<p>Loadline</p>'.repeat(200)}</body></html>`;
const script = `export const screens = ${JSON.stringify(Array.from({ length: 400 }, (_, i) => `screen number ${i}`))};\n`;
mkdirSync(path.join(dist, 'assets'));
writeFileSync(path.join(dist, 'index.html'), page);
writeFileSync(path.join(dist, 'assets', 'index-Ab12Cd34.js'), script);
// A second script as the build leaves it: beside it, the same at brotli quality 11 (client/vite.config.ts).
const prebuiltScript = `export const steps = ${JSON.stringify(Array.from({ length: 400 }, (_, i) => `step ${i}`))};\n`;
const prebuiltBr = zlib.brotliCompressSync(prebuiltScript, { params: { [zlib.constants.BROTLI_PARAM_QUALITY]: 11 } });
writeFileSync(path.join(dist, 'assets', 'steps-Ef56Gh78.js'), prebuiltScript);
writeFileSync(path.join(dist, 'assets', 'steps-Ef56Gh78.js.br'), prebuiltBr);
writeFileSync(path.join(dist, 'favicon.svg'), '<svg xmlns="http://www.w3.org/2000/svg"/>');
// What vite-plugin-pwa writes beside the page (client/vite.config.ts): the service worker, its workbox
// runtime (named with a hash, but outside /assets) and the web app manifest.
writeFileSync(path.join(dist, 'sw.js'), "importScripts('/workbox-5f3e2a1b.js');\n");
writeFileSync(path.join(dist, 'workbox-5f3e2a1b.js'), 'self.workbox = {};\n');
writeFileSync(path.join(dist, 'manifest.webmanifest'), JSON.stringify({ name: 'Loadline', start_url: '/' }));

/** The bytes as they cross the wire, not decoded (supertest would decode them for us). */
function raw(base: string, urlPath: string, acceptEncoding: string) {
  return new Promise<{ headers: http.IncomingHttpHeaders; body: Buffer }>((resolve, reject) => {
    http
      .get(`${base}${urlPath}`, { headers: { 'accept-encoding': acceptEncoding } }, (res) => {
        const chunks: Buffer[] = [];
        res.on('data', (c: Buffer) => chunks.push(c));
        res.on('end', () => resolve({ headers: res.headers, body: Buffer.concat(chunks) }));
      })
      .on('error', reject);
  });
}

describe('the built client: compressed, hashed files cached for a year, the page never', () => {
  const h = useHarness({ CLIENT_DIST: dist });
  let server: http.Server;
  let base = '';

  beforeAll(async () => {
    server = await new Promise<http.Server>((resolve) => {
      const s = h.app.listen(0, '127.0.0.1', () => resolve(s));
    });
    base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  });
  afterAll(async () => {
    await new Promise((resolve) => server.close(resolve));
    rmSync(dist, { recursive: true, force: true });
  });

  it('sends a hashed script brotli-compressed to a browser that offers brotli, cached as immutable for a year', async () => {
    const res = await raw(base, '/assets/index-Ab12Cd34.js', 'gzip, deflate, br');
    expect(res.headers['content-encoding']).toBe('br');
    expect(res.headers['cache-control']).toBe('public, max-age=31536000, immutable');
    expect(res.headers.vary).toMatch(/Accept-Encoding/i);
    expect(res.body.length).toBeLessThan(Buffer.byteLength(script) / 3);
    expect(zlib.brotliDecompressSync(res.body).toString()).toBe(script);
  });

  it('sends gzip to a browser that offers only gzip, and the file as it is to one that offers nothing', async () => {
    const gz = await raw(base, '/assets/index-Ab12Cd34.js', 'gzip');
    expect(gz.headers['content-encoding']).toBe('gzip');
    expect(zlib.gunzipSync(gz.body).toString()).toBe(script);
    const plain = await raw(base, '/assets/index-Ab12Cd34.js', 'identity');
    expect(plain.headers['content-encoding']).toBeUndefined();
    expect(plain.body.toString()).toBe(script);
  });

  it('sends the brotli file the build made (quality 11) as the script it stands for, to a browser that offers brotli', async () => {
    const res = await raw(base, '/assets/steps-Ef56Gh78.js', 'gzip, deflate, br');
    expect(res.headers['content-encoding']).toBe('br');
    expect(res.headers['content-type']).toMatch(/^text\/javascript/);
    expect(res.headers['cache-control']).toBe('public, max-age=31536000, immutable');
    expect(res.headers.vary).toMatch(/Accept-Encoding/i);
    expect(res.body.equals(prebuiltBr)).toBe(true);
    expect(zlib.brotliDecompressSync(res.body).toString()).toBe(prebuiltScript);

    // RFC 9110 section 12.5.3: br;q=0 refuses brotli.
    for (const offer of ['gzip', 'gzip, br;q=0']) {
      const gz = await raw(base, '/assets/steps-Ef56Gh78.js', offer);
      expect(gz.headers['content-encoding'], offer).toBe('gzip');
      expect(zlib.gunzipSync(gz.body).toString(), offer).toBe(prebuiltScript);
    }
  });

  it('sends the page for any client route, compressed and never cached without asking again', async () => {
    for (const route of ['/', '/athlete', '/sign-in']) {
      const res = await raw(base, route, 'br');
      expect(res.headers['content-type']).toMatch(/^text\/html/);
      expect(res.headers['cache-control']).toBe('no-cache');
      expect(res.headers['content-encoding']).toBe('br');
      expect(zlib.brotliDecompressSync(res.body).toString()).toBe(page);
    }
  });

  it('asks again for files without a hash in their name', async () => {
    const res = await request(h.app).get('/favicon.svg');
    expect(res.status).toBe(200);
    expect(res.headers['cache-control']).toBe('no-cache');
  });

  // A service worker script kept by an HTTP cache would hold every phone on an old release: W3C Service
  // Workers (update checks) and RFC 9111 section 5.2.2.4 — `no-cache` makes each check ask the server.
  it('asks again for the service worker, its workbox runtime and the manifest, and only hashed assets are immutable', async () => {
    const sw = await request(h.app).get('/sw.js');
    expect(sw.status).toBe(200);
    expect(sw.headers['content-type']).toMatch(/javascript/);
    expect(sw.headers['cache-control']).toBe('no-cache');

    const runtime = await request(h.app).get('/workbox-5f3e2a1b.js');
    expect(runtime.status).toBe(200);
    expect(runtime.headers['cache-control']).toBe('no-cache');

    // W3C Web App Manifest, section "Media type registration": application/manifest+json.
    const manifest = await request(h.app).get('/manifest.webmanifest');
    expect(manifest.status).toBe(200);
    expect(manifest.headers['content-type']).toMatch(/^application\/manifest\+json/);
    expect(manifest.headers['cache-control']).toBe('no-cache');

    const index = await request(h.app).get('/index.html');
    expect(index.headers['cache-control']).toBe('no-cache');
    const hashed = await request(h.app).get('/assets/index-Ab12Cd34.js');
    expect(hashed.headers['cache-control']).toBe('public, max-age=31536000, immutable');
  });

  it('answers a missing service worker or manifest with a 404, never the page read as code', async () => {
    rmSync(path.join(dist, 'sw.js'));
    try {
      for (const file of ['/sw.js', '/workbox-00000000.js', '/manifest.json.webmanifest']) {
        const res = await request(h.app).get(file);
        expect(res.status, file).toBe(404);
        expect(res.headers['content-type'], file).toMatch(/^text\/plain/);
      }
    } finally {
      writeFileSync(path.join(dist, 'sw.js'), "importScripts('/workbox-5f3e2a1b.js');\n");
    }
  });

  it('answers a hashed file that is not there with a 404, not the page', async () => {
    const res = await request(h.app).get('/assets/index-Gone0000.js');
    expect(res.status).toBe(404);
    expect(res.headers['content-type']).toMatch(/^text\/plain/);
  });

  it('leaves the API uncached', async () => {
    const res = await request(h.app).get('/api/health');
    expect(res.headers['cache-control']).toBe('no-store');
  });
});
