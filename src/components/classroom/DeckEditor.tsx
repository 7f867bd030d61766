/**
 * The deck editor island: the deck's title, its slides in order (each with its layout, title and
 * talking points), adding a slide from a machine's layout or a suggested start for a crop,
 * choosing two slides to compare, and the read-only share links.
 */
import { useId, useState } from 'react';
import { sendJson } from '~/components/shared/api';
import type { DeckEditorProps } from './editor-types';
import type { SlideRecord } from '~/lib/responses';
import { SharePanel } from './SharePanel';
import { SlideCard } from './SlideCard';
import { draftToSource, initialDraft, SourcePicker, type SourceDraft } from './SourcePicker';

export function DeckEditor(props: DeckEditorProps) {
  const { deck, families, catalogs, units, layoutChoices, crops } = props;
  const id = useId();
  const [title, setTitle] = useState(deck.title);
  const [savedTitle, setSavedTitle] = useState(deck.title);
  const [slides, setSlides] = useState<SlideRecord[]>(props.slides);
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const [announce, setAnnounce] = useState('');
  const [newTitle, setNewTitle] = useState('');
  const [newNotes, setNewNotes] = useState('');
  const [draft, setDraft] = useState<SourceDraft>(() => initialDraft(layoutChoices, families));
  const [pair, setPair] = useState<[string, string]>(() => [props.slides[0]?.id ?? '', props.slides[1]?.id ?? props.slides[0]?.id ?? '']);

  const act = async (what: () => Promise<void>) => {
    setBusy(true);
    setError(null);
    try {
      await what();
    } catch (err) {
      setError((err as Error).message);
    } finally {
      setBusy(false);
    }
  };

  const saveTitle = () =>
    act(async () => {
      const r = await sendJson<{ deck: { title: string } }>('PATCH', `/api/decks/${deck.id}`, { title });
      setSavedTitle(r.deck.title);
      setTitle(r.deck.title);
      setAnnounce('Deck title saved.');
    });

  const add = () =>
    act(async () => {
      const r = await sendJson<{ slide: SlideRecord }>('POST', `/api/decks/${deck.id}/slides`, {
        title: newTitle,
        notes: newNotes,
        ...draftToSource(draft),
      });
      const next = [...slides, r.slide];
      setSlides(next);
      setNewTitle('');
      setNewNotes('');
      setAnnounce(`Slide ${next.length} added: ${r.slide.title}.`);
    });

  const move = (index: number, delta: -1 | 1) =>
    act(async () => {
      const order = slides.map((s) => s.id);
      const [moved] = order.splice(index, 1);
      order.splice(index + delta, 0, moved!);
      const r = await sendJson<{ slides: SlideRecord[] }>('PUT', `/api/decks/${deck.id}/slides`, { order });
      setSlides(r.slides);
      setAnnounce(`Slide moved to position ${index + delta + 1}.`);
    });

  const remove = (slide: SlideRecord, index: number) => {
    if (!window.confirm(`Delete slide ${index + 1}, “${slide.title}”?`)) return;
    return act(async () => {
      await sendJson('DELETE', `/api/decks/${deck.id}/slides/${slide.id}`);
      setSlides((list) => list.filter((s) => s.id !== slide.id).map((s, i) => ({ ...s, position: i + 1 })));
      setAnnounce(`Slide “${slide.title}” deleted.`);
    });
  };

  const removeDeck = () => {
    if (!window.confirm(`Delete the deck “${savedTitle}” with all its slides and share links?`)) return;
    return act(async () => {
      await sendJson('DELETE', `/api/decks/${deck.id}`);
      window.location.assign('/classroom');
    });
  };

  const ids = slides.map((s) => s.id);
  const chosen: [string, string] = [
    ids.includes(pair[0]) ? pair[0] : (ids[0] ?? ''),
    ids.includes(pair[1]) ? pair[1] : (ids[1] ?? ids[0] ?? ''),
  ];
  const compareHref = chosen[0] && chosen[1] ? `/classroom/compare?a=slide:${chosen[0]}&b=slide:${chosen[1]}` : null;

  return (
    <div className="space-y-6">
      <p className="sr-only" role="status" aria-live="polite">
        {announce}
      </p>
      <div className="flex flex-wrap items-end gap-3">
        <div className="min-w-[18rem] flex-1">
          <label htmlFor={`${id}-title`} className="field-label">
            Deck title
          </label>
          <input
            id={`${id}-title`}
            className="field-input text-xl font-semibold"
            value={title}
            maxLength={120}
            onChange={(e) => setTitle(e.target.value)}
          />
        </div>
        <button type="button" className="btn" disabled={busy || title === savedTitle || !title.trim()} onClick={saveTitle}>
          Save title
        </button>
        {slides.length > 0 ? (
          <a className="btn-primary no-underline" href={`/classroom/${deck.id}/present`} data-testid="present-link">
            Present
          </a>
        ) : (
          <span className="text-sm text-ink-muted">Add a slide to present the deck.</span>
        )}
        <button type="button" className="btn-danger" disabled={busy} onClick={removeDeck}>
          Delete deck
        </button>
      </div>
      {error && (
        <p className="rounded-md border border-fit-line bg-fit-soft p-3 font-semibold text-fit" role="alert">
          {error}
        </p>
      )}

      <section aria-labelledby={`${id}-slides`}>
        <h2 id={`${id}-slides`}>
          Slides <span className="text-base font-normal text-ink-muted">({slides.length})</span>
        </h2>
        {slides.length === 0 ? (
          <p className="mt-2 text-ink-muted">No slides yet: add the first one below.</p>
        ) : (
          <ol className="mt-3 space-y-4" data-testid="slides">
            {slides.map((s, i) => (
              <SlideCard
                key={s.id}
                deckId={deck.id}
                slide={s}
                index={i}
                count={slides.length}
                busy={busy}
                families={families}
                catalogs={catalogs}
                units={units}
                layoutChoices={layoutChoices}
                crops={crops}
                onChanged={(u) => setSlides((list) => list.map((x) => (x.id === u.id ? u : x)))}
                onMove={(d) => move(i, d)}
                onDelete={() => remove(s, i)}
                onError={setError}
              />
            ))}
          </ol>
        )}
      </section>

      <section aria-labelledby={`${id}-add`} className="card space-y-3" data-testid="add-slide">
        <h2 id={`${id}-add`}>Add a slide</h2>
        <div>
          <label htmlFor={`${id}-new-title`} className="field-label">
            Slide title
          </label>
          <input
            id={`${id}-new-title`}
            className="field-input"
            value={newTitle}
            maxLength={160}
            onChange={(e) => setNewTitle(e.target.value)}
          />
        </div>
        <SourcePicker draft={draft} onChange={setDraft} choices={layoutChoices} families={families} crops={crops} />
        <div>
          <label htmlFor={`${id}-new-notes`} className="field-label">
            Talking points <span className="font-normal text-ink-muted">(markdown)</span>
          </label>
          <textarea
            id={`${id}-new-notes`}
            className="field-input font-mono text-sm"
            rows={4}
            value={newNotes}
            maxLength={10000}
            onChange={(e) => setNewNotes(e.target.value)}
          />
        </div>
        <button type="button" className="btn-primary" disabled={busy || !newTitle.trim()} onClick={add}>
          Add slide
        </button>
      </section>

      {slides.length >= 2 && (
        <section aria-labelledby={`${id}-cmp`} className="card space-y-3">
          <h2 id={`${id}-cmp`}>Compare two slides</h2>
          <div className="grid gap-3 sm:grid-cols-[1fr_1fr_auto] sm:items-end">
            {([0, 1] as const).map((k) => (
              <div key={k}>
                <label htmlFor={`${id}-cmp-${k}`} className="field-label">
                  {k === 0 ? 'Left (A)' : 'Right (B)'}
                </label>
                <select
                  id={`${id}-cmp-${k}`}
                  className="field-input"
                  value={chosen[k]}
                  onChange={(e) => setPair(k === 0 ? [e.target.value, chosen[1]] : [chosen[0], e.target.value])}
                >
                  {slides.map((s, i) => (
                    <option key={s.id} value={s.id}>
                      {i + 1}. {s.title}
                    </option>
                  ))}
                </select>
              </div>
            ))}
            {compareHref && (
              <a className="btn-primary no-underline" href={compareHref} data-testid="compare-link">
                Compare
              </a>
            )}
          </div>
        </section>
      )}

      <SharePanel deckId={deck.id} initial={props.links} locale={props.locale} />
    </div>
  );
}

export default DeckEditor;
