import { randomUUID } from 'node:crypto';
import { createReadStream } from 'node:fs';
import type { Logger } from 'pino';
import type { Config } from '../config';
import type { ObjectStorage } from '../storage';
import type { Received, UploadRules } from '../storage/receive';

const MB = 1024 * 1024;

/** Extensions for the server-made download names, by detected media type. */
export const EXTENSIONS: Record<string, string> = {
  'application/pdf': 'pdf',
  'image/jpeg': 'jpg',
  'image/png': 'png',
  'image/heic': 'heic',
  'image/heif': 'heif',
  'video/webm': 'webm',
  'video/mp4': 'mp4',
  'video/quicktime': 'mov',
};

export function documentRules(config: Config): UploadRules {
  return {
    maxBytes: Math.floor(config.UPLOAD_MAX_DOCUMENT_MB * MB),
    kindWords: 'documents',
    accept: ['application/pdf', 'image/jpeg', 'image/png', 'image/heic', 'image/heif'],
    unsupportedMessage: 'This file is not a PDF, JPEG, PNG or HEIC image (its contents were checked, not its name).',
  };
}

export function clipRules(config: Config): UploadRules {
  return {
    maxBytes: Math.floor(config.UPLOAD_MAX_CLIP_MB * MB),
    kindWords: 'clips',
    accept: ['video/webm', 'video/mp4', 'video/quicktime'],
    unsupportedMessage: 'This file is not a WebM, MP4 or QuickTime (MOV) video (its contents were checked, not its name).',
  };
}

/** A key made by the server alone: nothing of the client's file name ever reaches storage. */
export const newStorageKey = (organizationId: string, kind: 'documents' | 'clips') => `${organizationId}/${kind}/${randomUUID()}`;

/**
 * Moves a received file into storage, then runs the database write. If the write fails the stored
 * object is removed again; the temporary file is always removed. So a failure at any step leaves
 * neither a file nor a row.
 */
export async function storeThenRecord<T>(
  storage: ObjectStorage,
  logger: Logger,
  key: string,
  received: Received<unknown>,
  record: (key: string) => Promise<T>,
): Promise<T> {
  try {
    await storage.put(key, createReadStream(received.file.tempPath), { size: received.file.size, contentType: received.file.mediaType });
    try {
      return await record(key);
    } catch (err) {
      await storage
        .delete(key)
        .catch((deleteErr) => logger.error({ err: deleteErr, key }, 'could not remove an upload whose row was not written'));
      throw err;
    }
  } finally {
    await received.cleanup();
  }
}

/** Removes a stored object after its row is gone; a failure leaves an orphan file, never a dangling row. */
export async function removeStored(storage: ObjectStorage, logger: Logger, key: string): Promise<void> {
  await storage.delete(key).catch((err) => logger.error({ err, key }, 'could not remove a stored upload after its row was deleted'));
}

/** `Knee MRI report` → `knee-mri-report`: only letters, digits and dashes reach a header. */
export function slug(text: string): string {
  const s = text
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .slice(0, 60)
    .replace(/-+$/, '');
  return s || 'document';
}
