/**
 * The reader's locale for dates, numbers and money on server-rendered pages: the first language
 * of the browser's Accept-Language that this runtime supports, else DEFAULT_LOCALE. Never throws
 * on what a client sends. E-mails and files use DEFAULT_LOCALE (their reader is someone else).
 */
import { localeFromAcceptLanguage } from '~/lib/domain/format';

export function requestLocale(request: Request): string {
  return localeFromAcceptLanguage(request.headers.get('accept-language')?.slice(0, 200));
}
