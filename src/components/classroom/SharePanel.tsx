/** Read-only links to the deck: create one (shown once, with its address), list and revoke. */
import { useId, useState } from 'react';
import { sendJson } from '~/components/shared/api';
import type { ShareLinkRow } from './editor-types';
import { formatDate } from '~/lib/domain/format';

const STATUS_WORDS = { active: 'Active', revoked: 'Revoked', expired: 'Expired' } as const;

export function SharePanel({ deckId, initial, locale }: { deckId: string; initial: ShareLinkRow[]; locale?: string }) {
  const id = useId();
  // In the reader's locale, the same on the server and in the browser (no hydration mismatch).
  const date = (s: string) => formatDate(s, { locale });
  const [links, setLinks] = useState(initial);
  const [label, setLabel] = useState('');
  const [until, setUntil] = useState('');
  const [fresh, setFresh] = useState<string | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [copied, setCopied] = useState(false);

  const reload = async () => setLinks((await sendJson<{ links: ShareLinkRow[] }>('GET', `/api/decks/${deckId}/share`)).links);

  const create = async () => {
    setError(null);
    setCopied(false);
    try {
      // A date picked here means "until the end of that day" in the viewer's time zone.
      const expiresAt = until ? new Date(`${until}T23:59:59`).toISOString() : null;
      const r = await sendJson<{ path: string }>('POST', `/api/decks/${deckId}/share`, { label, expiresAt });
      setFresh(new URL(r.path, window.location.origin).toString());
      setLabel('');
      setUntil('');
      await reload();
    } catch (err) {
      setError((err as Error).message);
    }
  };

  const revoke = async (linkId?: string) => {
    setError(null);
    try {
      await sendJson('DELETE', `/api/decks/${deckId}/share${linkId ? `?link=${linkId}` : ''}`);
      setFresh(null);
      await reload();
    } catch (err) {
      setError((err as Error).message);
    }
  };

  const copy = async () => {
    if (!fresh) return;
    try {
      await navigator.clipboard.writeText(fresh);
      setCopied(true);
    } catch {
      setCopied(false);
    }
  };

  const active = links.filter((l) => l.status === 'active');
  return (
    <section aria-labelledby={`${id}-h`} className="card space-y-3" data-testid="share-panel">
      <h2 id={`${id}-h`}>Share read-only</h2>
      <p className="text-sm text-ink-muted">
        Anyone with the link can view the deck without signing in, but cannot change it. Revoke a link to close it.
      </p>
      <div className="grid gap-2 sm:grid-cols-[1fr_auto_auto] sm:items-end">
        <div>
          <label htmlFor={`${id}-label`} className="field-label">
            Label (for you)
          </label>
          <input
            id={`${id}-label`}
            className="field-input"
            value={label}
            maxLength={120}
            onChange={(e) => setLabel(e.target.value)}
            placeholder="e.g. Spring class"
          />
        </div>
        <div>
          <label htmlFor={`${id}-until`} className="field-label">
            Valid until (optional)
          </label>
          <input id={`${id}-until`} type="date" className="field-input" value={until} onChange={(e) => setUntil(e.target.value)} />
          {until && (
            <span className="mt-1 block text-xs text-ink-muted" data-testid="share-until-words">
              Open until the end of {formatDate(`${until}T12:00:00`, { locale, month: 'long' })}
            </span>
          )}
        </div>
        <button type="button" className="btn-primary" onClick={create}>
          Create link
        </button>
      </div>
      {error && (
        <p className="field-error" role="alert">
          {error}
        </p>
      )}
      {fresh && (
        <div className="rounded-md border border-ok bg-ok-soft p-3 text-sm" role="status">
          <p className="font-semibold">New link — copy it now; it is shown only this once:</p>
          <p className="mt-1 flex flex-wrap items-center gap-2">
            <a href={fresh} className="break-all font-mono" data-testid="share-url" target="_blank" rel="noreferrer">
              {fresh}
            </a>
            <button type="button" className="btn" onClick={copy}>
              {copied ? 'Copied' : 'Copy'}
            </button>
          </p>
        </div>
      )}
      {links.length > 0 && (
        <ul className="divide-y divide-steel-100 text-sm" data-testid="share-links">
          {links.map((l) => (
            <li key={l.id} className="flex flex-wrap items-center justify-between gap-2 py-2">
              <span>
                <span className="font-semibold">{l.label || 'Link'}</span> · made {date(l.createdAt)}
                {l.expiresAt && ` · until ${date(l.expiresAt)}`} ·{' '}
                <span className={l.status === 'active' ? 'font-semibold text-ok' : 'text-ink-muted'}>{STATUS_WORDS[l.status]}</span>
              </span>
              {l.status === 'active' && (
                <button type="button" className="btn-danger" onClick={() => revoke(l.id)}>
                  Revoke
                </button>
              )}
            </li>
          ))}
        </ul>
      )}
      {active.length > 1 && (
        <button type="button" className="btn-danger" onClick={() => revoke()}>
          Revoke all {active.length} active links
        </button>
      )}
    </section>
  );
}
