import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { setCsrfToken } from './api-client';
import { apiHref, isAbort, percentOf, uploadForm, uploadWithProgress } from './upload';

/** Just enough of XMLHttpRequest to drive the helper by hand. */
class FakeXhr {
  static last: FakeXhr;
  method = '';
  url = '';
  headers: Record<string, string> = {};
  withCredentials = false;
  status = 0;
  responseText = '';
  body: unknown;
  upload: { onprogress: ((e: { lengthComputable: boolean; loaded: number; total: number }) => void) | null } = { onprogress: null };
  onload: (() => void) | null = null;
  onerror: (() => void) | null = null;
  onabort: (() => void) | null = null;
  constructor() {
    FakeXhr.last = this;
  }
  open(method: string, url: string) {
    this.method = method;
    this.url = url;
  }
  setRequestHeader(name: string, value: string) {
    this.headers[name] = value;
  }
  send(body: unknown) {
    this.body = body;
  }
  abort() {
    this.onabort?.();
  }
  answer(status: number, body: unknown) {
    this.status = status;
    this.responseText = JSON.stringify(body);
    this.onload?.();
  }
}

beforeEach(() => {
  vi.stubGlobal('XMLHttpRequest', FakeXhr);
  setCsrfToken('token-1');
});
afterEach(() => {
  vi.unstubAllGlobals();
  setCsrfToken(null);
});

describe('uploadForm', () => {
  it('puts every text field before the file, and leaves out empty ones', () => {
    const form = uploadForm({ title: 'MRI report', caption: '', issuedBy: 'Dr Ames' }, new Blob(['x']), 'scan.pdf');
    expect([...form.keys()]).toEqual(['title', 'issuedBy', 'file']);
    expect(form.get('file')).toBeInstanceOf(Blob);
  });
});

describe('uploadWithProgress', () => {
  it('posts to /api with the CSRF token and credentials, reports progress, and returns the JSON', async () => {
    const seen: number[] = [];
    const done = uploadWithProgress<{ id: string }>('/orgs/o1/clips', new FormData(), { onProgress: (p) => seen.push(p.percent) });
    const xhr = FakeXhr.last;
    expect(xhr.method).toBe('POST');
    expect(xhr.url).toBe('/api/orgs/o1/clips');
    expect(xhr.headers['X-CSRF-Token']).toBe('token-1');
    expect(xhr.withCredentials).toBe(true);
    xhr.upload.onprogress?.({ lengthComputable: true, loaded: 25, total: 100 });
    xhr.upload.onprogress?.({ lengthComputable: true, loaded: 100, total: 100 });
    xhr.answer(201, { id: 'c1' });
    await expect(done).resolves.toEqual({ id: 'c1' });
    expect(seen).toEqual([25, 100]);
  });

  it('rejects with the server’s own sentence on a refusal (413)', async () => {
    const done = uploadWithProgress('/orgs/o1/cases/c1/documents', new FormData());
    FakeXhr.last.answer(413, {
      error: { code: 'payload_too_large', message: 'The file is larger than the 20 MB limit for documents.' },
      requestId: 'r1',
    });
    await expect(done).rejects.toMatchObject({
      status: 413,
      code: 'payload_too_large',
      message: 'The file is larger than the 20 MB limit for documents.',
    });
  });

  it('says plainly when the connection drops part-way', async () => {
    const done = uploadWithProgress('/orgs/o1/clips', new FormData());
    FakeXhr.last.onerror?.();
    await expect(done).rejects.toMatchObject({ status: 0, code: 'network', message: expect.stringMatching(/Nothing was saved/) });
  });

  it('cancels through the abort signal', async () => {
    const controller = new AbortController();
    const done = uploadWithProgress('/orgs/o1/clips', new FormData(), { signal: controller.signal });
    controller.abort();
    const error = await done.catch((e: unknown) => e);
    expect(isAbort(error)).toBe(true);
  });
});

describe('percentOf and apiHref', () => {
  it('gives whole percentages within 0–100', () => {
    expect(percentOf(1, 3)).toBe(33);
    expect(percentOf(5, 0)).toBe(0);
    expect(percentOf(200, 100)).toBe(100);
  });
  it('accepts DTO paths with or without the /api prefix', () => {
    expect(apiHref('/orgs/o/clips/c/video')).toBe('/api/orgs/o/clips/c/video');
    expect(apiHref('/api/orgs/o/clips/c/video')).toBe('/api/orgs/o/clips/c/video');
  });
});
