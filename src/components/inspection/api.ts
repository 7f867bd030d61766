/** The checklist island's calls to the API; failures carry the server's own message. */
export class ApiError extends Error {
  constructor(
    message: string,
    readonly status: number,
    readonly field?: string,
  ) {
    super(message);
  }
}

async function answer<T>(res: Response): Promise<T> {
  const text = await res.text();
  let data: any = null;
  try {
    data = text ? JSON.parse(text) : null;
  } catch {
    data = null;
  }
  if (!res.ok) throw new ApiError(data?.error?.message ?? `The server answered ${res.status}.`, res.status, data?.error?.field);
  return data as T;
}

export async function sendJson<T>(method: string, path: string, body: unknown): Promise<T> {
  return answer<T>(await fetch(path, { method, headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) }));
}

export async function sendPhoto<T>(path: string, file: File): Promise<T> {
  const form = new FormData();
  form.set('photo', file, file.name || 'photo.jpg');
  return answer<T>(await fetch(path, { method: 'POST', body: form }));
}

export async function remove<T>(path: string): Promise<T> {
  return answer<T>(await fetch(path, { method: 'DELETE' }));
}
