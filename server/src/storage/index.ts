import path from 'node:path';
import type { Config } from '../config';
import { LocalStorage } from './local-storage';
import { S3Storage } from './s3-storage';
import type { ObjectStorage } from './storage';

export type { ObjectStorage, ByteRange } from './storage';
export { LocalStorage } from './local-storage';
export { S3Storage } from './s3-storage';

const ROOT = path.resolve(import.meta.dirname, '../../..');

/** The default folder: under the data folder, outside client/dist and anything else served. */
export const DEFAULT_STORAGE_DIR = path.join(ROOT, '.data', 'uploads');

/** S3 when a bucket is configured, local disk otherwise. */
export function createStorage(config: Config): ObjectStorage {
  if (config.S3_BUCKET) {
    return new S3Storage({
      bucket: config.S3_BUCKET,
      region: config.S3_REGION,
      endpoint: config.S3_ENDPOINT,
      forcePathStyle: config.S3_FORCE_PATH_STYLE === 'true',
      credentials:
        config.S3_ACCESS_KEY_ID && config.S3_SECRET_ACCESS_KEY
          ? { accessKeyId: config.S3_ACCESS_KEY_ID, secretAccessKey: config.S3_SECRET_ACCESS_KEY }
          : undefined,
    });
  }
  return new LocalStorage(config.STORAGE_DIR ?? DEFAULT_STORAGE_DIR);
}
