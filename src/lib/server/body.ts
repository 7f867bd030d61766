/**
 * Reads a request body with a cap, refusing as it streams: a declared length over the cap is
 * refused before anything is read, and reading stops as soon as the bytes received pass it, so an
 * oversized body never sits in memory whole. The stream is left unread rather than cancelled
 * (cancelling destroys the socket before the refusal could be sent); once the 413 is sent,
 * `scripts/start.mjs` drops the rest of the upload and closes the connection if it keeps coming.
 */
export class BodyTooLarge extends Error {
  constructor(readonly limit: number) {
    super(`The body is larger than ${limit} bytes.`);
  }
}

export function declaredTooLarge(request: Request, limit: number): boolean {
  const declared = Number(request.headers.get('content-length') ?? NaN);
  return Number.isFinite(declared) && declared > limit;
}

export async function readCapped(request: Request, limit: number): Promise<Uint8Array<ArrayBuffer>> {
  if (declaredTooLarge(request, limit)) throw new BodyTooLarge(limit);
  if (!request.body) return new Uint8Array();
  const reader = request.body.getReader();
  const chunks: Uint8Array[] = [];
  let total = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    total += value.byteLength;
    if (total > limit) {
      chunks.length = 0;
      reader.releaseLock();
      throw new BodyTooLarge(limit);
    }
    chunks.push(value);
  }
  const out = new Uint8Array(total);
  let at = 0;
  for (const c of chunks) {
    out.set(c, at);
    at += c.byteLength;
  }
  return out;
}
