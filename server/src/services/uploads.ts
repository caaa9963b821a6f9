import { randomUUID } from 'node:crypto';
import { createReadStream } from 'node:fs';
import { pipeline } from 'node:stream/promises';
import type { Response } from 'express';
import type { Logger } from 'pino';
import type { Config } from '../config';
import type { ObjectStorage, ByteRange } from '../storage';
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
  record: () => Promise<T>,
): Promise<T> {
  try {
    await storage.put(key, createReadStream(received.file.tempPath), { size: received.file.size, contentType: received.file.mediaType });
    try {
      return await record();
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

/**
 * Streams a stored object (or a range of it) into the response. The object is opened before
 * `headers` sets anything, so a missing object still answers a plain JSON error, not an "attachment".
 * A viewer who seeks or closes the tab ends the response early; for video that is normal, not an error.
 */
export async function streamStored(
  storage: ObjectStorage,
  res: Response,
  key: string,
  range: ByteRange | undefined,
  headers: () => void,
): Promise<void> {
  const body = await storage.get(key, range);
  headers();
  try {
    await pipeline(body, res);
  } catch (err) {
    if (res.destroyed || res.writableFinished) return;
    throw err;
  }
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
