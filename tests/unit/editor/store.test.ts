import { describe, expect, it } from 'vitest';
import { createEditorStore, isDirty } from '~/components/editor/store/create-editor-store';
import { partNumberAt } from '~/lib/domain/layout-edits';
import { placeKey } from '~/lib/domain/places';
import { checkLayout } from '~/lib/domain/rules';
import type { Place } from '~/lib/domain/schemas';
import { splitInit, VersionedMemory, wheatInit } from './fixtures';

const el = (position: number, side: 'left' | 'right'): Place => ({ kind: 'element', position, side });
const codesAt = (findings: { code: string; places: Place[] }[], place: Place) =>
  findings.filter((f) => f.places.some((p) => placeKey(p) === placeKey(place))).map((f) => f.code);

describe('editor store', () => {
  it('starts from the page props with the rules already run', () => {
    const init = wheatInit();
    const store = createEditorStore(init, { api: new VersionedMemory(init.layout) });
    const s = store.getState();
    expect(s.layout).toBe(init.layout);
    expect(s.findings).toEqual(checkLayout(init.family, init.catalog, init.layout));
    expect(s.findings.filter((f) => f.severity === 'blocks-fit')).toEqual([]);
    expect(isDirty(s)).toBe(false);
  });

  it('a left-hand element dropped on a right half gets the hand finding on that place, and says so', () => {
    const init = wheatInit();
    const store = createEditorStore(init, { api: new VersionedMemory(init.layout) });
    expect(store.getState().placePart('CW-WW-L-04', el(3, 'right'))).toBe(true);
    const s = store.getState();
    expect(partNumberAt(s.layout, el(3, 'right'))).toBe('CW-WW-L-04');
    expect(codesAt(s.findings, el(3, 'right'))).toContain('FIT_HAND_MISMATCH');
    expect(s.announcement.text).toMatch(
      /^Placed wide-wire element at position 3, right\. It replaces the wide-wire element\. Blocks fit: Left-hand element in the right half\./,
    );
    expect(s.selectedPlace).toEqual(el(3, 'right'));
    expect(isDirty(s)).toBe(true);
  });

  it('undo restores the layout object and its findings together; redo brings the edit back', () => {
    const init = wheatInit();
    const store = createEditorStore(init, { api: new VersionedMemory(init.layout) });
    const before = store.getState().findings;
    store.getState().placePart('CW-BL-R-04', el(1, 'right'));
    store.getState().setSetting('rotorRpm', 300);
    expect(store.temporal.getState().pastStates).toHaveLength(2);
    store.getState().undo();
    expect(store.getState().layout.rotorRpm).toBe(init.layout.rotorRpm);
    expect(partNumberAt(store.getState().layout, el(1, 'right'))).toBe('CW-BL-R-04');
    store.getState().undo();
    expect(store.getState().layout).toBe(init.layout);
    expect(store.getState().findings).toEqual(before);
    expect(isDirty(store.getState())).toBe(false);
    expect(store.getState().announcement.text).toMatch(/^Undone\./);
    store.getState().redo();
    expect(partNumberAt(store.getState().layout, el(1, 'right'))).toBe('CW-BL-R-04');
    expect(store.getState().findings).toEqual(checkLayout(init.family, init.catalog, store.getState().layout));
  });

  it('selection changes are not undo steps', () => {
    const init = wheatInit();
    const store = createEditorStore(init, { api: new VersionedMemory(init.layout) });
    store.getState().select(el(2, 'left'));
    store.getState().chooseFinding(0);
    store.getState().select(null);
    expect(store.temporal.getState().pastStates).toHaveLength(0);
  });

  it('moving onto an occupied half swaps the two parts; onto an empty one just moves', () => {
    const init = wheatInit();
    const store = createEditorStore(init, { api: new VersionedMemory(init.layout) });
    const a = partNumberAt(init.layout, el(2, 'left'))!;
    const b = partNumberAt(init.layout, el(3, 'left'))!;
    expect(a).not.toBe(b);
    store.getState().movePart(el(2, 'left'), el(3, 'left'));
    expect(partNumberAt(store.getState().layout, el(3, 'left'))).toBe(a);
    expect(partNumberAt(store.getState().layout, el(2, 'left'))).toBe(b);
    expect(store.getState().announcement.text).toMatch(
      /^Swapped: fine-wire element now at position 3, left; wide-wire element now at position 2, left\./,
    );

    store.getState().removePart(el(4, 'right'));
    expect(codesAt(store.getState().findings, el(4, 'right'))).toContain('FIT_EMPTY_POSITION');
    store.getState().movePart(el(4, 'left'), el(4, 'right'));
    expect(partNumberAt(store.getState().layout, el(4, 'left'))).toBeUndefined();
    expect(codesAt(store.getState().findings, el(4, 'left'))).toContain('FIT_EMPTY_POSITION');
    expect(codesAt(store.getState().findings, el(4, 'right'))).toContain('FIT_HAND_MISMATCH');
  });

  it('refuses a part where its kind never goes, without an undo step', () => {
    const init = wheatInit();
    const store = createEditorStore(init, { api: new VersionedMemory(init.layout) });
    expect(store.getState().placePart('CW-CP-R-04', el(1, 'left'))).toBe(false);
    expect(store.getState().placePart('CW-BR-ST-04', { kind: 'cover', section: 2, side: 'right' })).toBe(false);
    expect(store.getState().placePart('NO-SUCH-PART', el(1, 'left'))).toBe(false);
    expect(store.getState().layout).toBe(init.layout);
    expect(store.temporal.getState().pastStates).toHaveLength(0);
    expect(store.getState().announcement.text).toBe('A straight bar does not go at cage-top section 2, right.');
  });

  it('a split cage: a concave in a grate position is a zone finding on that place', () => {
    const init = splitInit();
    const store = createEditorStore(init, { api: new VersionedMemory(init.layout) });
    store.getState().placePart('CW-WW-L-06C', el(5, 'left'));
    expect(codesAt(store.getState().findings, el(5, 'left'))).toContain('FIT_ZONE_FORBIDDEN');
  });

  it('settings re-run the rules: a speed below the crop window is a finding on the speed', () => {
    const init = wheatInit();
    const store = createEditorStore(init, { api: new VersionedMemory(init.layout) });
    store.getState().setSetting('rotorRpm', 400);
    const f = store.getState().findings.find((x) => x.code === 'CROP_RPM_OUTSIDE_WINDOW');
    expect(f?.places).toContainEqual({ kind: 'setting', field: 'rotorRpm' });
    expect(store.getState().announcement.text).toMatch(/^Rotor speed set to 400 rpm\./);
    store.getState().setSetting('clearanceMm', 25.4);
    store.getState().setUnits('imperial');
    store.getState().setSetting('clearanceMm', 12.7);
    expect(store.getState().announcement.text).toMatch(/^Concave clearance set to 0\.50 in\./);
  });

  it('a read-only island changes nothing', () => {
    const init = wheatInit({ canEdit: false });
    const store = createEditorStore(init, { api: new VersionedMemory(init.layout) });
    expect(store.getState().placePart('CW-WW-L-04', el(3, 'right'))).toBe(false);
    expect(store.getState().removePart(el(1, 'left'))).toBe(false);
    store.getState().setSetting('crop', 'corn');
    expect(store.getState().layout).toBe(init.layout);
  });

  it('choosing a finding highlights its places, selects the first and asks for focus', () => {
    const init = wheatInit();
    const store = createEditorStore(init, { api: new VersionedMemory(init.layout) });
    store.getState().placePart('CW-WW-L-04', el(3, 'right'));
    const i = store.getState().findings.findIndex((f) => f.code === 'FIT_HAND_MISMATCH');
    const seq = store.getState().focusSeq;
    store.getState().chooseFinding(i);
    expect(store.getState().highlightPlaces).toEqual([el(3, 'right')]);
    expect(store.getState().selectedPlace).toEqual(el(3, 'right'));
    expect(store.getState().focusSeq).toBe(seq + 1);
    // an edit drops the choice (its index may now name another finding)
    store.getState().removePart(el(1, 'left'));
    expect(store.getState().activeFinding).toBeNull();
    expect(store.getState().highlightPlaces).toEqual([]);
  });

  it('each island has its own store', () => {
    const a = createEditorStore(wheatInit(), { api: new VersionedMemory(wheatInit().layout) });
    const b = createEditorStore(wheatInit(), { api: new VersionedMemory(wheatInit().layout) });
    a.getState().removePart(el(1, 'left'));
    expect(partNumberAt(b.getState().layout, el(1, 'left'))).toBe('CW-FW-L-04');
    expect(b.temporal.getState().pastStates).toHaveLength(0);
  });
});

