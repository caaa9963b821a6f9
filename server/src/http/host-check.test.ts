import { describe, expect, it } from 'vitest';
import request from 'supertest';
import { loadConfig } from '../config';
import { useHarness } from '../test/harness';
import { allowedHosts, normaliseHost } from './host-check';

const env = { DATABASE_URL: 'postgres://x/y', SESSION_SECRET: 'a-secret-that-is-long-enough-for-the-config' };

describe('PUBLIC_URL is configuration, required in production (OWASP WSTG-INPV-17: links never come from the Host header)', () => {
  it('refuses to start without it when NODE_ENV=production or SECURE_COOKIES=true, naming the variable', () => {
    expect(() => loadConfig({ ...env, NODE_ENV: 'production' })).toThrow(/PUBLIC_URL: is required in production/);
    expect(() => loadConfig({ ...env, SECURE_COOKIES: 'true' })).toThrow(/PUBLIC_URL: is required in production/);
    expect(loadConfig({ ...env, NODE_ENV: 'production', PUBLIC_URL: 'https://loadline.example.org' }).PUBLIC_URL).toBe(
      'https://loadline.example.org',
    );
    expect(loadConfig(env).PUBLIC_URL).toBeUndefined();
  });

  it('must be an http(s) address without a query or fragment', () => {
    for (const bad of [
      'ftp://loadline.example.org',
      'https://loadline.example.org/?a=1',
      'https://x.example/#top',
      'loadline.example.org',
    ]) {
      expect(() => loadConfig({ ...env, PUBLIC_URL: bad }), bad).toThrow(/PUBLIC_URL/);
    }
  });
});

describe('the Host values the server answers to (RFC 9110 section 7.2)', () => {
  it('normalises case and the default port, and rejects what is not a host', () => {
    expect(normaliseHost('Loadline.Example.org')).toBe('loadline.example.org');
    expect(normaliseHost('loadline.example.org:443', 'https')).toBe('loadline.example.org');
    expect(normaliseHost('loadline.example.org:80')).toBe('loadline.example.org');
    expect(normaliseHost('127.0.0.1:3000')).toBe('127.0.0.1:3000');
    for (const bad of ['', 'a b', 'x.example/evil', 'user@x.example', 'x.example?q', '%ZZ']) expect(normaliseHost(bad), bad).toBeNull();
  });

  it('with PUBLIC_URL: its host, and the loopback names on the same port when it is a loopback one', () => {
    const remote = allowedHosts({ PUBLIC_URL: 'https://loadline.example.org/' });
    expect(remote.accepts('loadline.example.org')).toBe(true);
    expect(remote.accepts('127.0.0.1:3000')).toBe(false);
    expect(remote.accepts('loadline.example.org.attacker.example')).toBe(false);
    const local = allowedHosts({ PUBLIC_URL: 'http://127.0.0.1:3000' });
    expect(['127.0.0.1:3000', 'localhost:3000', '[::1]:3000'].map(local.accepts)).toEqual([true, true, true]);
    expect(['127.0.0.1:3001', 'localhost', 'attacker.example:3000'].map(local.accepts)).toEqual([false, false, false]);
  });

  it('without PUBLIC_URL (tests, development): loopback names only', () => {
    const none = allowedHosts({ PUBLIC_URL: undefined });
    expect(['127.0.0.1:3000', 'localhost', '[::1]:5173'].map(none.accepts)).toEqual([true, true, true]);
    expect(['attacker.example', '10.0.0.5:3000', 'localhost.attacker.example'].map(none.accepts)).toEqual([false, false, false]);
  });
});

describe('a request for another host is refused (400) before any handler', () => {
  const h = useHarness({ PUBLIC_URL: 'https://loadline.example.org', TRUST_PROXY: 'true' });

  it('on the API, signed out, naming the Host header', async () => {
    const res = await request(h.app).get('/api/session').set('Host', 'attacker.example');
    expect(res.status).toBe(400);
    expect(res.body.error).toMatchObject({ code: 'validation_failed', fields: { host: ['is not loadline.example.org'] } });
    expect(res.headers['set-cookie']).toBeUndefined();
  });

  it('on the client pages and unknown paths too', async () => {
    for (const path of ['/', '/reset', '/api/nowhere']) {
      const res = await request(h.app).get(path).set('Host', 'attacker.example');
      expect(res.status, path).toBe(400);
    }
  });

  it('behind a trusted proxy, a forged X-Forwarded-Host as well', async () => {
    const res = await request(h.app).get('/api/session').set('X-Forwarded-Host', 'attacker.example');
    expect(res.status).toBe(400);
    const ok = await request(h.app).get('/api/session').set('X-Forwarded-Host', 'loadline.example.org');
    expect(ok.status).toBe(200);
  });

  it('the configured host is served; the health check answers whatever the Host, for load balancers', async () => {
    expect((await request(h.app).get('/api/session')).status).toBe(200);
    expect((await request(h.app).get('/api/health').set('Host', '10.0.0.5:3000')).status).toBe(200);
  });
});
