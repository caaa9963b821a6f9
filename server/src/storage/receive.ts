import { createHash } from 'node:crypto';
import { createWriteStream, type WriteStream } from 'node:fs';
import { mkdtemp, rm } from 'node:fs/promises';
import { once } from 'node:events';
import os from 'node:os';
import path from 'node:path';
import type { Readable } from 'node:stream';
import type { Request } from 'express';
import busboy from 'busboy';
import { fileTypeFromBuffer } from 'file-type';
import type { z } from 'zod';
import { AppError, fromZod } from '../core/errors';

/** What one kind of upload accepts. */
export interface UploadRules {
  /** In bytes. */
  maxBytes: number;
  /** Said in the 413 message: "… limit for documents." */
  kindWords: string;
  /** Media types accepted, as file-type reports them from the bytes. */
  accept: readonly string[];
  /** The 415 sentence, naming what is accepted. */
  unsupportedMessage: string;
}

export interface ReceivedFile {
  /** A temporary file holding the bytes; removed by `cleanup`. */
  tempPath: string;
  size: number;
  sha256: string;
  /** Detected from the file's first bytes. */
  mediaType: string;
}

export interface Received<T> {
  fields: T;
  file: ReceivedFile;
  /** Removes the temporary file; always call it (in `finally`). */
  cleanup: () => Promise<void>;
}

/** file-type needs at most this many leading bytes to recognise the formats we accept. */
const SNIFF_BYTES = 4100;
/** Room for the text fields and multipart boundaries on top of the file itself. */
const ENVELOPE_BYTES = 64 * 1024;

/** 20 → "20", 0.05 MB → "0.05": as configured, without float noise. */
export const megabytes = (bytes: number) => String(Number((bytes / (1024 * 1024)).toFixed(2)));

const tooLarge = (rules: UploadRules) =>
  new AppError('payload_too_large', `The file is larger than the ${megabytes(rules.maxBytes)} MB limit for ${rules.kindWords}.`);
const badForm = (field: string, message: string, sentence: string) => new AppError('validation_failed', sentence, { [field]: [message] });

/**
 * Reads a multipart upload: the text fields first, then one file named `file`. The fields are
 * validated with `schema` and handed to `beforeFile` (the caller's permission checks) before a
 * single byte of the file is kept; the file's type is judged from its own first bytes, never its
 * name or the browser's claim; it is spooled to a temporary file while its size and SHA-256 are
 * counted. Any refusal removes what was written and lets the rest of the request drain, so the
 * client receives the answer instead of a broken connection.
 */
export async function receiveUpload<S extends z.ZodType>(
  req: Request,
  schema: S,
  rules: UploadRules,
  beforeFile: (fields: z.infer<S>) => Promise<void> = async () => undefined,
): Promise<Received<z.infer<S>>> {
  if (!req.is('multipart/form-data')) {
    throw new AppError(
      'unsupported_media_type',
      'Send the file as a multipart form (multipart/form-data), the text fields first and the file last.',
    );
  }
  const declared = Number(req.headers['content-length']);
  if (Number.isFinite(declared) && declared > rules.maxBytes + ENVELOPE_BYTES) throw tooLarge(rules);

  const tmpDir = await mkdtemp(path.join(os.tmpdir(), 'loadline-upload-'));
  const removeTemp = () => rm(tmpDir, { recursive: true, force: true });
  try {
    const result = await parse(req, schema, rules, beforeFile, path.join(tmpDir, 'upload'));
    return { ...result, cleanup: removeTemp };
  } catch (err) {
    await removeTemp();
    throw err;
  }
}

