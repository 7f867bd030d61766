/** The checklist island's photo upload (the rest goes through ../shared/api). */
import { sendForm } from '~/components/shared/api';

export async function sendPhoto<T>(path: string, file: File): Promise<T> {
  const form = new FormData();
  form.set('photo', file, file.name || 'photo.jpg');
  return sendForm<T>(path, form);
}
