/**
 * The islands' calls to the API (same origin, session cookie): JSON in, JSON out. A failure
 * throws ApiError with the server's message and, when it names one, the field.
 */
export class ApiError extends Error {
  constructor(
    message: string,
    readonly status: number,
    readonly field?: string,
  ) {
    super(message);
  }
}

/** The body of an answer, or ApiError for a status that is not 2xx. */
export async function answer<T>(res: Response): Promise<T> {
  const text = await res.text();
  let data: { error?: { message?: string; field?: string } } | null = null;
  try {
    data = text ? JSON.parse(text) : null;
  } catch {
    data = null;
  }
  if (!res.ok) throw new ApiError(data?.error?.message ?? `The server answered ${res.status}.`, res.status, data?.error?.field);
  return data as T;
}

export async function getJson<T>(url: string, signal?: AbortSignal): Promise<T> {
  return answer<T>(await fetch(url, { headers: { accept: 'application/json' }, signal, credentials: 'same-origin' }));
}

/** Any method; the body, when there is one, is sent as JSON. */
export async function sendJson<T = unknown>(method: string, url: string, payload?: unknown): Promise<T> {
  return answer<T>(
    await fetch(url, {
      method,
      credentials: 'same-origin',
      headers: payload === undefined ? { accept: 'application/json' } : { 'content-type': 'application/json', accept: 'application/json' },
      body: payload === undefined ? undefined : JSON.stringify(payload),
    }),
  );
}

/** A multipart form (uploads). */
export async function sendForm<T>(url: string, form: FormData): Promise<T> {
  return answer<T>(await fetch(url, { method: 'POST', body: form, credentials: 'same-origin' }));
}
