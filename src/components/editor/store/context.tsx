/** The island's store in React context, created once from the page's props. */
import { createContext, startTransition, useContext, useEffect, useRef, useState, type ReactNode } from 'react';
import { useStore } from 'zustand';
import type { TemporalState } from 'zundo';
import { createEditorStore } from './create-editor-store';
import type { EditorDeps, EditorInit, EditorState, EditorStoreApi, Tracked } from './types';
import { afterPaint } from '~/components/editor/after-paint';

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

/**
 * A selector for what may follow an edit a moment later (toolbar state, the details line, a
 * setting's own findings): it re-renders in a transition after the frame showing the edit has
 * been painted (`afterPaint`), so a drop shows its part and findings first. Reads the undo history too. Primitive or stable results
 * only (compared with Object.is).
 */
export function useEditorLazy<T>(selector: (s: EditorState, h: TemporalState<Tracked>) => T): T {
  const store = useEditorStoreApi();
  const [value, setValue] = useState(() => selector(store.getState(), store.temporal.getState()));
  const latest = useRef({ selector, value });
  latest.current = { selector, value };
  useEffect(() => {
    let last = latest.current.value;
    let pending: (() => void) | null = null;
    const check = () => {
      const v = latest.current.selector(store.getState(), store.temporal.getState());
      if (Object.is(v, last)) return;
      last = v;
      // After the frame that shows the edit is painted (a transition alone may render before it).
      pending ??= afterPaint(() => {
        pending = null;
        startTransition(() => setValue(last));
      });
    };
    check(); // a change between render and subscription
    const offState = store.subscribe(check);
    // The history is written after the state; a step's undo button follows it.
    const offHistory = store.temporal.subscribe(check);
    return () => {
      pending?.();
      offState();
      offHistory();
    };
  }, [store]);
  return value;
}
