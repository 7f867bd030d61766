/**
 * One store per editor island, built from the page's props (never a module-level store: two
 * islands, or two users on one server render, never share state). Undo tracks the layout and
 * its findings together, so an undo never shows findings of another layout.
 */
import { temporal } from 'zundo';
import { createStore } from 'zustand/vanilla';
import { fetchApi } from './api';
import { createDiagramSlice } from './diagram-slice';
import { createHistorySlice } from './history-slice';
import { createSelectionSlice } from './selection-slice';
import { createSettingsSlice } from './settings-slice';
import type { EditorDeps, EditorInit, EditorState, EditorStoreApi, Tracked } from './types';

export const UNDO_LIMIT = 200;

export function createEditorStore(init: EditorInit, deps: EditorDeps = { api: fetchApi }): EditorStoreApi {
  return createStore<EditorState>()(
    temporal(
      (...a) => ({
        ...createDiagramSlice(init)(...a),
        ...createSelectionSlice(...a),
        ...createHistorySlice(init, deps)(...a),
        ...createSettingsSlice(init, deps)(...a),
      }),
      {
        partialize: (s): Tracked => ({ layout: s.layout, findings: s.findings }),
        // Only a new layout object is a step; selection and saving state are not history.
        equality: (past, now) => past.layout === now.layout,
        limit: UNDO_LIMIT,
      },
    ),
  ) as EditorStoreApi;
}

/** Whether there are edits since the last save or load. */
export const isDirty = (s: Pick<EditorState, 'layout' | 'savedLayout'>) => s.layout !== s.savedLayout;