function parse<S extends z.ZodType>(
  req: Request,
  schema: S,
  rules: UploadRules,
  beforeFile: (fields: z.infer<S>) => Promise<void>,
  tempPath: string,
): Promise<{ fields: z.infer<S>; file: ReceivedFile }> {
  return new Promise((resolve, reject) => {
    let bb: busboy.Busboy;
    try {
      bb = busboy({
        headers: req.headers,
        limits: { files: 1, fields: 10, parts: 11, fieldSize: 2000, fileSize: rules.maxBytes + 1 },
      });
    } catch {
      reject(new AppError('unsupported_media_type', 'Send the file as a multipart form (multipart/form-data) with a boundary.'));
      return;
    }
    const raw: Record<string, string> = Object.create(null);
    let fileStream: Readable | null = null;
    let filework: Promise<ReceivedFile> | null = null;
    let settled = false;

    const fail = (err: unknown) => {
      if (settled) return;
      settled = true;
      // Stop parsing and let the rest of the body drain, so the refusal reaches the client.
      req.unpipe(bb);
      req.resume();
      fileStream?.destroy();
      // The temporary file is removed by the caller once the file work has let go of it.
      void (filework ?? Promise.resolve()).catch(() => undefined).then(() => reject(err));
    };
    const validate = (): z.infer<S> => {
      const result = schema.safeParse({ ...raw });
      if (!result.success) throw fromZod(result.error, 'body');
      return result.data;
    };

    bb.on('field', (name, value, info) => {
      if (fileStream) return fail(badForm(name, 'must come before the file', `Please check the form: send ${name} before the file.`));
      if (info.valueTruncated) return fail(badForm(name, 'is too long', `Please check the form: ${name} is too long.`));
      raw[name] = value;
    });
    bb.on('file', (name, stream) => {
      if (name !== 'file') {
        stream.resume();
        return fail(
          badForm(name, 'is not an accepted field', `Please check the form: ${name} is not an accepted field; send the file as "file".`),
        );
      }
      fileStream = stream;
      filework = (async () => {
        const fields = validate();
        await beforeFile(fields);
        return spool(stream, rules, tempPath);
      })();
      filework.catch(fail);
    });
    bb.on('filesLimit', () => fail(badForm('file', 'must be a single file', 'Please check the form: send one file at a time.')));
    bb.on('fieldsLimit', () => fail(new AppError('validation_failed', 'Please check the form: it has too many fields.')));
    bb.on('partsLimit', () => fail(new AppError('validation_failed', 'Please check the form: it has too many parts.')));
    bb.on('error', () =>
      fail(
        new AppError('validation_failed', 'The upload could not be read (the form data is malformed or was cut off). Please try again.'),
      ),
    );
    bb.on('close', () => {
      if (settled) return;
      if (!filework) {
        try {
          validate();
          fail(badForm('file', 'is required', 'Please check the form: file is required.'));
        } catch (err) {
          fail(err);
        }
        return;
      }
      filework.then((file) => {
        if (settled) return;
        settled = true;
        resolve({ fields: validate(), file });
      }, fail);
    });
    // A client that goes away mid-upload: stop, and leave nothing behind.
    req.on('close', () => {
      if (!req.complete) fail(new AppError('validation_failed', 'The upload was interrupted before the whole file arrived.'));
    });
    req.pipe(bb);
  });
}

/** Writes the file to `tempPath`, judging its type from the first bytes and counting size and hash. */
async function spool(stream: Readable, rules: UploadRules, tempPath: string): Promise<ReceivedFile> {
  const hash = createHash('sha256');
  const state: { out: WriteStream | null; mediaType: string | null; head: Buffer[]; headLength: number; size: number } = {
    out: null,
    mediaType: null,
    head: [],
    headLength: 0,
    size: 0,
  };
  const write = async (out: WriteStream, chunk: Buffer) => {
    if (!out.write(chunk)) await once(out, 'drain');
  };
  // Nothing touches the disk until the first bytes say the file is of an accepted type.
  const sniff = async (): Promise<WriteStream> => {
    const sample = Buffer.concat(state.head);
    const found = await fileTypeFromBuffer(sample.subarray(0, SNIFF_BYTES));
    if (!found || !rules.accept.includes(found.mime)) throw new AppError('unsupported_media_type', rules.unsupportedMessage);
    state.mediaType = found.mime;
    state.out = createWriteStream(tempPath, { flags: 'wx' });
    state.head = [];
    await write(state.out, sample);
    return state.out;
  };
  try {
    for await (const chunk of stream as AsyncIterable<Buffer>) {
      state.size += chunk.length;
      // busboy stops one byte past the limit, so crossing it is how an oversize file shows.
      if (state.size > rules.maxBytes) throw tooLarge(rules);
      hash.update(chunk);
      if (state.out) {
        await write(state.out, chunk);
        continue;
      }
      state.head.push(chunk);
      state.headLength += chunk.length;
      if (state.headLength >= SNIFF_BYTES) await sniff();
    }
    if (state.size === 0) throw badForm('file', 'is empty', 'Please check the form: the file is empty.');
    const out = state.out ?? (await sniff());
    out.end();
    await once(out, 'finish');
    return { tempPath, size: state.size, sha256: hash.digest('hex'), mediaType: state.mediaType! };
  } catch (err) {
    state.out?.destroy();
    stream.resume();
    throw err;
  }
}
