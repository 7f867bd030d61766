/**
 * Talking points are markdown written by trainers and shown to anyone a deck is shared with, so
 * they are rendered on the server into a small, safe subset of HTML:
 *  - raw HTML in the source (blocks and inline tags) is shown as text, never passed through;
 *  - links keep only http(s), mailto and same-site addresses; anything else (javascript:, data:,
 *    vbscript:, protocol-relative //host) becomes plain text;
 *  - images are not embedded (the page's content policy would block outside ones anyway); their
 *    alt text is shown instead;
 *  - every attribute marked writes is escaped.
 * No DOM is needed, so the same function serves pages, API responses and tests.
 */
import { Marked, type Tokens } from 'marked';

const ESCAPES: Record<string, string> = { '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' };
export const escapeHtml = (s: string) => s.replace(/[&<>"']/g, (c) => ESCAPES[c]!);

/** A link target we are willing to write into an href, or null. */
export function safeHref(raw: string): string | null {
  // Browsers ignore tabs, newlines and leading control characters inside a scheme.
  // eslint-disable-next-line no-control-regex
  const href = raw.replace(/[\u0000-\u0020\u007f-\u009f]/g, '');
  if (href === '') return null;
  if (/^(https?:|mailto:)/i.test(href)) return href;
  if (href.startsWith('//')) return null;
  if (/^[a-z][a-z0-9+.-]*:/i.test(href)) return null; // any other scheme
  if (/^[/#?]/.test(href) || /^[\w.-]/.test(href)) return href; // relative
  return null;
}

const marked = new Marked({
  gfm: true,
  breaks: true,
  async: false,
  renderer: {
    html(token: Tokens.HTML | Tokens.Tag) {
      const text = escapeHtml(token.text);
      return token.type === 'html' && token.block ? `<p>${text}</p>\n` : text;
    },
    link(token: Tokens.Link) {
      const inner = this.parser.parseInline(token.tokens);
      const href = safeHref(token.href);
      if (!href) return inner;
      const title = token.title ? ` title="${escapeHtml(token.title)}"` : '';
      const external = /^https?:/i.test(href) ? ' rel="noopener noreferrer nofollow"' : '';
      return `<a href="${escapeHtml(href)}"${title}${external}>${inner}</a>`;
    },
    image(token: Tokens.Image) {
      return token.text ? `<span class="md-image-alt">[${escapeHtml(token.text)}]</span>` : '';
    },
  },
});

const MAX_SOURCE = 20_000;

/** Markdown → safe HTML (see the file comment). */
export function renderNotes(markdown: string): string {
  const source = markdown.length > MAX_SOURCE ? markdown.slice(0, MAX_SOURCE) : markdown;
  return marked.parse(source) as string;
}
