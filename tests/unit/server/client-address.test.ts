import { describe, expect, it } from 'vitest';
import { clientAddress, trustedProxies } from '../../../scripts/serve-app.mjs';

describe('client address (scripts/serve-app.mjs)', () => {
  const none = trustedProxies({});
  const proxy = trustedProxies({ CAGEWRIGHT_TRUSTED_PROXIES: '10.0.0.2, ::ffff:10.0.0.3' });

  it('is the socket peer, whatever X-Forwarded-For says, unless the peer is a trusted proxy', () => {
    expect(clientAddress('203.0.113.5', '198.51.100.1', none)).toBe('203.0.113.5');
    expect(clientAddress('::ffff:203.0.113.5', undefined, none)).toBe('203.0.113.5');
    expect(clientAddress('203.0.113.5', '198.51.100.1', proxy)).toBe('203.0.113.5');
  });

  it('behind trusted proxies, takes the nearest untrusted hop from the right', () => {
    // A client may put anything on the left; the proxy appends the peer it saw.
    expect(clientAddress('10.0.0.2', 'spoofed, 198.51.100.1', proxy)).toBe('198.51.100.1');
    expect(clientAddress('10.0.0.2', '198.51.100.1, 10.0.0.3', proxy)).toBe('198.51.100.1');
    expect(clientAddress('10.0.0.2', undefined, proxy)).toBe('10.0.0.2');
  });
});
