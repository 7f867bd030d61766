/** Keyboard shortcuts of the command registry, listened for on the window while the editor is open. */
import { useEffect } from 'react';
import { commandForKey, runCommand } from './commands';
import { useEditorStoreApi } from './store/context';

const isTextField = (el: EventTarget | null) =>
  el instanceof HTMLElement && (el.isContentEditable || /^(INPUT|TEXTAREA|SELECT)$/.test(el.tagName));

export function useShortcuts(paused: () => boolean) {
  const store = useEditorStoreApi();
  useEffect(() => {
    const onKeyDown = (e: KeyboardEvent) => {
      if (e.defaultPrevented || paused()) return;
      const cmd = commandForKey(e, isTextField(e.target));
      if (!cmd) return;
      // Delete/Backspace act on the selected slot only when focus is in the drawing.
      if (cmd.id === 'remove' && !(e.target instanceof Element && e.target.closest('[data-place]'))) return;
      if (runCommand(store, cmd.id) || cmd.id === 'save' || cmd.id === 'undo' || cmd.id === 'redo') e.preventDefault();
    };
    window.addEventListener('keydown', onKeyDown);
    return () => window.removeEventListener('keydown', onKeyDown);
  }, [store, paused]);
}
