import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { ERROR_CODES } from '../../../policies/errors';
import { ApiError, api, errorFromResponse, setCsrfToken } from './api-client';

function jsonResponse(status: number, body: unknown): Response {
  return new Response(JSON.stringify(body), { status, headers: { 'Content-Type': 'application/json' } });
}

describe('errorFromResponse', () => {
  it('keeps the code, sentence, field messages and request id of our error body', async () => {
    const error = await errorFromResponse(
      jsonResponse(400, {
        error: {
          code: 'validation_failed',
          message: 'Some fields need attention.',
          fields: { email: ['must be a valid e-mail address'], 'roles.0': ['must be one of athlete, coach'] },
        },
        requestId: 'req-123',
      }),
    );
    expect(error).toBeInstanceOf(ApiError);
    expect(error.status).toBe(400);
    expect(error.code).toBe('validation_failed');
    expect(error.message).toBe('Some fields need attention.');
    expect(error.fields).toEqual({
      email: ['must be a valid e-mail address'],
      'roles.0': ['must be one of athlete, coach'],
    });
    expect(error.requestId).toBe('req-123');
  });

  it('reads a 409 version conflict by its code, not only its status', async () => {
    const error = await errorFromResponse(
      jsonResponse(409, { error: { code: 'version_conflict', message: 'Changed elsewhere.' }, requestId: 'r' }),
    );
    expect(error.code).toBe('version_conflict');
    expect(error.fields).toEqual({});
  });

  it('falls back to a plain sentence when a proxy answers with HTML', async () => {
    const error = await errorFromResponse(new Response('<html>Bad gateway</html>', { status: 502 }));
    expect(error.status).toBe(502);
    expect(error.code).toBe('internal');
    expect(error.message).toMatch(/went wrong/);
    expect(error.requestId).toBeNull();
  });

  it('maps a bare 429 to rate_limited', async () => {
    const error = await errorFromResponse(new Response('', { status: 429 }));
    expect(error.code).toBe('rate_limited');
  });

  it('keeps every code of the shared list, and reads a code it does not know as its status', async () => {
    for (const code of ERROR_CODES) {
      const error = await errorFromResponse(jsonResponse(400, { error: { code, message: 'x' }, requestId: 'r' }));
      expect(error.code).toBe(code);
    }
    const unknown = await errorFromResponse(jsonResponse(404, { error: { code: 'gone_fishing', message: 'Not here.' }, requestId: 'r' }));
    expect(unknown.code).toBe('not_found');
    expect(unknown.message).toBe('Not here.');
  });
});

describe('apiRequest', () => {
  const fetchMock = vi.fn<typeof fetch>();

  beforeEach(() => {
    vi.stubGlobal('fetch', fetchMock);
    setCsrfToken(null);
  });
  afterEach(() => {
    vi.unstubAllGlobals();
    fetchMock.mockReset();
  });

  it('sends the newest CSRF token and JSON content type on writes, and neither on reads', async () => {
    fetchMock.mockImplementation(async () => jsonResponse(200, { ok: true }));
    setCsrfToken('first');
    setCsrfToken('second');

    await api.post('/session', { email: 'a@b.test', password: 'x' });
    const [url, init] = fetchMock.mock.calls[0];
    expect(url).toBe('/api/session');
    const headers = init?.headers as Record<string, string>;
    expect(headers['X-CSRF-Token']).toBe('second');
    expect(headers['Content-Type']).toBe('application/json');
    expect(init?.body).toBe(JSON.stringify({ email: 'a@b.test', password: 'x' }));

    await api.get('/session');
    const readHeaders = fetchMock.mock.calls[1][1]?.headers as Record<string, string>;
    expect(readHeaders['X-CSRF-Token']).toBeUndefined();
    expect(readHeaders['Content-Type']).toBeUndefined();
  });

  it('adds only the query parameters that have values', async () => {
    fetchMock.mockResolvedValue(jsonResponse(200, { entries: [], nextBefore: null }));
    await api.get('/orgs/o1/audit', { query: { action: 'invitation.create', from: '', to: undefined, limit: 50 } });
    expect(fetchMock.mock.calls[0][0]).toBe('/api/orgs/o1/audit?action=invitation.create&limit=50');
  });

  it('returns undefined for 204 No Content', async () => {
    fetchMock.mockResolvedValue(new Response(null, { status: 204 }));
    await expect(api.delete('/session')).resolves.toBeUndefined();
  });

  it('throws an ApiError with the server sentence on failure', async () => {
    fetchMock.mockResolvedValue(jsonResponse(403, { error: { code: 'forbidden', message: 'Only admins may invite.' }, requestId: 'r9' }));
    await expect(api.post('/orgs/o1/invitations', {})).rejects.toMatchObject({
      status: 403,
      code: 'forbidden',
      message: 'Only admins may invite.',
    });
  });

  it('turns a network failure into a "network" error with a readable sentence', async () => {
    fetchMock.mockRejectedValue(new TypeError('Failed to fetch'));
    await expect(api.get('/health')).rejects.toMatchObject({ status: 0, code: 'network' });
  });
});
