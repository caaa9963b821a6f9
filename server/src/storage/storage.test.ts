import { mkdtemp, readdir, rm } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { Readable } from 'node:stream';
import { text } from 'node:stream/consumers';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import S3rver from 's3rver';
import { CreateBucketCommand } from '@aws-sdk/client-s3';
import { LocalStorage } from './local-storage';
import { S3Storage } from './s3-storage';
import type { ObjectStorage } from './storage';

const BODY = 'abcdefghijklmnopqrstuvwxyz0123456789';

/** The same contract for every implementation: the routes only know the interface. */
function contract(name: string, make: () => ObjectStorage) {
  describe(`${name}: the storage contract`, () => {
    it('stores, reads whole and by range, reports existence, deletes', async () => {
      const s = make();
      const key = `org1/documents/${name}-a`;
      await s.put(key, Readable.from([Buffer.from(BODY)]), { size: BODY.length, contentType: 'text/plain' });
      expect(await s.exists(key)).toBe(true);
      expect(await text(await s.get(key))).toBe(BODY);
      expect(await text(await s.get(key, { start: 3, end: 7 }))).toBe('defgh');
      expect(await text(await s.get(key, { start: BODY.length - 1, end: BODY.length - 1 }))).toBe('9');
      await s.delete(key);
      expect(await s.exists(key)).toBe(false);
      await s.delete(key); // deleting again is not an error
    });

    it('refuses keys with .. or an absolute path', async () => {
      const s = make();
      for (const key of ['../x', 'a/../../x', '/etc/passwd', 'a//b', 'a/b.pdf']) {
        await expect(s.put(key, Readable.from([Buffer.from('x')]), { size: 1, contentType: 'text/plain' }), key).rejects.toThrow(
          /Refusing/,
        );
        await expect(s.get(key), key).rejects.toThrow(/Refusing/);
      }
    });

    it('leaves nothing under the key when the body fails part-way', async () => {
      const s = make();
      const key = `org1/clips/${name}-broken`;
      const failing = new Readable({
        read() {
          this.push(Buffer.alloc(1024, 1));
          this.destroy(new Error('client went away'));
        },
      });
      await expect(s.put(key, failing, { size: 10_000, contentType: 'video/webm' })).rejects.toThrow();
      expect(await s.exists(key)).toBe(false);
    });
  });
}

let localRoot = '';
beforeAll(async () => {
  localRoot = await mkdtemp(path.join(os.tmpdir(), 'loadline-storage-'));
});
afterAll(async () => {
  await rm(localRoot, { recursive: true, force: true });
});
contract('local', () => new LocalStorage(localRoot));

describe('local disk specifics', () => {
  it('writes no .partial file that outlives a failed write', async () => {
    const s = new LocalStorage(localRoot);
    await expect(
      s.put('org2/documents/short', Readable.from([Buffer.from('abc')]), { size: 10, contentType: 'text/plain' }),
    ).rejects.toThrow();
    expect(await readdir(path.join(localRoot, 'org2', 'documents'))).toEqual([]);
  });
});

// s3rver is a maintained-enough fake of the S3 API that runs in-process on loopback.
const s3 = { server: null as S3rver | null, dir: '', endpoint: '' };
beforeAll(async () => {
  s3.dir = await mkdtemp(path.join(os.tmpdir(), 'loadline-s3rver-'));
  s3.server = new S3rver({ address: '127.0.0.1', port: 0, silent: true, directory: s3.dir });
  const { port } = await s3.server.run();
  s3.endpoint = `http://127.0.0.1:${port}`;
  const storage = makeS3();
  await storage.client.send(new CreateBucketCommand({ Bucket: 'loadline-test' }));
});
afterAll(async () => {
  await s3.server?.close();
  await rm(s3.dir, { recursive: true, force: true });
});
function makeS3() {
  return new S3Storage({
    bucket: 'loadline-test',
    region: 'us-east-1',
    endpoint: s3.endpoint,
    forcePathStyle: true,
    credentials: { accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' },
  });
}
contract('s3', makeS3);
