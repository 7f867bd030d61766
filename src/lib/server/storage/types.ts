/** Where uploaded files (inspection photos and their thumbnails) are kept. */
export interface StoredObject {
  contentType: string;
  /** Length in bytes, when the backend knows it before reading. */
  size: number | null;
  body: ReadableStream<Uint8Array>;
}

export interface ObjectStorage {
  readonly kind: 's3' | 'disk';
  /** Human-readable location for logs ("s3://bucket at http://…", "/data/uploads"). */
  readonly where: string;
  put(key: string, bytes: Uint8Array, contentType: string): Promise<void>;
  /** The object, or null when there is none under the key. */
  get(key: string): Promise<StoredObject | null>;
  /** Removes the object; removing a missing key is not an error. */
  delete(key: string): Promise<void>;
  /** Every object whose key starts with `prefix`, with when it was last written. */
  list(prefix: string): AsyncIterable<ListedObject>;
}

export interface ListedObject {
  key: string;
  lastModified: Date;
}

/**
 * Keys are ours (built from ids), but check them anyway: lower-case path segments of letters,
 * digits, dots, dashes and underscores, no empty or dot-only segment, so a key can never climb
 * out of the disk backend's folder.
 */
export function assertKey(key: string): void {
  const ok = key.length > 0 && key.length <= 512 && key.split('/').every((seg) => /^[a-z0-9._-]+$/.test(seg) && !/^\.+$/.test(seg));
  if (!ok) throw new Error(`storage: refusing the key ${JSON.stringify(key)}`);
}

export async function readAll(obj: StoredObject): Promise<Uint8Array> {
  return new Uint8Array(await new Response(obj.body).arrayBuffer());
}
