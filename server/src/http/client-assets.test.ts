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
writeFileSync(path.join(dist, 'favicon.svg'), '<svg xmlns="http://www.w3.org/2000/svg"/>');

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
