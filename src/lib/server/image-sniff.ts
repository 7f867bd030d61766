/**
 * What an uploaded file really is, from its first bytes (never from its name or the type the
 * browser claims). Only the photo formats phones and browsers produce and every browser shows.
 */
export type ImageType = 'image/jpeg' | 'image/png' | 'image/webp';

export const IMAGE_EXTENSION: Readonly<Record<ImageType, string>> = {
  'image/jpeg': 'jpg',
  'image/png': 'png',
  'image/webp': 'webp',
};

const startsWith = (b: Uint8Array, sig: readonly number[], at = 0) => b.length >= at + sig.length && sig.every((x, i) => b[at + i] === x);

export function sniffImageType(bytes: Uint8Array): ImageType | null {
  // JPEG: start-of-image marker followed by the next marker's 0xFF.
  if (startsWith(bytes, [0xff, 0xd8, 0xff])) return 'image/jpeg';
  // PNG: the eight-byte signature.
  if (startsWith(bytes, [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a])) return 'image/png';
  // WebP: a RIFF container whose form type is WEBP.
  if (startsWith(bytes, [0x52, 0x49, 0x46, 0x46]) && startsWith(bytes, [0x57, 0x45, 0x42, 0x50], 8)) return 'image/webp';
  return null;
}
