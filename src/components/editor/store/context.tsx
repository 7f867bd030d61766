/** The island's store in React context, created once from the page's props. */
import { createContext, useContext, useState, type ReactNode } from 'react';
import { useStore } from 'zustand';
import type { TemporalState } from 'zundo';
import { createEditorStore } from './create-editor-store';
import type { EditorDeps, EditorInit, EditorState, EditorStoreApi, Tracked } from './types';

const EditorStoreContext = createContext<EditorStoreApi | null>(null);

export function EditorStoreProvider({ init, deps, children }: { init: EditorInit; deps?: EditorDeps; children: ReactNode }) {
  const [store] = useState(() => createEditorStore(init, deps));
  return <EditorStoreContext.Provider value={store}>{children}</EditorStoreContext.Provider>;
}

export function useEditorStoreApi(): EditorStoreApi {
  const store = useContext(EditorStoreContext);
  if (!store) throw new Error('useEditor must be used inside <EditorStoreProvider>');
  return store;
}

/** A narrow selector on the editor state. */
export function useEditor<T>(selector: (s: EditorState) => T): T {
  return useStore(useEditorStoreApi(), selector);
}

export function useEditorHistory<T>(selector: (s: TemporalState<Tracked>) => T): T {
  return useStore(useEditorStoreApi().temporal, selector);
}
