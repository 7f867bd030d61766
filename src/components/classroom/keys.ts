/**
 * The presentation's keys. Presentation clickers send PageDown/PageUp (some send arrows, and
 * a "blank" button sends "b" or "."), so those are handled alongside the keyboard's own keys.
 */
export type StageCommand = 'next' | 'prev' | 'first' | 'last' | 'overview' | 'close' | 'crop-path' | 'blank' | 'fullscreen' | 'presenter';

export interface KeyLike {
  key: string;
  shiftKey?: boolean;
  altKey?: boolean;
  ctrlKey?: boolean;
  metaKey?: boolean;
}

/** The command a key press means on the stage, or null when the key is not ours. */
export function commandForKey(e: KeyLike): StageCommand | null {
  if (e.altKey || e.ctrlKey || e.metaKey) return null;
  switch (e.key) {
    case 'ArrowRight':
    case 'ArrowDown':
    case 'PageDown':
    case 'n':
    case 'N':
      return 'next';
    case ' ':
    case 'Spacebar':
      return e.shiftKey ? 'prev' : 'next';
    case 'ArrowLeft':
    case 'ArrowUp':
    case 'PageUp':
    case 'Backspace':
      return 'prev';
    case 'Home':
      return 'first';
    case 'End':
      return 'last';
    case 'o':
    case 'O':
    case 'g':
    case 'G':
      return 'overview';
    case 'Escape':
    case 'Enter':
      return 'close';
    case 'c':
    case 'C':
      return 'crop-path';
    case 'b':
    case 'B':
    case '.':
      return 'blank';
    case 'f':
    case 'F':
      return 'fullscreen';
    case 'p':
    case 'P':
      return 'presenter';
    default:
      return null;
  }
}

/** Keys typed into a field, or Space/Enter on a button, belong to that control, not the stage. */
export function keyBelongsToControl(target: EventTarget | null, key: string): boolean {
  if (!target || typeof (target as Element).closest !== 'function') return false;
  const el = target as Element;
  if (el.closest('input, textarea, select, [contenteditable="true"]')) return true;
  if ((key === ' ' || key === 'Enter') && el.closest('button, a[href], summary')) return true;
  return false;
}

export const KEY_HELP: readonly [string, string][] = [
  ['→  ↓  PageDown  Space', 'next slide'],
  ['←  ↑  PageUp  Shift+Space', 'previous slide'],
  ['Home  End', 'first, last slide'],
  ['O', 'slide overview (Enter or Esc closes it)'],
  ['C', 'crop path, an illustration'],
  ['B', 'blank the screen'],
  ['F', 'full screen'],
  ['P', 'presenter’s view with notes, in a second window'],
];
