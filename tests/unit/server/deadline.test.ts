import { describe, expect, it } from 'vitest';
import { createServer } from 'node:net';
import { envMs, ServiceUnavailableError, withDeadline } from '~/lib/server/deadline';
import { s3Storage } from '~/lib/server/storage/s3';

describe('withDeadline', () => {
  it('gives the value when the work ends in time, and clears its timer', async () => {
    await expect(
      withDeadline(
        1_000,
        () => new Error('late'),
        async () => 7,
      ),
    ).resolves.toBe(7);
  });

  it('ends work that never settles at the deadline with the deadline’s error, and aborts its signal', async () => {
    let signal: AbortSignal | undefined;
    const t0 = Date.now();
    await expect(
      withDeadline(
        150,
        () => new ServiceUnavailableError('mail server', 'no answer', true),
        (s) => {
          signal = s;
          return new Promise(() => {});
        },
      ),
    ).rejects.toMatchObject({ service: 'mail server', timedOut: true });
    expect(Date.now() - t0).toBeGreaterThanOrEqual(140);
    expect(signal?.aborted).toBe(true);
  });

  it('the deadline’s error wins over the error the abort makes the work throw', async () => {
    const work = (s: AbortSignal) => new Promise<never>((_, reject) => s.addEventListener('abort', () => reject(new Error('aborted'))));
    await expect(withDeadline(50, () => new Error('deadline'), work)).rejects.toThrow('deadline');
  });
});

describe('envMs', () => {
  it('reads positive numbers and ignores the rest', () => {
    expect(envMs('X', 5, { X: '250' })).toBe(250);
    for (const bad of ['', ' ', 'soon', '-1', '0', 'NaN']) expect(envMs('X', 5, { X: bad })).toBe(5);
    expect(envMs('X', 5, {})).toBe(5);
  });
});

describe('the S3 backend against a store that accepts and never answers', () => {
  it('put, get and delete end after the configured deadline as ServiceUnavailableError', async () => {
    const held: import('node:net').Socket[] = [];
    const silent = createServer((s) => {
      held.push(s);
      s.pause();
    });
    await new Promise<void>((r) => silent.listen(0, '127.0.0.1', () => r()));
    const { port } = silent.address() as { port: number };
    process.env.AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED = 'true';
    const store = s3Storage({
      endpoint: `http://127.0.0.1:${port}`,
      bucket: 'b',
      region: 'us-east-1',
      accessKeyId: 'k',
      secretAccessKey: 's',
      timeoutMs: 400,
      connectTimeoutMs: 200,
    });
    try {
      for (const call of [
        () => store.put('inspections/a/b.jpg', new Uint8Array([1]), 'image/jpeg'),
        () => store.get('inspections/a/b.jpg'),
        () => store.delete('inspections/a/b.jpg'),
      ]) {
        const t0 = Date.now();
        const err = await call().then(
          () => null,
          (e: unknown) => e,
        );
        expect(err).toBeInstanceOf(ServiceUnavailableError);
        expect((err as ServiceUnavailableError).service).toBe('object store');
        expect(Date.now() - t0).toBeLessThan(5_000);
      }
    } finally {
      for (const s of held) s.destroy();
      silent.close();
    }
  });
});
