import { Auth } from '@auth/core';
import authConfig from '../../../../auth.config';

/**
 * Asks Auth.js for a CSRF token for our own sign-in and sign-out forms, forwarding the
 * cookie it sets so the form posts back with a matching pair. Works without JavaScript.
 */
export async function csrfToken(request: Request, responseHeaders: Headers): Promise<string> {
  const url = new URL('/api/auth/csrf', request.url);
  const res = await Auth(new Request(url, { headers: request.headers }), authConfig);
  for (const cookie of res.headers.getSetCookie()) responseHeaders.append('set-cookie', cookie);
  const body = (await res.json()) as { csrfToken?: string };
  return body.csrfToken ?? '';
}
