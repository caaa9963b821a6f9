import { pipeline } from 'node:stream/promises';
import type { Response } from 'express';
import type { ByteRange, ObjectStorage } from '../storage';

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

/** A PDF as a download that is never cached (ASVS 5.0 V5.4.1, V14.3.2). */
export function sendPdf(res: Response, pdf: Buffer, filename: string): void {
  res.setHeader('Content-Type', 'application/pdf');
  res.setHeader('Content-Disposition', `attachment; filename="${filename}"`);
  res.setHeader('Cache-Control', 'no-store');
  res.status(200).send(pdf);
}
