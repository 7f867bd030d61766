/** One slide in the deck editor: title, talking points (markdown), its layout, order and removal. */
import { useId, useMemo, useState } from 'react';
import { CageDiagram } from '~/components/cage/CageDiagram';
import { checkLayout } from '~/lib/domain/rules';
import { sendJson } from '~/components/shared/api';
import type { DeckEditorProps } from './editor-types';
import type { SlideRecord } from '~/lib/responses';
import { draftToSource, initialDraft, SourcePicker, type SourceDraft } from './SourcePicker';
import { sourceWords } from './types';
import { countOf } from '~/lib/domain/words';

interface Props extends Pick<DeckEditorProps, 'families' | 'catalogs' | 'units' | 'layoutChoices' | 'crops'> {
  deckId: string;
  slide: SlideRecord;
  index: number;
  count: number;
  busy: boolean;
  onChanged: (s: SlideRecord) => void;
  onMove: (delta: -1 | 1) => void;
  onDelete: () => void;
  onError: (message: string) => void;
}

export function SlideCard(props: Props) {
  const { deckId, slide, index, count, families, catalogs, units, busy, onChanged, onMove, onDelete, onError } = props;
  const id = useId();
  const [title, setTitle] = useState(slide.title);
  const [notes, setNotes] = useState(slide.notes);
  const [saving, setSaving] = useState(false);
  const [savedNote, setSavedNote] = useState('');
  const [draft, setDraft] = useState<SourceDraft>(() => initialDraft(props.layoutChoices, families));
  const dirty = title !== slide.title || notes !== slide.notes;
  const familyId = slide.layout?.familyId;
  const family = familyId ? families[familyId] : undefined;
  const catalog = familyId ? catalogs[familyId] : undefined;
  const findings = useMemo(
    () => (family && catalog && slide.layout ? checkLayout(family, catalog, slide.layout) : []),
    [family, catalog, slide.layout],
  );

  const patch = async (body: Record<string, unknown>, what: string) => {
    setSaving(true);
    setSavedNote('');
    try {
      const { slide: updated } = await sendJson<{ slide: SlideRecord }>('PATCH', `/api/decks/${deckId}/slides/${slide.id}`, body);
      onChanged(updated);
      setTitle(updated.title);
      setNotes(updated.notes);
      setSavedNote(what);
    } catch (err) {
      onError((err as Error).message);
    } finally {
      setSaving(false);
    }
  };

  return (
    <li className="card" data-testid="slide-card" aria-labelledby={`${id}-h`}>
      <div className="flex flex-wrap items-start gap-4">
        <div className="w-full max-w-[360px] shrink-0">
          <h3 id={`${id}-h`} className="text-lg font-semibold">
            Slide {index + 1}
            <span className="sr-only">: {slide.title}</span>
          </h3>
          {family && catalog && slide.layout ? (
            <div className="mt-2 rounded border border-steel-200 bg-white p-1">
              <CageDiagram
                family={family}
                layout={slide.layout}
                catalog={catalog}
                findings={findings}
                units={units}
                compact
                title={`Cage diagram of slide ${index + 1}`}
              />
            </div>
          ) : (
            <p className="mt-2 rounded bg-steel-100 p-3 text-sm">No layout to show.</p>
          )}
          <p className="mt-1 text-sm text-ink-muted">
            {sourceWords({ ...slide, familyId: familyId ?? null, findings: [], settings: null }, families)}
          </p>
          <p className="text-sm text-ink-muted">{findings.length === 0 ? 'No findings' : countOf(findings.length, 'finding')}</p>
        </div>

        <div className="min-w-[18rem] flex-1 space-y-3">
          <div>
            <label htmlFor={`${id}-title`} className="field-label">
              Title
            </label>
            <input id={`${id}-title`} className="field-input" value={title} maxLength={160} onChange={(e) => setTitle(e.target.value)} />
          </div>
          <div>
            <label htmlFor={`${id}-notes`} className="field-label">
              Talking points <span className="font-normal text-ink-muted">(markdown: **bold**, *italic*, - lists, [links](https://…))</span>
            </label>
            <textarea
              id={`${id}-notes`}
              className="field-input font-mono text-sm"
              rows={6}
              value={notes}
              maxLength={10000}
              onChange={(e) => setNotes(e.target.value)}
            />
          </div>
          <div className="flex flex-wrap items-center gap-2">
            <button
              type="button"
              className="btn-primary"
              disabled={!dirty || saving || !title.trim()}
              onClick={() => patch({ title, notes }, 'Saved.')}
            >
              Save slide
            </button>
            <button
              type="button"
              className="btn"
              disabled={index === 0 || busy}
              onClick={() => onMove(-1)}
              aria-label={`Move slide ${index + 1} up`}
            >
              ↑ Up
            </button>
            <button
              type="button"
              className="btn"
              disabled={index === count - 1 || busy}
              onClick={() => onMove(1)}
              aria-label={`Move slide ${index + 1} down`}
            >
              ↓ Down
            </button>
            <button type="button" className="btn-danger" disabled={busy} onClick={onDelete} aria-label={`Delete slide ${index + 1}`}>
              Delete
            </button>
            <span role="status" className="text-sm text-ok">
              {savedNote}
            </span>
          </div>
          {slide.notesHtml && (
            <details>
              <summary className="cursor-pointer text-sm font-semibold text-ink-soft">
                Talking points as the class and the presenter see them
              </summary>
              <div
                className="notes mt-2 rounded border border-steel-200 bg-steel-50 p-3"
                data-testid="notes-preview"
                dangerouslySetInnerHTML={{ __html: slide.notesHtml }}
              />
            </details>
          )}
          <details>
            <summary className="cursor-pointer text-sm font-semibold text-ink-soft">Show a different layout on this slide</summary>
            <div className="mt-2 space-y-2">
              <SourcePicker draft={draft} onChange={setDraft} choices={props.layoutChoices} families={families} crops={props.crops} />
              <button type="button" className="btn" disabled={saving} onClick={() => patch(draftToSource(draft), 'Layout changed.')}>
                Use this layout
              </button>
            </div>
          </details>
        </div>
      </div>
    </li>
  );
}
