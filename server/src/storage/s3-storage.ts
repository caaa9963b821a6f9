import type { Readable } from 'node:stream';
import { DeleteObjectCommand, GetObjectCommand, HeadObjectCommand, PutObjectCommand, S3Client } from '@aws-sdk/client-s3';
import { assertKey, type ByteRange, type ObjectStorage } from './storage';

export interface S3Options {
  bucket: string;
  region: string;
  /** For S3-compatible services other than AWS (and the local fake in tests). */
  endpoint?: string;
  credentials?: { accessKeyId: string; secretAccessKey: string };
  forcePathStyle?: boolean;
}

/** Objects in one bucket through the S3 API. */
export class S3Storage implements ObjectStorage {
  readonly kind = 's3' as const;
  readonly client: S3Client;
  readonly bucket: string;

  constructor(opts: S3Options) {
    this.bucket = opts.bucket;
    this.client = new S3Client({
      region: opts.region,
      endpoint: opts.endpoint,
      credentials: opts.credentials,
      forcePathStyle: opts.forcePathStyle,
      // Recent SDKs add CRC checksums to every request by default; S3-compatible servers that
      // predate them (the local fake among them) refuse or mangle such uploads. Only when required.
      requestChecksumCalculation: 'WHEN_REQUIRED',
      responseChecksumValidation: 'WHEN_REQUIRED',
    });
  }

  async put(key: string, body: Readable, meta: { size: number; contentType: string }): Promise<void> {
    assertKey(key);
    // A single PUT is atomic in S3: a failed upload leaves no object under the key. The SDK does not
    // notice a source stream that fails part-way (the request would hang), so that aborts it.
    const abort = new AbortController();
    let failure: unknown = null;
    const onError = (err: unknown) => {
      failure = err;
      abort.abort();
    };
    body.once('error', onError);
    try {
      await this.client.send(
        new PutObjectCommand({ Bucket: this.bucket, Key: key, Body: body, ContentLength: meta.size, ContentType: meta.contentType }),
        { abortSignal: abort.signal },
      );
    } catch (err) {
      throw failure ?? err;
    } finally {
      body.off('error', onError);
    }
  }

  async get(key: string, range?: ByteRange): Promise<Readable> {
    assertKey(key);
    const out = await this.client.send(
      new GetObjectCommand({ Bucket: this.bucket, Key: key, Range: range ? `bytes=${range.start}-${range.end}` : undefined }),
    );
    return out.Body as Readable;
  }

  async delete(key: string): Promise<void> {
    assertKey(key);
    await this.client.send(new DeleteObjectCommand({ Bucket: this.bucket, Key: key }));
  }

  async exists(key: string): Promise<boolean> {
    assertKey(key);
    try {
      await this.client.send(new HeadObjectCommand({ Bucket: this.bucket, Key: key }));
      return true;
    } catch (err) {
      const status = (err as { $metadata?: { httpStatusCode?: number } }).$metadata?.httpStatusCode;
      if (status === 404) return false;
      throw err;
    }
  }
}
