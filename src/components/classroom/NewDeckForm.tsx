/** Creates a deck and opens it for editing. */
import { useState, type FormEvent } from 'react';
import { sendJson } from '~/components/shared/api';

export function NewDeckForm() {
  const [title, setTitle] = useState('');
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const submit = async (e: FormEvent) => {
    e.preventDefault();
    setBusy(true);
    setError(null);
    try {
      const body = await sendJson<{ deck: { id: string } }>('POST', '/api/decks', { title });
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
