import {
  DeleteObjectCommand,
  GetObjectCommand,
  ListObjectsV2Command,
  NoSuchKey,
  PutObjectCommand,
  S3Client,
  S3ServiceException,
} from '@aws-sdk/client-s3';
import { ServiceUnavailableError, withDeadline } from '~/lib/server/deadline';
import { assertKey, type ObjectStorage, type StoredObject } from './types';

export interface S3Settings {
  endpoint: string;
  bucket: string;
  region: string;
  accessKeyId?: string;
  secretAccessKey?: string;
  /** Milliseconds to open a connection (S3_CONNECT_TIMEOUT_MS, default 5 s). */
  connectTimeoutMs?: number;
  /** Milliseconds for a whole call, retries included (S3_TIMEOUT_MS, default 30 s). */
  timeoutMs?: number;
}

export const S3_CONNECT_TIMEOUT_MS = 5_000;
export const S3_TIMEOUT_MS = 30_000;

/**
 * An S3-compatible bucket (path-style URLs, so local fakes and self-hosted stores work).
 * Checksums only where the protocol requires them: several S3-compatible stores reject the
 * SDK's newer default trailing checksums.
 *
 * Every call has a connect timeout and a total deadline (retries included); a socket that goes
 * quiet for the whole deadline is dropped too, which also bounds a photo being streamed out.
 * Failures come out as ServiceUnavailableError, so callers can tell the user the store is away.
 */
export function s3Storage(settings: S3Settings): ObjectStorage {
  const connectTimeout = settings.connectTimeoutMs ?? S3_CONNECT_TIMEOUT_MS;
  const total = settings.timeoutMs ?? S3_TIMEOUT_MS;
  const client = new S3Client({
    endpoint: settings.endpoint,
    region: settings.region,
    forcePathStyle: true,
    credentials:
      settings.accessKeyId && settings.secretAccessKey
        ? { accessKeyId: settings.accessKeyId, secretAccessKey: settings.secretAccessKey }
        : undefined,
    requestChecksumCalculation: 'WHEN_REQUIRED',
    responseChecksumValidation: 'WHEN_REQUIRED',
    requestHandler: { connectionTimeout: connectTimeout, requestTimeout: total, throwOnRequestTimeout: true },
  });
  const Bucket = settings.bucket;

  /** One call to the bucket within the deadline; anything but an S3 answer becomes "unavailable". */
  const call = <T>(what: string, run: (abortSignal: AbortSignal) => Promise<T>): Promise<T> =>
    withDeadline(
      total,
      () => new ServiceUnavailableError('object store', `The object store did not answer within ${total} ms (${what}).`, true),
      run,
    ).catch((err: unknown) => {
      if (err instanceof ServiceUnavailableError || err instanceof S3ServiceException) throw err;
      throw new ServiceUnavailableError(
        'object store',
        `The object store could not be reached (${what}): ${err instanceof Error ? err.message : String(err)}`,
        false,
        {
          cause: err,
        },
      );
    });

  return {
    kind: 's3',
    where: `s3://${Bucket} at ${settings.endpoint}`,
    async put(key, bytes, contentType) {
      assertKey(key);
      await call(`put ${key}`, (abortSignal) =>
        client.send(new PutObjectCommand({ Bucket, Key: key, Body: bytes, ContentType: contentType, ContentLength: bytes.byteLength }), {
          abortSignal,
        }),
      );
    },
    async get(key): Promise<StoredObject | null> {
      assertKey(key);
      try {
        const out = await call(`get ${key}`, (abortSignal) => client.send(new GetObjectCommand({ Bucket, Key: key }), { abortSignal }));
        if (!out.Body) return null;
        return {
          contentType: out.ContentType ?? 'application/octet-stream',
          size: out.ContentLength ?? null,
          body: out.Body.transformToWebStream() as ReadableStream<Uint8Array>,
        };
      } catch (err) {
        if (err instanceof NoSuchKey || (err instanceof S3ServiceException && err.$metadata.httpStatusCode === 404)) return null;
        throw err;
      }
    },
    async delete(key) {
      assertKey(key);
      await call(`delete ${key}`, (abortSignal) => client.send(new DeleteObjectCommand({ Bucket, Key: key }), { abortSignal }));
    },
    async *list(prefix) {
      let ContinuationToken: string | undefined;
      do {
        const page = await call(`list ${prefix}`, (abortSignal) =>
          client.send(new ListObjectsV2Command({ Bucket, Prefix: prefix, ContinuationToken }), { abortSignal }),
        );
        for (const o of page.Contents ?? []) if (o.Key) yield { key: o.Key, lastModified: o.LastModified ?? new Date(0) };
        ContinuationToken = page.IsTruncated ? page.NextContinuationToken : undefined;
      } while (ContinuationToken);
    },
  };
}
