import type { Config } from '../config';

/**
 * The address people open links in e-mails at (an invitation, a password reset, a letter's check
 * page): the configured PUBLIC_URL, else the server's own configured address. Never the request's
 * Host header, which the sender of the request chooses: a link built from it would carry a secret
 * token to any host an attacker names ("password reset poisoning", OWASP Web Security Testing
 * Guide WSTG-INPV-17, Host header injection).
 */
export function publicBaseUrl(config: Pick<Config, 'PUBLIC_URL' | 'HOST' | 'PORT'>): string {
  const base = config.PUBLIC_URL ?? `http://${config.HOST}:${config.PORT}`;
  return base.replace(/\/+$/, '');
}
