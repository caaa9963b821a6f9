import { createReadStream, createWriteStream } from 'node:fs';
import { mkdir, rename, rm, stat } from 'node:fs/promises';
import path from 'node:path';
import type { Readable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import { assertKey, type ByteRange, type ObjectStorage } from './storage';

/**
 * Files on local disk under one root folder (by default `.data/uploads`, never below anything served
 * statically). A write goes to `<key>.partial` and is renamed when complete, so a reader never sees
 * half a file and a failed write leaves nothing under the key.
 */
export class LocalStorage implements ObjectStorage {
  readonly kind = 'local' as const;
  readonly root: string;

  constructor(rootDir: string) {
    this.root = path.resolve(rootDir);
  }

  private pathOf(key: string): string {
    assertKey(key);
    const full = path.resolve(this.root, key);
    // The key pattern already rules out `..` and absolute paths; this is the belt to those braces.
    if (!full.startsWith(this.root + path.sep)) throw new Error(`Refusing storage key ${JSON.stringify(key)}`);
    return full;
  }

  async put(key: string, body: Readable, meta: { size: number; contentType: string }): Promise<void> {
    const full = this.pathOf(key);
    const partial = `${full}.partial`;
    await mkdir(path.dirname(full), { recursive: true });
    try {
      await pipeline(body, createWriteStream(partial, { flags: 'wx' }));
      const written = (await stat(partial)).size;
      if (written !== meta.size) throw new Error(`Stored ${written} bytes where ${meta.size} were expected`);
      await rename(partial, full);
    } catch (err) {
      await rm(partial, { force: true });
      throw err;
    }
  }

  async get(key: string, range?: ByteRange): Promise<Readable> {
    const full = this.pathOf(key);
    await stat(full); // a missing file rejects here rather than as a stream error mid-response
    return createReadStream(full, range ? { start: range.start, end: range.end } : {});
  }

  async delete(key: string): Promise<void> {
    await rm(this.pathOf(key), { force: true });
  }

  async exists(key: string): Promise<boolean> {
    return stat(this.pathOf(key)).then(
      () => true,
      () => false,
    );
  }
}
