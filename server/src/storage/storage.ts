import type { Readable } from 'node:stream';

/** A byte range, both ends inclusive (as in HTTP Range headers). */
export interface ByteRange {
  start: number;
  end: number;
}

/**
 * Where uploaded files live. Keys are made by the server (`<orgId>/documents/<uuid>`); a client's
 * file name never becomes part of one. Implementations: local disk (default) and the S3 API.
 */
export interface ObjectStorage {
  readonly kind: 'local' | 's3';
  /** Stores `body` under `key`; on failure nothing is left under `key`. */
  put(key: string, body: Readable, meta: { size: number; contentType: string }): Promise<void>;
  /** The object's bytes, or only `range` of them. */
  get(key: string, range?: ByteRange): Promise<Readable>;
  /** Removes the object; removing one that is not there is not an error. */
  delete(key: string): Promise<void>;
  exists(key: string): Promise<boolean>;
}

/** Server-made keys only: segments of letters, digits, dash and underscore. */
const KEY = /^[A-Za-z0-9_-]+(\/[A-Za-z0-9_-]+)*$/;

export function assertKey(key: string): void {
  if (!KEY.test(key) || key.length > 300) throw new Error(`Refusing storage key ${JSON.stringify(key)}`);
}
