/** Ask before leaving the page with unsaved edits (the browser shows its own wording). */
import { useEffect } from 'react';
import { isDirty } from './store/create-editor-store';
import { useEditorStoreApi } from './store/context';

export function useUnsavedGuard() {
  const store = useEditorStoreApi();
  // Asked when the page is left, so edits do not have to re-render anything to keep it true.
  useEffect(() => {
    const onBeforeUnload = (e: BeforeUnloadEvent) => {
      if (!isDirty(store.getState())) return;
      e.preventDefault();
      // Older browsers need returnValue set to show the prompt.
      e.returnValue = '';
    };
    window.addEventListener('beforeunload', onBeforeUnload);
    return () => window.removeEventListener('beforeunload', onBeforeUnload);
  }, [store]);
}
