import { inject } from 'vitest';

/**
 * A tiny HTTP client for the integration tests: keeps cookies like a browser would and sends
 * an Origin header (Astro's origin check refuses form posts without one).
 */
export class Client {
  private cookies = new Map<string, string>();
  constructor(readonly baseUrl: string = inject('baseUrl')) {}

  private cookieHeader() {
    return [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ');
  }

  private keep(res: Response) {
    for (const c of res.headers.getSetCookie()) {
      const [pair] = c.split(';');
      const i = pair!.indexOf('=');
      const name = pair!.slice(0, i).trim();
      const value = pair!.slice(i + 1);
      if (/max-age=0|expires=thu, 01 jan 1970/i.test(c) || value === '') this.cookies.delete(name);
      else this.cookies.set(name, value);
    }
  }

  /** Another client holding the same cookies (an old cookie kept by someone), optionally for another server. */
  copy(baseUrl = this.baseUrl): Client {
    const c = new Client(baseUrl);
    c.cookies = new Map(this.cookies);
    return c;
  }

  hasSession() {
    return [...this.cookies.keys()].some((k) => k.includes('session-token'));
  }

  async fetch(path: string, init: RequestInit = {}): Promise<Response> {
    const headers = new Headers(init.headers);
    headers.set('origin', this.baseUrl);
    if (this.cookies.size) headers.set('cookie', this.cookieHeader());
    const res = await fetch(this.baseUrl + path, { ...init, headers, redirect: 'manual' });
    this.keep(res);
    return res;
  }

  async json<T = any>(method: string, path: string, body?: unknown): Promise<{ status: number; body: T }> {
    const res = await this.fetch(path, {
      method,
      headers: body === undefined ? {} : { 'content-type': 'application/json' },
      body: body === undefined ? undefined : JSON.stringify(body),
    });
    const text = await res.text();
    let parsed: any = null;
    try {
      parsed = text ? JSON.parse(text) : null;
    } catch {
      parsed = text;
    }
    return { status: res.status, body: parsed };
  }

  get = <T = any>(path: string) => this.json<T>('GET', path);
  post = <T = any>(path: string, body?: unknown) => this.json<T>('POST', path, body);
  put = <T = any>(path: string, body?: unknown) => this.json<T>('PUT', path, body);
  patch = <T = any>(path: string, body?: unknown) => this.json<T>('PATCH', path, body);
  delete = <T = any>(path: string) => this.json<T>('DELETE', path);

  /** Signs out through Auth.js's sign-out endpoint, as our /signout form does. */
  async signOut(): Promise<Response> {
    const { csrfToken } = (await (await this.fetch('/api/auth/csrf')).json()) as { csrfToken: string };
    const form = new URLSearchParams({ csrfToken, callbackUrl: '/signin' });
    return this.fetch('/api/auth/signout', {
      method: 'POST',
      headers: { 'content-type': 'application/x-www-form-urlencoded' },
      body: form.toString(),
    });
  }

  /** Signs in through Auth.js's credentials callback, as our sign-in form does. */
  async signIn(email: string, password = DEMO_PASSWORD, headers: Record<string, string> = {}): Promise<Response> {
    const csrfRes = await this.fetch('/api/auth/csrf');
    const { csrfToken } = (await csrfRes.json()) as { csrfToken: string };
    const form = new URLSearchParams({ csrfToken, email, password, callbackUrl: '/' });
    return this.fetch('/api/auth/callback/credentials', {
      method: 'POST',
      headers: { 'content-type': 'application/x-www-form-urlencoded', ...headers },
      body: form.toString(),
    });
  }
}

export const DEMO_PASSWORD = 'cage-demo-2026';

export const DEMO = {
  operator: 'olive@larkspur.example',
  operator2: 'dev@haldane.example',
  technician: 'tomas@kestrel.example',
  trainer: 'priya@kestrel.example',
  dealerAdmin: 'admin@kestrel.example',
  instanceAdmin: 'noor@cagewright.example',
} as const;

export async function signedIn(who: keyof typeof DEMO): Promise<Client> {
  const c = new Client();
  const res = await c.signIn(DEMO[who]);
  if (!c.hasSession()) throw new Error(`sign-in as ${who} failed: ${res.status} ${res.headers.get('location')}`);
  return c;
}

/**
 * The first machine on the user's home page that has a saved layout, with that layout. Other
 * tests add machines (without layouts) to the same store, so "the first machine" is not enough.
 */
export async function machineWithLayout(c: Client): Promise<{ machineId: string; layout: { id: string; [k: string]: unknown } }> {
  const html = await (await c.fetch('/')).text();
  const ids = [...new Set([...html.matchAll(/href="\/machines\/([0-9a-f-]{36})"/g)].map((m) => m[1]!))];
  for (const machineId of ids) {
    const list = await c.get(`/api/machines/${machineId}/layouts`);
    if (list.status === 200 && list.body.layouts?.length) return { machineId, layout: list.body.layouts[list.body.layouts.length - 1] };
  }
  throw new Error('no machine with a saved layout on the home page');
}
