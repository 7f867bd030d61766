/**
 * Editor commands as data: `{ id, label, keys, perform }`. Toolbar buttons, keyboard shortcuts
 * and tests all go through `runCommand`, so a shortcut can never do something its button
 * does not. Keys are written 'Mod+Z' (Ctrl, or ⌘ on a Mac), 'Shift', 'Alt', or a key name.
 */
import type { TemporalState } from 'zundo';
import { isDirty } from './store/create-editor-store';
import type { EditorState, EditorStoreApi, Tracked } from './store/types';

export interface CommandContext {
  store: EditorStoreApi;
}

export interface EditorCommand {
  id: CommandId;
  label: string;
  /** Shortcuts; the first is shown on the button's tooltip. */
  keys: readonly string[];
  /** Whether it may run now (buttons are disabled otherwise). */
  enabled: (s: EditorState, history: TemporalState<Tracked>) => boolean;
  /** Shortcuts that still work while typing in a field (Mod+S, Mod+Z stay with the field). */
  inFields?: boolean;
  perform: (ctx: CommandContext) => void | Promise<unknown>;
}

export type CommandId = 'undo' | 'redo' | 'save' | 'remove' | 'clear-selection' | 'next-finding' | 'toggle-units';

export const commands: readonly EditorCommand[] = [
  {
    id: 'undo',
    label: 'Undo',
    keys: ['Mod+Z'],
    enabled: (s, h) => s.canEdit && h.pastStates.length > 0,
    perform: ({ store }) => store.getState().undo(),
  },
  {
    id: 'redo',
    label: 'Redo',
    keys: ['Mod+Shift+Z', 'Mod+Y'],
    enabled: (s, h) => s.canEdit && h.futureStates.length > 0,
    perform: ({ store }) => store.getState().redo(),
  },
  {
    id: 'save',
    label: 'Save version',
    keys: ['Mod+S'],
    inFields: true,
    enabled: (s) => s.canEdit && s.saveState !== 'saving' && isDirty(s),
    perform: ({ store }) => store.getState().save(),
  },
  {
    id: 'remove',
    label: 'Remove part',
    keys: ['Delete', 'Backspace'],
    enabled: (s) => {
      const p = s.selectedPlace;
      if (!s.canEdit || !p || p.kind === 'setting') return false;
      if (p.kind === 'element') return s.layout.elements.some((e) => e.position === p.position && e.side === p.side);
      if (p.kind === 'cover') return s.layout.coverPlates.some((c) => c.section === p.section && c.side === p.side);
      return s.layout.rotorBars.some((b) => b.row === p.row && b.position === p.position);
    },
    perform: ({ store }) => {
      const p = store.getState().selectedPlace;
      if (p) store.getState().removePart(p);
    },
  },
  {
    id: 'clear-selection',
    label: 'Clear selection',
    keys: ['Escape'],
    enabled: (s) => s.selectedPlace !== null || s.activeFinding !== null,
    perform: ({ store }) => {
      store.getState().chooseFinding(null);
      store.getState().select(null);
    },
  },
  {
    id: 'next-finding',
    label: 'Next finding',
    keys: ['Alt+N'],
    enabled: (s) => s.findings.length > 0,
    perform: ({ store }) => {
      const s = store.getState();
      const next = s.activeFinding === null ? 0 : (s.activeFinding + 1) % s.findings.length;
      s.chooseFinding(next);
    },
  },
  {
    id: 'toggle-units',
    label: 'Switch units',
    keys: ['Alt+U'],
    enabled: () => true,
    perform: ({ store }) => {
      const s = store.getState();
      s.setUnits(s.units === 'metric' ? 'imperial' : 'metric');
    },
  },
];

export const commandById = (id: CommandId): EditorCommand => commands.find((c) => c.id === id)!;

/** Runs a command if it is enabled; returns whether it ran. */
export function runCommand(store: EditorStoreApi, id: CommandId): boolean {
  const cmd = commandById(id);
  if (!cmd.enabled(store.getState(), store.temporal.getState())) return false;
  void cmd.perform({ store });
  return true;
}

export interface KeyLike {
  key: string;
  ctrlKey: boolean;
  metaKey: boolean;
  shiftKey: boolean;
  altKey: boolean;
}

/** Whether a key event matches a shortcut written like 'Mod+Shift+Z'. */
export function matchesKey(e: KeyLike, shortcut: string): boolean {
  const parts = shortcut.split('+');
  const key = parts[parts.length - 1]!;
  const mods = new Set(parts.slice(0, -1));
  const mod = e.ctrlKey || e.metaKey;
  if (mods.has('Mod') !== mod) return false;
  if (mods.has('Shift') !== e.shiftKey) return false;
  if (mods.has('Alt') !== e.altKey) return false;
  // Alt+letter gives another character on some layouts; compare letters case-insensitively.
  return e.key.toLowerCase() === key.toLowerCase() || (key.length === 1 && e.altKey && codeLetter(e) === key.toLowerCase());
}

function codeLetter(e: KeyLike): string | undefined {
  const code = (e as KeyLike & { code?: string }).code;
  return code?.startsWith('Key') ? code.slice(3).toLowerCase() : undefined;
}

/** The command a key event asks for, if any. `inField`: the event comes from a text field. */
export function commandForKey(e: KeyLike, inField: boolean): EditorCommand | undefined {
  return commands.find((c) => (!inField || c.inFields) && c.keys.some((k) => matchesKey(e, k)));
}

/** How a shortcut is shown to people: 'Ctrl+Z' (or '⌘Z' on a Mac). */
export function keyLabel(shortcut: string, mac: boolean): string {
  return mac ? shortcut.replace('Mod+', '⌘').replace('Shift+', '⇧').replace('Alt+', '⌥') : shortcut.replace('Mod', 'Ctrl');
}
