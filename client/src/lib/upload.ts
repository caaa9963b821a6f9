import { ApiError, errorFromResponse, getCsrfToken } from './api-client';

/**
 * Sends a multipart form with progress. fetch reports no upload progress, so this one request type
 * goes through XMLHttpRequest, with the same credentials, CSRF header and error shape as the API
 * client. Text fields go first and the file last: the server reads the fields before the bytes.
 */

export interface UploadProgress {
  loaded: number;
  total: number;
  /** 0–100, whole numbers. */
  percent: number;
}

export interface UploadOptions {
  onProgress?: (progress: UploadProgress) => void;
  signal?: AbortSignal;
}

/** The form in the order the server wants it: every text field, then the one file as `file`. */
export function uploadForm(fields: Record<string, string | undefined | null>, file: Blob, fileName?: string): FormData {
  const form = new FormData();
  for (const [key, value] of Object.entries(fields)) {
    if (value !== undefined && value !== null && value !== '') form.append(key, value);
  }
  if (fileName) form.append('file', file, fileName);
  else form.append('file', file);
  return form;
}

export function percentOf(loaded: number, total: number): number {
  if (total <= 0) return 0;
  return Math.min(100, Math.max(0, Math.floor((loaded / total) * 100)));
}

export function uploadWithProgress<T>(path: string, body: FormData, options: UploadOptions = {}): Promise<T> {
  return new Promise<T>((resolve, reject) => {
    const { signal, onProgress } = options;
    if (signal?.aborted) {
      reject(new DOMException('The upload was cancelled.', 'AbortError'));
      return;
    }
    const xhr = new XMLHttpRequest();
    xhr.open('POST', `/api${path}`);
    xhr.withCredentials = true;
    xhr.setRequestHeader('Accept', 'application/json');
    const token = getCsrfToken();
    if (token) xhr.setRequestHeader('X-CSRF-Token', token);

    xhr.upload.onprogress = (event) => {
      if (!onProgress || !event.lengthComputable) return;
      onProgress({ loaded: event.loaded, total: event.total, percent: percentOf(event.loaded, event.total) });
    };

    const onAbort = () => xhr.abort();
    signal?.addEventListener('abort', onAbort, { once: true });
    const done = () => signal?.removeEventListener('abort', onAbort);

    xhr.onload = () => {
      done();
      const text = xhr.responseText;
      if (xhr.status >= 200 && xhr.status < 300) {
        resolve((text ? JSON.parse(text) : undefined) as T);
        return;
      }
      // The Response wrapper lets the API client's one error reader handle the body.
      void errorFromResponse(new Response(text || null, { status: xhr.status })).then(reject);
    };
    xhr.onerror = () => {
      done();
      reject(
        new ApiError({
          status: 0,
          code: 'network',
          message: 'The upload stopped before it finished: the connection was lost or refused. Nothing was saved; try again.',
        }),
      );
    };
    xhr.onabort = () => {
      done();
      reject(new DOMException('The upload was cancelled.', 'AbortError'));
    };
    xhr.send(body);
  });
}

export function isAbort(error: unknown): boolean {
  return error instanceof DOMException && error.name === 'AbortError';
}

/** An API path as the browser fetches it: the DTOs give paths under /api or relative to it. */
export function apiHref(path: string): string {
  return path.startsWith('/api/') ? path : `/api${path.startsWith('/') ? '' : '/'}${path}`;
}
