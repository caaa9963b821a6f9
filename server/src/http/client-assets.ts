import { readdirSync } from 'node:fs';
import path from 'node:path';
import compression from 'compression';
import express, { type Express, type RequestHandler } from 'express';

/** A year, in seconds: the longest lifetime caches honour (RFC 9111 suggests no more). */
const YEAR = 31_536_000;

/**
 * Serves the built client (a fast first load on a slow phone). Files under /assets carry a content hash in
 * their names, so a browser may keep them for a year without asking again: a release makes new names. The
 * page itself (index.html, which names those files) and anything else in the folder are asked for again each
 * time (`no-cache`: a conditional request, a 304 when unchanged), so a release is seen at once.
 *
 * Text goes out compressed, brotli when the browser offers it, else gzip (the `compression` package,
 * which honours Accept-Encoding and sets Vary); fonts, images and already-compressed files are left as
 * they are, by the package's own choice of compressible types.
 */
export function serveClient(app: Express, clientDist: string): void {
  const assets = path.join(clientDist, 'assets');
  const shrink = compression();
  app.use(
    prebuiltBrotli(clientDist),
    shrink,
    express.static(clientDist, {
      index: false,
      // Set below per file: `maxAge` would give every file the same lifetime.
      cacheControl: false,
      setHeaders(res, file) {
        res.setHeader('Cache-Control', path.dirname(file) === assets ? `public, max-age=${YEAR}, immutable` : 'no-cache');
      },
    }),
  );
  // A hashed file that is not there (a tab open across a release asking for an old screen's code) is a
  // plain 404, never the page in its place, which the browser would refuse as a script anyway.
  app.use('/assets', (_req, res) => {
    res.setHeader('Cache-Control', 'no-cache');
    res.status(404).type('text/plain').send('Not found');
  });
  // A script, style sheet or manifest that is not there (the service worker of a removed release) is a
  // 404 as well: the page in its place would be read as code of the wrong type.
  app.get(/\.(?:m?js|css|map|webmanifest)$/, (_req, res) => {
    res.setHeader('Cache-Control', 'no-cache');
    res.status(404).type('text/plain').send('Not found');
  });
  // Every other path is one of the client's own routes: the page, never cached, loads the right screen.
  app.get('/{*splat}', shrink, (_req, res) => {
    res.setHeader('Cache-Control', 'no-cache');
    res.sendFile(path.join(clientDist, 'index.html'));
  });
}

/** Accept-Encoding names brotli with a weight above 0 (RFC 9110 section 12.5.3). */
function offersBrotli(header: string | undefined): boolean {
  return (header ?? '').split(',').some((part) => {
    const [coding, ...params] = part.split(';').map((p) => p.trim().toLowerCase());
    const q = params.find((p) => p.startsWith('q='));
    return coding === 'br' && (q === undefined || Number(q.slice(2)) > 0);
  });
}

/**
 * The build writes each script and style sheet also as brotli at its highest quality, 11
 * (client/vite.config.ts): a few kB smaller than the quality the `compression` package uses on the fly,
 * and no compressing per request. A browser that offers brotli gets that file, with the original's type
 * and cache lifetime; any other request goes on to the usual path (fewer bytes for the first load).
 */
function prebuiltBrotli(clientDist: string): RequestHandler {
  const prebuilt = new Set(
    readdirSync(clientDist, { recursive: true, encoding: 'utf8' })
      .filter((f) => f.endsWith('.br'))
      .map((f) => `/${f.slice(0, -3).split(path.sep).join('/')}`),
  );
  return (req, res, next) => {
    if ((req.method !== 'GET' && req.method !== 'HEAD') || !prebuilt.has(req.path) || !offersBrotli(req.headers['accept-encoding'])) {
      next();
      return;
    }
    res.setHeader('Vary', 'Accept-Encoding');
    res.setHeader('Content-Encoding', 'br');
    res.type(path.extname(req.path));
    req.url = `${req.path}.br${req.url.slice(req.path.length)}`;
    next();
  };
}