describe('saving', () => {
  it('saves a new version from the base version and is clean afterwards', async () => {
    const init = wheatInit();
    const api = new VersionedMemory(init.layout);
    const store = createEditorStore(init, { api });
    store.getState().placePart('CW-RB-L-04', el(4, 'left'));
    store.getState().setDraftNote('  round bar at the rear ');
    expect(await store.getState().save()).toBe('saved');
    expect(api.current.version).toBe(2);
    expect(api.current.note).toBe('round bar at the rear');
    expect(api.current.body).toBe(store.getState().layout);
    expect(store.getState().baseVersion).toBe(2);
    expect(store.getState().draftNote).toBe('');
    expect(isDirty(store.getState())).toBe(false);
  });

  it('a stale save keeps my edits, shows the newer version, and loading it leaves my edits one Undo away', async () => {
    const init = wheatInit();
    const api = new VersionedMemory(init.layout);
    const store = createEditorStore(init, { api });
    api.saveElsewhere({ ...init.layout, rotorRpm: init.layout.rotorRpm + 20 });
    store.getState().setSetting('vaneSetting', 'very-slow');
    const mine = store.getState().layout;
    expect(await store.getState().save()).toBe('conflict');
    expect(api.versions).toHaveLength(2);
    const c = store.getState().conflict!;
    expect(c.current.version).toBe(2);
    expect(c.mine).toBe(mine);
    expect(store.getState().layout).toBe(mine);

    store.getState().reloadNewer();
    expect(store.getState().layout.rotorRpm).toBe(init.layout.rotorRpm + 20);
    expect(store.getState().baseVersion).toBe(2);
    expect(isDirty(store.getState())).toBe(false);
    store.getState().undo();
    expect(store.getState().layout).toBe(mine);
    expect(await store.getState().save()).toBe('saved');
    expect(api.current.version).toBe(3);
    expect(api.current.body.vaneSetting).toBe('very-slow');
  });

  it('a stale save can go to a new layout instead, with exactly my edits', async () => {
    const init = wheatInit();
    const api = new VersionedMemory(init.layout);
    const store = createEditorStore(init, { api });
    api.saveElsewhere({ ...init.layout, clearanceMm: 20 });
    store.getState().removePart(el(2, 'right'));
    const mine = store.getState().layout;
    await store.getState().save();
    expect(await store.getState().saveAsCopy('my copy')).toBe('copy-1');
    expect(api.copies[0]!.body).toBe(mine);
    expect(store.getState().conflict).toBeNull();
    expect(api.versions).toHaveLength(2);
  });

  it('the unit choice is sent to the server once per change', () => {
    const init = wheatInit();
    const api = new VersionedMemory(init.layout);
    const store = createEditorStore(init, { api });
    store.getState().setUnits('imperial');
    store.getState().setUnits('imperial');
    store.getState().setUnits('metric');
    expect(api.units).toEqual(['imperial', 'metric']);
  });
});
