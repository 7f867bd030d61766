/** Creates a deck and opens it for editing. */
import { useState, type FormEvent } from 'react';

export function NewDeckForm() {
  const [title, setTitle] = useState('');
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const submit = async (e: FormEvent) => {
    e.preventDefault();
    setBusy(true);
    setError(null);
    try {
      const res = await fetch('/api/decks', { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ title }) });
      const body = await res.json();
      if (!res.ok) throw new Error(body?.error?.message ?? 'The deck was not created.');
      window.location.assign(`/classroom/${body.deck.id}`);
    } catch (err) {
      setError((err as Error).message);
      setBusy(false);
    }
  };
  return (
    <form onSubmit={submit} className="flex flex-wrap items-end gap-3" noValidate>
      <div className="min-w-[16rem] flex-1">
        <label htmlFor="deck-title" className="field-label">
          Title of the new deck
        </label>
        <input
          id="deck-title"
          className="field-input"
          value={title}
          maxLength={120}
          onChange={(e) => setTitle(e.target.value)}
          aria-invalid={error ? true : undefined}
          aria-describedby={error ? 'deck-title-error' : undefined}
          placeholder="e.g. Corn and soybeans on the split cage"
        />
        {error && (
          <p id="deck-title-error" className="field-error" role="alert">
            {error}
          </p>
        )}
      </div>
      <button type="submit" className="btn-primary" disabled={busy}>
        Create deck
      </button>
    </form>
  );
}

export default NewDeckForm;
