/** The bar above the drawing: undo, redo, remove, save with a note, and where the layout stands. */
import { commandById, keyLabel, runCommand, type CommandId } from './commands';
import { isDirty } from './store/create-editor-store';
import { useEditor, useEditorLazy, useEditorStoreApi } from './store/context';

const isMac = () => typeof navigator !== 'undefined' && /Mac|iPhone|iPad/.test(navigator.platform);

function CommandButton({ id, primary = false, icon }: { id: CommandId; primary?: boolean; icon?: string }) {
  const store = useEditorStoreApi();
  const cmd = commandById(id);
  // Follows the state and the undo history, just after an edit's own commit.
  const enabled = useEditorLazy((s, h) => cmd.enabled(s, h));
  const shortcut = cmd.keys[0] ? keyLabel(cmd.keys[0], isMac()) : '';
  return (
    <button
      type="button"
      className={primary ? 'btn-primary' : 'btn'}
      disabled={!enabled}
      onClick={() => runCommand(store, id)}
      title={shortcut ? `${cmd.label} (${shortcut})` : cmd.label}
      aria-keyshortcuts={cmd.keys.map((k) => k.replace('Mod', isMac() ? 'Meta' : 'Control')).join(' ')}
      data-command={id}
    >
      {icon && <span aria-hidden="true">{icon}</span>}
      {cmd.label}
    </button>
  );
}

/** The note saved with the next version; its own component so edits elsewhere leave the input alone. */
function NoteField() {
  const store = useEditorStoreApi();
  const note = useEditor((s) => s.draftNote);
  return (
    <label className="flex items-center gap-2 text-sm">
      <span className="text-ink-soft">Note</span>
      <input
        className="w-48 rounded-md border-steel-300 py-1 text-sm lg:w-64"
        value={note}
        maxLength={500}
        onChange={(e) => store.getState().setDraftNote(e.target.value)}
        placeholder="What changed (optional)"
        data-testid="save-note"
      />
    </label>
  );
}

export function Toolbar() {
  const canEdit = useEditor((s) => s.canEdit);
  const dirty = useEditorLazy(isDirty);
  const saveState = useEditorLazy((s) => s.saveState);
  const saveError = useEditorLazy((s) => s.saveError);
  const baseVersion = useEditorLazy((s) => s.baseVersion);

  const status = !canEdit
    ? `Version ${baseVersion} · read only`
    : saveState === 'saving'
      ? 'Saving…'
      : dirty
        ? `Unsaved changes (from version ${baseVersion})`
        : saveState === 'saved'
          ? `Saved · version ${baseVersion}`
          : `Version ${baseVersion} · no changes`;

  return (
    <div
      className="flex flex-wrap items-center gap-2 rounded-lg border border-steel-200 bg-white px-3 py-2 shadow-sm"
      role="toolbar"
      aria-label="Layout"
    >
      {canEdit && (
        <>
          <CommandButton id="undo" icon="↶" />
          <CommandButton id="redo" icon="↷" />
          <CommandButton id="remove" />
          <span className="mx-1 h-6 w-px bg-steel-200" aria-hidden="true" />
          <NoteField />
          <CommandButton id="save" primary />
        </>
      )}
      <p className="ml-auto text-sm" data-testid="save-status">
        <span className={dirty ? 'font-semibold text-crop' : 'text-ink-muted'}>
          {dirty && <span aria-hidden="true">● </span>}
          {status}
        </span>
      </p>
      {saveError && saveState === 'error' && (
        <p role="alert" className="w-full text-sm font-semibold text-fit">
          {saveError}
        </p>
      )}
    </div>
  );
}
