import { describe, expect, it } from 'vitest';
import { commandById, commandForKey, commands, keyLabel, matchesKey, runCommand } from '~/components/editor/commands';
import { createEditorStore } from '~/components/editor/store/create-editor-store';
import { partNumberAt } from '~/lib/domain/layout-edits';
import { VersionedMemory, wheatInit } from './fixtures';

const key = (k: string, mods: Partial<{ ctrl: boolean; meta: boolean; shift: boolean; alt: boolean; code: string }> = {}) => ({
  key: k,
  code: mods.code,
  ctrlKey: !!mods.ctrl,
  metaKey: !!mods.meta,
  shiftKey: !!mods.shift,
  altKey: !!mods.alt,
});

function fresh() {
  const init = wheatInit();
  return createEditorStore(init, { api: new VersionedMemory(init.layout) });
}

describe('command registry', () => {
  it('every command has an id, a label and at least one shortcut, and ids are unique', () => {
    expect(new Set(commands.map((c) => c.id)).size).toBe(commands.length);
    for (const c of commands) {
      expect(c.label.length).toBeGreaterThan(2);
      expect(c.keys.length).toBeGreaterThan(0);
    }
  });

  it('matches shortcuts with Ctrl or ⌘, exact modifiers, any letter case', () => {
    expect(matchesKey(key('z', { ctrl: true }), 'Mod+Z')).toBe(true);
    expect(matchesKey(key('z', { meta: true }), 'Mod+Z')).toBe(true);
    expect(matchesKey(key('Z', { ctrl: true, shift: true }), 'Mod+Z')).toBe(false);
    expect(matchesKey(key('Z', { ctrl: true, shift: true }), 'Mod+Shift+Z')).toBe(true);
    expect(matchesKey(key('z'), 'Mod+Z')).toBe(false);
    expect(matchesKey(key('Delete'), 'Delete')).toBe(true);
    // Alt+U types another character on some layouts; the physical key still counts.
    expect(matchesKey(key('ü', { alt: true, code: 'KeyU' }), 'Alt+U')).toBe(true);
  });

  it('finds the command for a key; in a text field only the ones that belong there', () => {
    expect(commandForKey(key('z', { ctrl: true }), false)?.id).toBe('undo');
    expect(commandForKey(key('y', { ctrl: true }), false)?.id).toBe('redo');
    expect(commandForKey(key('z', { ctrl: true }), true)).toBeUndefined();
    expect(commandForKey(key('s', { ctrl: true }), true)?.id).toBe('save');
    expect(commandForKey(key('Backspace'), true)).toBeUndefined();
    expect(commandForKey(key('q'), false)).toBeUndefined();
  });

  it('undo and redo run only when there is something to undo or redo', () => {
    const store = fresh();
    expect(commandById('undo').enabled(store.getState(), store.temporal.getState())).toBe(false);
    expect(runCommand(store, 'undo')).toBe(false);
    store.getState().removePart({ kind: 'element', position: 1, side: 'left' });
    expect(runCommand(store, 'undo')).toBe(true);
    expect(partNumberAt(store.getState().layout, { kind: 'element', position: 1, side: 'left' })).toBe('CW-FW-L-04');
    expect(runCommand(store, 'redo')).toBe(true);
    expect(partNumberAt(store.getState().layout, { kind: 'element', position: 1, side: 'left' })).toBeUndefined();
    expect(runCommand(store, 'redo')).toBe(false);
  });

  it('remove acts on the selected slot, and only when it holds a part', () => {
    const store = fresh();
    expect(runCommand(store, 'remove')).toBe(false);
    store.getState().select({ kind: 'bar', row: 1, position: 1 });
    expect(runCommand(store, 'remove')).toBe(true);
    expect(partNumberAt(store.getState().layout, { kind: 'bar', row: 1, position: 1 })).toBeUndefined();
    expect(runCommand(store, 'remove')).toBe(false);
  });

  it('save is enabled only with unsaved edits', async () => {
    const store = fresh();
    expect(runCommand(store, 'save')).toBe(false);
    store.getState().setSetting('vaneSetting', 'fast');
    expect(runCommand(store, 'save')).toBe(true);
    await Promise.resolve();
    await new Promise((r) => setTimeout(r, 0));
    expect(store.getState().baseVersion).toBe(2);
    expect(runCommand(store, 'save')).toBe(false);
  });

  it('next finding walks the findings in order and wraps', () => {
    const store = fresh();
    store.getState().removePart({ kind: 'element', position: 1, side: 'left' });
    store.getState().removePart({ kind: 'element', position: 2, side: 'left' });
    const n = store.getState().findings.length;
    expect(n).toBeGreaterThanOrEqual(2);
    const seen: (number | null)[] = [];
    for (let i = 0; i <= n; i++) {
      runCommand(store, 'next-finding');
      seen.push(store.getState().activeFinding);
    }
    expect(seen.slice(0, n)).toEqual([...Array(n).keys()]);
    expect(seen[n]).toBe(0);
    expect(runCommand(store, 'clear-selection')).toBe(true);
    expect(store.getState().activeFinding).toBeNull();
  });

  it('switching units goes back and forth', () => {
    const store = fresh();
    runCommand(store, 'toggle-units');
    expect(store.getState().units).toBe('imperial');
    runCommand(store, 'toggle-units');
    expect(store.getState().units).toBe('metric');
  });

  it('shows shortcuts the way each platform writes them', () => {
    expect(keyLabel('Mod+Shift+Z', false)).toBe('Ctrl+Shift+Z');
    expect(keyLabel('Mod+Shift+Z', true)).toBe('⌘⇧Z');
  });
});
