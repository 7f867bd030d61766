import { DeleteObjectCommand, GetObjectCommand, NoSuchKey, PutObjectCommand, S3Client, S3ServiceException } from '@aws-sdk/client-s3';
import { assertKey, type ObjectStorage, type StoredObject } from './types';

export interface S3Settings {
  endpoint: string;
  bucket: string;
  region: string;
  accessKeyId?: string;
  secretAccessKey?: string;
}

/**
 * An S3-compatible bucket (path-style URLs, so local fakes and self-hosted stores work).
 * Checksums only where the protocol requires them: several S3-compatible stores reject the
 * SDK's newer default trailing checksums.
 */
export function s3Storage(settings: S3Settings): ObjectStorage {
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
  });
  const Bucket = settings.bucket;
  return {
    kind: 's3',
    where: `s3://${Bucket} at ${settings.endpoint}`,
    async put(key, bytes, contentType) {
      assertKey(key);
      await client.send(new PutObjectCommand({ Bucket, Key: key, Body: bytes, ContentType: contentType, ContentLength: bytes.byteLength }));
    },
    async get(key): Promise<StoredObject | null> {
      assertKey(key);
      try {
        const out = await client.send(new GetObjectCommand({ Bucket, Key: key }));
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
      await client.send(new DeleteObjectCommand({ Bucket, Key: key }));
    },
  };
}
