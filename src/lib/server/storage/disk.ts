import { createReadStream } from 'node:fs';
import { mkdir, readdir, readFile, rename, rm, stat, writeFile } from 'node:fs/promises';
import { dirname, join, relative, resolve, sep } from 'node:path';
import { Readable } from 'node:stream';
import { randomBytes } from 'node:crypto';
import { assertKey, type ObjectStorage, type StoredObject } from './types';

/**
 * Files under one folder: the object at `<root>/<key>`, its content type in `<key>.type` beside
 * it. Writes go to a temporary name first and are renamed into place, so a reader never sees
 * half a file.
 */
export function diskStorage(root: string): ObjectStorage {
  const base = resolve(root);
  const pathOf = (key: string) => {
    assertKey(key);
    return join(base, ...key.split('/'));
  };
  const writeAtomic = async (path: string, data: Uint8Array | string) => {
    const tmp = `${path}.${randomBytes(6).toString('hex')}.part`;
    await writeFile(tmp, data);
    await rename(tmp, path);
  };
  return {
    kind: 'disk',
    where: base,
    async put(key, bytes, contentType) {
      const path = pathOf(key);
      await mkdir(dirname(path), { recursive: true });
      await writeAtomic(`${path}.type`, contentType);
      await writeAtomic(path, bytes);
    },
    async get(key): Promise<StoredObject | null> {
      const path = pathOf(key);
      let size: number;
      try {
        size = (await stat(path)).size;
      } catch {
        return null;
      }
      const contentType = (await readFile(`${path}.type`, 'utf8').catch(() => 'application/octet-stream')).trim();
      const body = Readable.toWeb(createReadStream(path)) as unknown as ReadableStream<Uint8Array>;
      return { contentType, size, body };
    },
    async delete(key) {
      const path = pathOf(key);
      await rm(path, { force: true });
      await rm(`${path}.type`, { force: true });
    },
    async *list(prefix) {
      // Walk the folder; type files and half-written temporaries are not objects.
      const walk = async function* (dir: string): AsyncGenerator<{ key: string; lastModified: Date }> {
        let entries;
        try {
          entries = await readdir(dir, { withFileTypes: true });
        } catch {
          return;
        }
        for (const e of entries) {
          const full = join(dir, e.name);
          if (e.isDirectory()) yield* walk(full);
          else if (e.isFile() && !e.name.endsWith('.type') && !e.name.endsWith('.part')) {
            const key = relative(base, full).split(sep).join('/');
            if (!key.startsWith(prefix)) continue;
            try {
              yield { key, lastModified: (await stat(full)).mtime };
            } catch {
              /* removed meanwhile */
            }
          }
        }
      };
      yield* walk(base);
    },
  };
}
