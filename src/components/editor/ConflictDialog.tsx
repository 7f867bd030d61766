/**
 * Someone saved this layout while it was open here. Show their version and offer two ways on,
 * neither losing anything: load theirs (these edits stay one Undo away), or save these edits
 * as a new layout on the same machine.
 */
import { useEffect, useRef, useState } from 'react';
import { checkLayout } from '~/lib/domain/rules';
import { CageDiagram } from '~/components/cage/CageDiagram';
import { useEditor, useEditorStoreApi } from './store/context';
import { countOf } from '~/lib/domain/words';
import { cropNoun } from '~/lib/domain/vocabulary';
import { formatDateTime } from '~/lib/domain/format';

export function ConflictDialog() {
  const store = useEditorStoreApi();
  const conflict = useEditor((s) => s.conflict);
  const family = useEditor((s) => s.family);
  const catalog = useEditor((s) => s.catalog);
  const units = useEditor((s) => s.units);
  const layoutName = useEditor((s) => s.layoutName);
  const saving = useEditor((s) => s.saveState === 'saving');
  const error = useEditor((s) => s.saveError);
  const machineId = useEditor((s) => s.machineId);
  const ref = useRef<HTMLDialogElement>(null);
  const [name, setName] = useState('');

  useEffect(() => {
    const d = ref.current;
    if (!d) return;
    if (conflict && !d.open) {
      setName(`${layoutName} (my copy)`);
      d.showModal();
    } else if (!conflict && d.open) d.close();
  }, [conflict, layoutName]);

  if (!conflict) return <dialog ref={ref} />;
  const v = conflict.current;
  const when = new Date(v.createdAt);
  const theirs = checkLayout(family, catalog, v.body);

  return (
    <dialog
      ref={ref}
      aria-labelledby="conflict-h"
      className="w-[min(960px,94vw)] rounded-lg border border-steel-300 p-0 shadow-xl backdrop:bg-steel-900/50"
      onCancel={(e) => {
        e.preventDefault();
        store.getState().dismissConflict();
      }}
      data-testid="conflict-dialog"
    >
      <div className="p-4">
        <h2 id="conflict-h" className="text-lg font-bold">
          Someone saved a newer version
        </h2>
        <p className="mt-1 text-sm text-ink-soft">
          Version {v.version} was saved{v.createdByName ? ` by ${v.createdByName}` : ''} on {formatDateTime(when)}
          {v.note ? <> with the note “{v.note}”</> : null} while you were editing. Your edits are not saved yet, and nothing is lost
          whichever you choose.
        </p>
        <figure className="mt-3 rounded-md border border-steel-200 p-2">
          <CageDiagram
            family={family}
            layout={v.body}
            catalog={catalog}
            findings={theirs}
            units={units}
            compact
            endView={false}
            title={`Version ${v.version}, as saved`}
            className="max-h-[38vh]"
          />
          <figcaption className="mt-1 text-xs text-ink-muted">
            Version {v.version}: {cropNoun(v.body.crop)}, {v.body.rotorRpm} rpm, {countOf(theirs.length, 'finding')}.
          </figcaption>
        </figure>
        <div className="mt-4 grid gap-4 md:grid-cols-2">
          <div className="rounded-md border border-steel-200 p-3">
            <h3 className="font-semibold">Load version {v.version}</h3>
            <p className="mt-1 text-sm text-ink-soft">
              Continue from their version. Your edits stay in the undo history: Undo brings them back.
            </p>
            <button type="button" className="btn mt-2" onClick={() => store.getState().reloadNewer()} disabled={saving}>
              Load version {v.version}
            </button>
          </div>
          <form
            className="rounded-md border border-steel-200 p-3"
            onSubmit={async (e) => {
              e.preventDefault();
              const id = await store.getState().saveAsCopy(name.trim() || `${layoutName} (my copy)`);
              if (id) window.location.assign(`/machines/${machineId}/layouts/${id}`);
            }}
          >
            <h3 className="font-semibold">Save mine as a copy</h3>
            <label className="mt-1 block text-sm">
              <span className="text-ink-soft">Name of the new layout</span>
              <input
                className="field-input py-1.5 text-sm"
                value={name}
                maxLength={120}
                onChange={(e) => setName(e.target.value)}
                required
              />
            </label>
            <button type="submit" className="btn-primary mt-2" disabled={saving}>
              Save as a new layout
            </button>
          </form>
        </div>
        <p className="mt-3 text-sm">
          <button type="button" className="text-iris-700 underline" onClick={() => store.getState().dismissConflict()}>
            Decide later
          </button>{' '}
          <span className="text-ink-muted">— keep editing; saving again will ask again.</span>
        </p>
        {error && (
          <p role="alert" className="field-error mt-3">
            {error}
          </p>
        )}
      </div>
    </dialog>
  );
}
