import { createHash } from 'node:crypto';
import type { Request } from 'express';
import busboy from 'busboy';
import { AppError } from '../core/errors';
import { megabytes } from './receive';

export interface ReceivedText {
  bytes: Buffer;
  /** The name the browser gave, for the admin's own reference only (never a storage key). */
  fileName: string | null;
  sha256: string;
}

/**
 * Reads a small text file (a roster CSV) from a multipart form into memory: exactly one part named
 * `file`, at most `maxBytes`. Unlike receiveUpload (storage/receive.ts) it keeps nothing on disk and
 * judges no type from magic bytes, which text formats do not have; the caller parses the text and refuses
 * what is not. A refusal lets the rest of the body drain so the client receives the answer.
 */
export function receiveTextFile(req: Request, maxBytes: number, kindWords: string): Promise<ReceivedText> {
  if (!req.is('multipart/form-data'))
    return Promise.reject(new AppError('unsupported_media_type', 'Send the file as a multipart form (multipart/form-data).'));
  const tooLarge = () => new AppError('payload_too_large', `The file is larger than the ${megabytes(maxBytes)} MB limit for ${kindWords}.`);
  const declared = Number(req.headers['content-length']);
  if (Number.isFinite(declared) && declared > maxBytes + 64 * 1024) return Promise.reject(tooLarge());
  return new Promise((resolve, reject) => {
    let bb: busboy.Busboy;
    try {
      bb = busboy({ headers: req.headers, limits: { files: 1, fields: 1, parts: 2, fileSize: maxBytes + 1 } });
    } catch {
      reject(new AppError('unsupported_media_type', 'Send the file as a multipart form (multipart/form-data) with a boundary.'));
      return;
    }
    let settled = false;
    let result: ReceivedText | null = null;
    const fail = (err: AppError) => {
      if (settled) return;
      settled = true;
      req.unpipe(bb);
      req.resume();
      reject(err);
    };
    const badForm = (message: string) => new AppError('validation_failed', `Please check the form: ${message}`, { file: [message] });
    bb.on('file', (name, stream, info) => {
      if (name !== 'file') {
        stream.resume();
        return fail(badForm('send the file as "file"'));
      }
      const chunks: Buffer[] = [];
      let size = 0;
      const hash = createHash('sha256');
      stream.on('data', (chunk: Buffer) => {
        size += chunk.length;
        if (size > maxBytes) return fail(tooLarge());
        hash.update(chunk);
        chunks.push(chunk);
      });
      stream.on('end', () => {
        const fileName = info.filename ? info.filename.replace(/[^\p{L}\p{N} ._()-]/gu, '_').slice(0, 200) : null;
        result = { bytes: Buffer.concat(chunks), fileName, sha256: hash.digest('hex') };
      });
    });
    bb.on('field', () => fail(badForm('send only the file')));
    bb.on('filesLimit', () => fail(badForm('send one file at a time')));
    bb.on('partsLimit', () => fail(badForm('send one file at a time')));
    bb.on('error', () =>
      fail(new AppError('validation_failed', 'The upload could not be read (the form data is malformed or was cut off).')),
    );
    bb.on('close', () => {
      if (settled) return;
      if (!result) return fail(badForm('file is required'));
      settled = true;
      resolve(result);
    });
    req.on('close', () => {
      if (!req.complete) fail(new AppError('validation_failed', 'The upload was interrupted before the whole file arrived.'));
    });
    req.pipe(bb);
  });
}
