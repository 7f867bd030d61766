// A local S3-compatible object store for development and tests (s3rver), so uploads go through
// the same SDK calls as in production. It listens on a free port on 127.0.0.1, keeps its files
// under <data dir>/s3 and creates the bucket. Never expose it: it accepts a fixed demo key.
import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import { createRequire } from 'node:module';

const require = createRequire(import.meta.url);

/** The fixed key pair the fake accepts (development only). */
export const FAKE_S3_KEY = 'S3RVER';

/**
 * Starts the fake on a free port and points this process at it through the usual variables
 * (S3_ENDPOINT, S3_BUCKET, S3_ACCESS_KEY_ID, S3_SECRET_ACCESS_KEY, S3_REGION) unless told not to.
 * Resolves to { endpoint, bucket, directory, stop }.
 * @param {{ dataDir: string, bucket?: string, port?: number, setEnv?: boolean }} options
 * @returns {Promise<{ endpoint: string, bucket: string, directory: string, stop: () => Promise<void> }>}
 */
export async function startFakeS3({ dataDir, bucket = 'cagewright-photos', port = 0, setEnv = true }) {
  if (!dataDir) throw new Error('startFakeS3: give the data directory');
  const S3rver = require('s3rver');
  const directory = join(dataDir, 's3');
  mkdirSync(directory, { recursive: true });
  const server = new S3rver({
    address: '127.0.0.1',
    port,
    silent: true,
    directory,
    configureBuckets: [{ name: bucket }],
    // Path-style URLs only: the app's client uses forcePathStyle.
    vhostBuckets: false,
  });
  const { port: actual } = await server.run();
  const endpoint = `http://127.0.0.1:${actual}`;
  if (setEnv) {
    process.env.S3_ENDPOINT = endpoint;
    process.env.S3_BUCKET = bucket;
    process.env.S3_ACCESS_KEY_ID = FAKE_S3_KEY;
    process.env.S3_SECRET_ACCESS_KEY = FAKE_S3_KEY;
    process.env.S3_REGION ??= 'us-east-1';
  }
  return { endpoint, bucket, directory, stop: () => server.close() };
}
