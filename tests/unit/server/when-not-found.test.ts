import { describe, expect, it } from 'vitest';
import { HttpError, notFound, whenNotFound } from '~/lib/server/http';

describe('whenNotFound: only the 404 it means is turned into another answer', () => {
  const replace = whenNotFound(() => new HttpError(400, 'version: this layout has no version 9', 'version'));

  it('a 404 from the lookup becomes the named error', async () => {
    await expect(Promise.reject(notFound('Version not found')).catch(replace)).rejects.toMatchObject({ status: 400, field: 'version' });
  });

  it('a database outage is passed on as it is (answered as a 500 and logged, never as "not found")', async () => {
    const outage = new Error('connection terminated unexpectedly');
    await expect(Promise.reject(outage).catch(replace)).rejects.toBe(outage);
  });

  it('another HTTP error (a 403, say) is passed on too', async () => {
    const refused = new HttpError(403, 'no');
    await expect(Promise.reject(refused).catch(replace)).rejects.toBe(refused);
  });
});
