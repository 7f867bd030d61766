import { join } from 'node:path';
import { dataDir } from '~/lib/server/db';
import { diskStorage } from './disk';
import { envMs } from '~/lib/server/deadline';
import { S3_CONNECT_TIMEOUT_MS, S3_TIMEOUT_MS, s3Storage } from './s3';
import type { ObjectStorage } from './types';

export type { ObjectStorage, StoredObject } from './types';
export { readAll } from './types';

/**
 * The storage backend, chosen from the environment once per process:
 * - CAGEWRIGHT_STORAGE=disk forces files under <data dir>/uploads;
 * - S3_ENDPOINT and S3_BUCKET (with S3_ACCESS_KEY_ID / S3_SECRET_ACCESS_KEY, S3_REGION) select
 *   an S3-compatible bucket; `npm start` starts a local fake and sets these when none is given;
 *   S3_CONNECT_TIMEOUT_MS (default 5000) and S3_TIMEOUT_MS (a whole call, default 30000) bound
 *   every call to it;
 * - otherwise files under <data dir>/uploads.
 */
export function storageFromEnv(env: NodeJS.ProcessEnv = process.env): ObjectStorage {
  if (env.CAGEWRIGHT_STORAGE !== 'disk' && env.S3_ENDPOINT && env.S3_BUCKET) {
    // The SDK warns on every start that future versions need a newer Node; the app runs on 20.
    env.AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED ??= 'true';
    return s3Storage({
      endpoint: env.S3_ENDPOINT,
      bucket: env.S3_BUCKET,
      region: env.S3_REGION ?? 'us-east-1',
      accessKeyId: env.S3_ACCESS_KEY_ID,
      secretAccessKey: env.S3_SECRET_ACCESS_KEY,
      connectTimeoutMs: envMs('S3_CONNECT_TIMEOUT_MS', S3_CONNECT_TIMEOUT_MS, env),
      timeoutMs: envMs('S3_TIMEOUT_MS', S3_TIMEOUT_MS, env),
    });
  }
  return diskStorage(join(dataDir(), 'uploads'));
}

// Configuration, not per-user state: one backend for the whole process.
const holder = globalThis as unknown as { __cagewrightStorage?: ObjectStorage };

export function storage(): ObjectStorage {
  holder.__cagewrightStorage ??= storageFromEnv();
  return holder.__cagewrightStorage;
}
