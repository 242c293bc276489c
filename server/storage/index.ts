/**
 * Object storage over the S3 API: put, get (as a stream) and delete, nothing more. A deployment
 * points S3_ENDPOINT/S3_BUCKET/keys at real object storage; `npm start` and the tests point them
 * at a local fake (s3rver). Every failure to reach the store becomes one 503 the caller may
 * retry, so routes never answer 500 because the store is away.
 */
import type { Readable } from 'node:stream';

import {
  DeleteObjectCommand,
  GetObjectCommand,
  PutObjectCommand,
  S3Client,
} from '@aws-sdk/client-s3';

import { RetryLaterError } from '../errors';

export interface StorageConfig {
  /** Absent: the provider's default endpoint for the region. */
  endpoint?: string;
  bucket: string;
  accessKeyId: string;
  secretAccessKey: string;
  region: string;
  /** Tries per request (the SDK retries network errors and 5xx); default 3. */
  maxAttempts?: number;
}

export interface StoredObject {
  body: Readable;
  contentType: string;
  bytes: number | undefined;
}

export interface Storage {
  /** A stream needs its length in `bytes` (S3 wants Content-Length up front). */
  put(key: string, body: Buffer | Readable, contentType: string, bytes?: number): Promise<void>;
  /** Null when no object has that key. */
  get(key: string): Promise<StoredObject | null>;
  /** Deleting a missing key is not an error (S3 answers 204 for it too). */
  delete(key: string): Promise<void>;
}

export class StorageUnavailableError extends RetryLaterError {
  constructor(cause: unknown) {
    super('storage_unavailable', 'Photo storage is unavailable right now; try again shortly.', 30);
    this.cause = cause;
  }
}

function isNotFound(err: unknown): boolean {
  const e = err as { name?: string; $metadata?: { httpStatusCode?: number } };
  return e?.name === 'NoSuchKey' || e?.$metadata?.httpStatusCode === 404;
}

export function createS3Storage(config: StorageConfig): Storage {
  const client = new S3Client({
    endpoint: config.endpoint,
    region: config.region,
    credentials: { accessKeyId: config.accessKeyId, secretAccessKey: config.secretAccessKey },
    // Path-style (endpoint/bucket/key) works with every S3-compatible store and the local fake;
    // virtual-host buckets need DNS per bucket.
    forcePathStyle: true,
    // Newer SDKs add CRC checksums with chunked trailers by default; stores that do not speak
    // them (the local fake among them) would keep the chunk framing inside the object.
    requestChecksumCalculation: 'WHEN_REQUIRED',
    responseChecksumValidation: 'WHEN_REQUIRED',
    maxAttempts: config.maxAttempts ?? 3,
    // A store that does not answer must not hold an upload forever.
    requestHandler: { connectionTimeout: 3_000, requestTimeout: 20_000 },
  });
  const Bucket = config.bucket;

  return {
    async put(key, body, contentType, bytes) {
      try {
        await client.send(
          new PutObjectCommand({
            Bucket,
            Key: key,
            Body: body,
            ContentType: contentType,
            ContentLength: Buffer.isBuffer(body) ? body.length : bytes,
          }),
        );
      } catch (err) {
        throw new StorageUnavailableError(err);
      }
    },
    async get(key) {
      try {
        const out = await client.send(new GetObjectCommand({ Bucket, Key: key }));
        if (!out.Body) return null;
        return {
          body: out.Body as Readable,
          contentType: out.ContentType ?? 'application/octet-stream',
          bytes: out.ContentLength,
        };
      } catch (err) {
        if (isNotFound(err)) return null;
        throw new StorageUnavailableError(err);
      }
    },
    async delete(key) {
      try {
        await client.send(new DeleteObjectCommand({ Bucket, Key: key }));
      } catch (err) {
        if (isNotFound(err)) return;
        throw new StorageUnavailableError(err);
      }
    },
  };
}
