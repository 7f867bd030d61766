import type { ZodType } from 'zod';
import { HttpError, refuseUnstorable } from './http';
import { BodyTooLarge, readCapped } from './body';

/**
 * Plain HTML forms posted to Astro pages (they work without JavaScript): read the fields,
 * validate them with the same zod schema the API uses, and hand back per-field messages.
 */
export type FieldErrors = Record<string, string>;

export type FormResult<T> = { ok: true; data: T } | { ok: false; errors: FieldErrors; values: Record<string, string> };

const MAX_FORM_BYTES = 100_000;

/**
 * The posted form, read with a cap as it streams (413 past MAX_FORM_BYTES, whatever the declared
 * length), with every field name and text value checked for characters the store cannot keep
 * (400 naming the field). Pages use this instead of `request.formData()`.
 */
export async function readFormData(request: Request): Promise<FormData> {
  const type = request.headers.get('content-type') ?? '';
  if (!/application\/x-www-form-urlencoded|multipart\/form-data/i.test(type))
    throw new HttpError(415, 'Send the form as a form.', 'content-type');
  let bytes: Uint8Array<ArrayBuffer>;
  try {
    bytes = await readCapped(request, MAX_FORM_BYTES);
  } catch (err) {
    if (err instanceof BodyTooLarge) throw new HttpError(413, 'The form is too large.', 'body');
    throw new HttpError(400, 'The form could not be read.', 'body');
  }
  let form: FormData;
  try {
    form = await new Response(bytes, { headers: { 'content-type': type } }).formData();
  } catch {
    throw new HttpError(400, 'The form could not be read.', 'body');
  }
  for (const [k, v] of form.entries()) refuseUnstorable({ [k]: typeof v === 'string' ? v : '' });
  return form;
}

/** The posted fields as strings; blank optional fields become absent. */
export async function readForm(request: Request): Promise<Record<string, string>> {
  const form = await readFormData(request);
  const out: Record<string, string> = {};
  for (const [k, v] of form.entries()) if (typeof v === 'string') out[k] = v;
  return out;
}

export function validate<T>(values: Record<string, unknown>, schema: ZodType<T>): FormResult<T> {
  const parsed = schema.safeParse(values);
  if (parsed.success) return { ok: true, data: parsed.data };
  const errors: FieldErrors = {};
  for (const issue of parsed.error.issues) {
    const key = issue.path.join('.') || '_form';
    errors[key] ??= issue.message;
  }
  return { ok: false, errors, values: Object.fromEntries(Object.entries(values).map(([k, v]) => [k, v == null ? '' : String(v)])) };
}

/** Turns an HttpError from a service into a field message on the form (other errors propagate). */
export function errorsFrom(err: unknown): { status: number; errors: FieldErrors } {
  if (err instanceof HttpError) {
    const field = err.field ?? '_form';
    const message = err.message.startsWith(`${field}: `) ? err.message.slice(field.length + 2) : err.message;
    return { status: err.status, errors: { [field]: message } };
  }
  throw err;
}

/** Drops blank strings so optional fields read as absent. */
export function withoutBlanks(values: Record<string, string>): Record<string, string> {
  return Object.fromEntries(Object.entries(values).filter(([, v]) => v.trim() !== ''));
}
