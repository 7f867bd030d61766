/** Undo and redo (zundo's temporal store), and saving versions with conflict handling. */
import type { EditorDeps, EditorInit, EditorSliceCreator, EditorStoreApi, HistorySlice } from './types';
import { countOf } from '~/lib/domain/words';

export const createHistorySlice =
  (init: EditorInit, deps: EditorDeps): EditorSliceCreator<HistorySlice> =>
  (set, get, api) => {
    const store = api as unknown as EditorStoreApi;
    return {
      layoutId: init.layoutId,
      layoutName: init.layoutName,
      machineId: init.machineId,
      machineName: init.machineName,
      canEdit: init.canEdit,
      baseVersion: init.baseVersion,
      savedLayout: init.layout,
      saveState: 'idle',
      saveError: null,
      conflict: null,
      draftNote: '',

      setDraftNote(note) {
        set({ draftNote: note });
      },

      undo() {
        const t = store.temporal.getState();
        if (t.pastStates.length === 0) return get().announce('Nothing to undo.');
        t.undo();
        set({ activeFinding: null, highlightPlaces: [] });
        get().announce(`Undone. ${countOf(get().findings.length, 'finding')} in the layout.`);
      },

      redo() {
        const t = store.temporal.getState();
        if (t.futureStates.length === 0) return get().announce('Nothing to redo.');
        t.redo();
        set({ activeFinding: null, highlightPlaces: [] });
        get().announce(`Redone. ${countOf(get().findings.length, 'finding')} in the layout.`);
      },

      async save() {
        const s = get();
        const note = s.draftNote.trim();
        if (!s.canEdit || s.saveState === 'saving') return s.saveState;
        const body = s.layout;
        set({ saveState: 'saving', saveError: null });
        const result = await deps.api.saveVersion(s.layoutId, { baseVersion: s.baseVersion, body, note });
        if (result.ok) {
          set({ saveState: 'saved', baseVersion: result.version.version, savedLayout: body, draftNote: '' });
          get().announce(`Saved as version ${result.version.version}.`);
          return 'saved';
        }
        if ('conflict' in result) {
          set({ saveState: 'conflict', conflict: { current: result.conflict, mine: body } });
          get().announce(`Not saved: someone saved version ${result.conflict.version} meanwhile. Choose how to go on.`);
          return 'conflict';
        }
        set({ saveState: 'error', saveError: result.error });
        get().announce(`Not saved: ${result.error}`);
        return 'error';
      },

      reloadNewer() {
        const c = get().conflict;
        if (!c) return;
        get().replaceLayout(c.current.body, `Loaded version ${c.current.version}. Undo brings your edits back.`);
        set({ conflict: null, saveState: 'idle', baseVersion: c.current.version, savedLayout: get().layout });
      },

      async saveAsCopy(name, note = '') {
        const s = get();
        const body = s.conflict?.mine ?? s.layout;
        set({ saveState: 'saving', saveError: null });
        const result = await deps.api.createLayout(s.machineId, { name, body, note });
        if (!result.ok) {
          set({ saveState: s.conflict ? 'conflict' : 'error', saveError: result.error });
          get().announce(`Not saved: ${result.error}`);
          return null;
        }
        // The copy holds exactly these edits, so nothing here is unsaved any more.
        set({ saveState: 'saved', conflict: null, savedLayout: get().layout });
        get().announce(`Saved as a new layout, ${name}.`);
        return result.layoutId;
      },

      dismissConflict() {
        set({ conflict: null, saveState: 'idle' });
      },
    };
  };
