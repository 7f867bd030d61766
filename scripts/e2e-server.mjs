#!/usr/bin/env node
// The server the browser tests talk to: a fresh data directory each run, then the usual start.
import { rmSync } from 'node:fs';
import { resolve } from 'node:path';

const dir = resolve(process.env.CAGEWRIGHT_DATA_DIR ?? `.data-e2e-${process.env.PORT ?? '4391'}`);
rmSync(dir, { recursive: true, force: true });
process.env.CAGEWRIGHT_DATA_DIR = dir;
process.env.AUTH_SECRET ??= 'e2e-test-secret-not-for-production-0123456789';
process.env.CAGEWRIGHT_BCRYPT_ROUNDS ??= '4';
await import('./start.mjs');
