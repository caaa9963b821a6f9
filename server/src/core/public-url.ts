import type { Config } from '../config';

/**
 * The address the server is really listening on, once it listens: with PORT=0 (browser tests, the
 * benchmark) the system picks the port, so only server.ts knows it, as for the notices' base URL.
 */
let listening: { host: string; port: number } | null = null;

/** Called by server.ts after `listen`, with the port the system gave it. */
export function rememberListeningAddress(host: string, port: number): void {
  listening = { host, port };
}

/**
 * The base of every link Loadline puts in an e-mail or a letter: PUBLIC_URL, else the configured
 * server's own address. Never the request's Host header, which the sender controls (OWASP "password
 * reset poisoning"; ASVS 5.0 V3 and V13 host handling). No trailing slash.
 */
export function publicBaseUrl(config: Pick<Config, 'PUBLIC_URL' | 'HOST' | 'PORT'>): string {
  if (config.PUBLIC_URL) return config.PUBLIC_URL.replace(/\/+$/, '');
  const port = config.PORT === 0 && listening?.host === config.HOST ? listening.port : config.PORT;
  return `http://${config.HOST}:${port}`;
}
