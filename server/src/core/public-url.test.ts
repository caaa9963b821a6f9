import { describe, expect, it } from 'vitest';
import { loadConfig } from '../config';
import { publicBaseUrl, rememberListeningAddress } from './public-url';

const config = (env: Record<string, string> = {}) =>
  loadConfig({ DATABASE_URL: 'postgres://x/y', SESSION_SECRET: 'a-secret-that-is-long-enough-for-the-config', ...env });

describe('publicBaseUrl: the base of links in e-mails and letters, from configuration only', () => {
  it('is PUBLIC_URL when set, without a trailing slash', () => {
    expect(publicBaseUrl(config({ PUBLIC_URL: 'https://loadline.example.org/' }))).toBe('https://loadline.example.org');
    expect(publicBaseUrl(config({ PUBLIC_URL: 'https://example.org/loadline' }))).toBe('https://example.org/loadline');
  });

  it("is otherwise the configured server's own address", () => {
    expect(publicBaseUrl(config())).toBe('http://127.0.0.1:3000');
    expect(publicBaseUrl(config({ HOST: '0.0.0.0', PORT: '8080' }))).toBe('http://0.0.0.0:8080');
  });

  it('with PORT=0, is the port the system gave the listening server', () => {
    rememberListeningAddress('127.0.0.1', 45678);
    expect(publicBaseUrl(config({ PORT: '0' }))).toBe('http://127.0.0.1:45678');
    expect(publicBaseUrl(config({ PORT: '0', PUBLIC_URL: 'https://loadline.example.org' }))).toBe('https://loadline.example.org');
  });
});
