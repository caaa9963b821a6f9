import type { RequestHandler } from 'express';
import type { Config } from '../config';
import { AppError } from '../core/errors';

const LOOPBACK_NAMES = new Set(['127.0.0.1', 'localhost', '[::1]']);

/** `host[:port]` as a browser sends it, lower-cased, without the scheme's default port (RFC 9110 section 7.2). */
export function normaliseHost(value: string, scheme: 'http' | 'https' = 'http'): string | null {
  let url: URL;
  try {
    url = new URL(`${scheme}://${value.trim()}`);
  } catch {
    return null;
  }
  // Anything beyond host and port (a path, credentials) is not a Host value.
  if (url.username || url.password || url.pathname !== '/' || url.search || url.hash || `${value}`.includes('/')) return null;
  return url.host.toLowerCase();
}

/**
 * The Host values this server answers to. With PUBLIC_URL: its host, plus the loopback names on the
 * same port when that host is a loopback one (so http://localhost:3000 works when PUBLIC_URL says
 * 127.0.0.1). Without PUBLIC_URL (tests, `npm run dev`; production refuses to start): loopback only.
 */
export function allowedHosts(config: Pick<Config, 'PUBLIC_URL'>): { accepts(host: string): boolean; describe: string } {
  if (!config.PUBLIC_URL) {
    return {
      accepts: (host) => LOOPBACK_NAMES.has(hostName(host)),
      describe: 'a loopback address (set PUBLIC_URL to serve other addresses)',
    };
  }
  const url = new URL(config.PUBLIC_URL);
  const configured = url.host.toLowerCase();
  const port = url.port;
  return {
    accepts: (host) =>
      host === configured || (LOOPBACK_NAMES.has(url.hostname) && LOOPBACK_NAMES.has(hostName(host)) && portOf(host) === port),
    describe: configured,
  };
}

function hostName(host: string): string {
  return host.startsWith('[') ? host.slice(0, host.indexOf(']') + 1) : host.split(':')[0]!;
}

function portOf(host: string): string {
  const rest = host.startsWith('[') ? host.slice(host.indexOf(']') + 1) : host.slice(host.split(':')[0]!.length);
  return rest.startsWith(':') ? rest.slice(1) : '';
}

/**
 * Refuses, before any handler, a request whose Host (or, behind a trusted proxy, X-Forwarded-Host)
 * is not this server's configured address: links are built from configuration, and a forged Host
 * must not reach code that might echo it (OWASP Web Security Testing Guide WSTG-INPV-17, "Testing
 * for Host Header Injection"; OWASP Forgot Password Cheat Sheet on reset-link poisoning). The health
 * check is exempt, so a load balancer may call it by the machine's address.
 */
export function hostCheck(config: Pick<Config, 'PUBLIC_URL' | 'TRUST_PROXY'>): RequestHandler {
  const allowed = allowedHosts(config);
  const scheme = config.PUBLIC_URL?.startsWith('https:') ? 'https' : 'http';
  return (req, _res, next) => {
    if (req.path === '/api/health') return next();
    const values = [req.headers.host];
    if (config.TRUST_PROXY === 'true') {
      const forwarded = req.headers['x-forwarded-host'];
      if (forwarded !== undefined) values.push(String(forwarded).split(',')[0]!.trim());
    }
    for (const value of values) {
      const host = typeof value === 'string' ? normaliseHost(value, scheme) : null;
      if (!host || !allowed.accepts(host)) {
        return next(
          new AppError(
            'validation_failed',
            `This server answers only at ${allowed.describe}; the request's Host header names another address.`,
            {
              host: [`is not ${allowed.describe}`],
            },
          ),
        );
      }
    }
    next();
  };
}
