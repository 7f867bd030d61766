/**
 * For public read-only pages (shared layouts and decks): refuses every method but GET/HEAD with
 * a 405, and marks the answer not to be indexed or cached. Returns the refusal to send, or null.
 */
export function readOnlyPage(request: Request, headers: Headers): Response | null {
  if (request.method !== 'GET' && request.method !== 'HEAD') {
    return new Response('This is a read-only link; nothing can be changed through it.', {
      status: 405,
      headers: { allow: 'GET, HEAD', 'content-type': 'text/plain; charset=utf-8', 'x-robots-tag': 'noindex, nofollow' },
    });
  }
  headers.set('x-robots-tag', 'noindex, nofollow');
  headers.set('cache-control', 'no-store');
  return null;
}
