import { describe, expect, it } from 'vitest';
import { renderNotes, safeHref } from '~/lib/server/markdown';

const TAGS = new Set([
  'p',
  'br',
  'strong',
  'em',
  'del',
  'code',
  'pre',
  'ul',
  'ol',
  'li',
  'a',
  'blockquote',
  'h1',
  'h2',
  'h3',
  'h4',
  'h5',
  'h6',
  'hr',
  'table',
  'thead',
  'tbody',
  'tr',
  'th',
  'td',
  'input',
  'span',
]);
const ATTRS = new Set(['href', 'title', 'rel', 'align', 'type', 'checked', 'disabled', 'start', 'class']);

/** Every real tag in the output is one marked writes, with harmless attributes and link targets. */
function assertInert(html: string) {
  for (const m of html.matchAll(/<\/?([a-zA-Z][a-zA-Z0-9]*)([^>]*)>/g)) {
    const [, tag, rest] = m;
    expect(TAGS.has(tag!.toLowerCase()), `tag <${tag}>`).toBe(true);
    const attrs = [...rest!.matchAll(/\s([^\s=]+)(?:="([^"]*)")?/g)];
    // Whatever is left after the well-formed attributes would be a broken-out attribute.
    expect(rest!.replace(/\s([^\s=]+)(?:="([^"]*)")?/g, '').trim()).toBe('');
    for (const [, name, value] of attrs) {
      expect(ATTRS.has(name!.toLowerCase()), `attribute ${name}`).toBe(true);
      if (name === 'href') {
        const scheme = /^([a-z][a-z0-9+.-]*):/i.exec(value ?? '')?.[1]?.toLowerCase();
        expect(scheme === undefined || ['http', 'https', 'mailto'].includes(scheme), `href ${value}`).toBe(true);
        expect(value!.startsWith('//')).toBe(false);
      }
    }
  }
}

describe('renderNotes', () => {
  it('renders the markdown trainers write: lists, emphasis, links, code, tables', () => {
    const html = renderNotes(
      '**Fine-wire** up front\n\n- wheat\n- barley\n\n[Guide](https://example.org/g) and `CW-FW-L-04`\n\n| a | b |\n|---|---|\n| 1 | 2 |',
    );
    expect(html).toContain('<strong>Fine-wire</strong>');
    expect(html).toMatch(/<ul>\s*<li>wheat<\/li>\s*<li>barley<\/li>\s*<\/ul>/);
    expect(html).toContain('<a href="https://example.org/g" rel="noopener noreferrer nofollow">Guide</a>');
    expect(html).toContain('<code>CW-FW-L-04</code>');
    expect(html).toContain('<table>');
  });

  it('shows raw HTML as text instead of passing it through', () => {
    const html = renderNotes('<script>alert(1)</script>\n\nhello <img src=x onerror="alert(2)"> there <b onmouseover=alert(3)>b</b>');
    assertInert(html);
    expect(html).toContain('&lt;script&gt;alert(1)&lt;/script&gt;');
    expect(html).toContain('&lt;img src=x onerror=&quot;alert(2)&quot;&gt;');
    expect(html).toContain('&lt;b onmouseover=alert(3)&gt;');
  });

  it('drops dangerous link targets but keeps the words', () => {
    for (const target of [
      'javascript:alert(1)',
      'JaVaScRiPt:alert(1)',
      'java\tscript:alert(1)',
      'data:text/html;base64,PHNjcmlwdD4=',
      'vbscript:x',
      '//evil.example/x',
    ]) {
      const html = renderNotes(`[click me](${target})`);
      assertInert(html);
      expect(html).toContain('click me');
      expect(html).not.toContain('<a ');
    }
    const auto = renderNotes('<javascript:alert(1)>');
    assertInert(auto);
  });

  it('does not embed images, showing their alt text', () => {
    const html = renderNotes('![a cage](https://example.org/x.png "t") ![x](javascript:alert(1))');
    assertInert(html);
    expect(html).toContain('[a cage]');
  });

  it('escapes quotes in link titles and hrefs so attributes cannot be broken out of', () => {
    const html = renderNotes('[x](https://example.org/"onmouseover="alert(1) "a\\" onclick=\\"b")');
    assertInert(html);
  });

  it('keeps relative, mailto and fragment links', () => {
    expect(safeHref('/classroom')).toBe('/classroom');
    expect(safeHref('#slide-2')).toBe('#slide-2');
    expect(safeHref('mailto:parts@kestrel.example')).toBe('mailto:parts@kestrel.example');
    expect(safeHref(' javascript:alert(1)')).toBeNull();
  });
});

describe('the inertness check itself', () => {
  it('catches a live tag, an event attribute and a script link', () => {
    expect(() => assertInert('<p><img src="x" onerror="alert(1)"></p>')).toThrow();
    expect(() => assertInert('<p onclick="alert(1)">x</p>')).toThrow();
    expect(() => assertInert('<a href="javascript:alert(1)">x</a>')).toThrow();
    expect(() => assertInert('<a href="x" "onmouseover=y">x</a>')).toThrow();
  });
});
