/** Keyboard shortcuts of the command registry, listened for on the window while the editor is open. */
import { useEffect } from 'react';
import { parsePlaceKey, placeKey } from '~/lib/domain/places';
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
      // They take off what has focus, never a slot selected elsewhere.
      if (cmd.id === 'remove') {
        const g = e.target instanceof Element ? e.target.closest('[data-place]') : null;
        if (!g) return;
        const focused = parsePlaceKey(g.getAttribute('data-place') ?? '');
        const selected = store.getState().selectedPlace;
        if (!focused) return;
        if (!selected || placeKey(selected) !== placeKey(focused)) store.getState().select(focused);
      }
      if (runCommand(store, cmd.id) || cmd.id === 'save' || cmd.id === 'undo' || cmd.id === 'redo') e.preventDefault();
    };
    window.addEventListener('keydown', onKeyDown);
    return () => window.removeEventListener('keydown', onKeyDown);
  }, [store, paused]);
}
