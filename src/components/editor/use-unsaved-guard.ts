/** Ask before leaving the page with unsaved edits (the browser shows its own wording). */
import { useEffect } from 'react';
import { isDirty } from './store/create-editor-store';
import { useEditor } from './store/context';

export function useUnsavedGuard() {
  const dirty = useEditor(isDirty);
  useEffect(() => {
    if (!dirty) return;
    const onBeforeUnload = (e: BeforeUnloadEvent) => {
      e.preventDefault();
      // Older browsers need returnValue set to show the prompt.
      e.returnValue = '';
    };
    window.addEventListener('beforeunload', onBeforeUnload);
    return () => window.removeEventListener('beforeunload', onBeforeUnload);
  }, [dirty]);
}
