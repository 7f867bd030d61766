import { describe, expect, it } from 'vitest';
import { checkedPhoto, DEFAULT_MAX_PHOTO_PIXELS, maxPhotoPixels } from '~/lib/server/services/photos';
import { HttpError } from '~/lib/server/http';
import { hugePng } from '../../integration/fixtures/images';

describe('photo checks before decoding', () => {
  it('the pixel limit is 40 megapixels unless CAGEWRIGHT_MAX_PHOTO_PIXELS says otherwise', () => {
    expect(DEFAULT_MAX_PHOTO_PIXELS).toBe(40_000_000);
    expect(maxPhotoPixels({})).toBe(40_000_000);
    expect(maxPhotoPixels({ CAGEWRIGHT_MAX_PHOTO_PIXELS: '12000000' })).toBe(12_000_000);
    for (const bad of ['', 'lots', '-5', '0', '1.5']) expect(maxPhotoPixels({ CAGEWRIGHT_MAX_PHOTO_PIXELS: bad })).toBe(40_000_000);
  });

  it('refuses 16000 × 16000 under the default limit from the header alone, in milliseconds', async () => {
    const started = performance.now();
    const err = await checkedPhoto(hugePng(16000, 16000)).catch((e) => e);
    expect(err).toBeInstanceOf(HttpError);
    expect([err.status, err.field]).toEqual([413, 'photo']);
    expect(performance.now() - started).toBeLessThan(1000);
  });

  it('compares width × height with the limit', async () => {
    await expect(checkedPhoto(hugePng(101, 100), 10_000)).rejects.toMatchObject({ status: 413, field: 'photo' });
    await expect(checkedPhoto(hugePng(100, 100), 10_000)).resolves.toMatchObject({ width: 100, height: 100, type: 'image/png' });
  });
});
