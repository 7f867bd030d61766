/**
 * The editor's screen: toolbar, parts palette, the drawing, settings and findings, wired to one
 * drag-and-drop context with pointer and keyboard sensors. Dropping a palette part places it,
 * dropping a placed part on another slot moves it (or swaps the two), dropping it on the palette
 * takes it off. See ./carry.tsx for why there is one draggable and no droppable per slot.
 */
import {
  DndContext,
  DragOverlay,
  KeyboardSensor,
  PointerSensor,
  useDndContext,
  useSensor,
  useSensors,
  type Announcements,
  type CollisionDetection,
  type DragEndEvent,
  type DragMoveEvent,
  type DragStartEvent,
} from '@dnd-kit/core';
import { memo, useCallback, useEffect, useMemo, useRef, useState } from 'react';
import { parsePlaceKey, placeKey } from '~/lib/domain/places';
import type { Place } from '~/lib/domain/schemas';
import { partName, partNameWithHand, placeLabel, placeWords } from '~/lib/domain/vocabulary';
import { afterPaint } from './after-paint';
import { CarryHandle, CarryProvider, createCarry, type CarryData } from './carry';
import { ConflictDialog } from './ConflictDialog';
import { DiagramPane } from './DiagramPane';
import { FindingsList } from './FindingsList';
import { INSTRUCTIONS, INSTRUCTIONS_ID } from './instructions';
import { slotCoordinateGetter } from './keyboard';
import { LiveRegion } from './LiveRegion';
import { Palette } from './Palette';
import { PartSwatch, partTitle } from './part-visuals';
import { SettingsPanel } from './SettingsPanel';
import { useEditor, useEditorStoreApi } from './store/context';
import { accepts, partNumberAt } from '~/lib/domain/layout-edits';
import { Toolbar } from './Toolbar';
import { useShortcuts } from './use-shortcuts';
import { useUnsavedGuard } from './use-unsaved-guard';

/** No dnd-kit drop targets: slots and the palette are found by position (see ./carry.tsx). */
const collision: CollisionDetection = () => [];

/** The part following the pointer (or the keyboard) while it is carried. */
const CarryOverlay = memo(function CarryOverlay() {
  const { active, activatorEvent } = useDndContext();
  // Only the pointer needs a part under it; carried with the keys, the slot it is over lights up.
  const carrying =
    typeof KeyboardEvent !== 'undefined' && activatorEvent instanceof KeyboardEvent
      ? undefined
      : (active?.data.current as CarryData | undefined);
  // A wrapper that is always there, so the overlay coming and going never changes the
  // structure of the editor's children (sibling selectors would restyle the whole editor).
  // The overlay itself is there only while the pointer carries a part (it has no drop
  // animation to finish): a keyboard drop then does not update it.
  return (
    <div className="editor-carry">
      {carrying?.part ? (
        <DragOverlay dropAnimation={null}>
          <div className="pointer-events-none flex items-center gap-2 rounded-md border border-iris-500 bg-white px-2 py-1.5 text-sm font-semibold shadow-lg">
            <PartSwatch part={carrying.part} id="overlay" />
            {partTitle(carrying.part)}
            {carrying.part.kind === 'element' ? ` · ${carrying.part.hand === 'left' ? 'L' : 'R'}` : ''}
          </div>
        </DragOverlay>
      ) : null}
    </div>
  );
});

/** Reads the unsaved state on its own, so the rest of the screen does not re-render with it. */
function UnsavedGuard() {
  useUnsavedGuard();
  return null;
}

export function EditorApp() {
  const store = useEditorStoreApi();
  const canEdit = useEditor((s) => s.canEdit);
  const layoutName = useEditor((s) => s.layoutName);
  const machineName = useEditor((s) => s.machineName);
  const familyName = useEditor((s) => s.family.name);
  const [carry] = useState(createCarry);
  const root = useRef<HTMLDivElement>(null);

  // Where the pointer is (one assignment a move): what lies under it decides a mouse drop.
  useEffect(() => {
    const track = (e: PointerEvent) => {
      carry.pointer.x = e.clientX;
      carry.pointer.y = e.clientY;
    };
    window.addEventListener('pointermove', track, { capture: true, passive: true });
    return () => window.removeEventListener('pointermove', track, { capture: true });
  }, [carry]);

  useShortcuts(
    useCallback(() => carry.starting || carry.ui.getState().carrying !== null || store.getState().conflict !== null, [carry, store]),
  );

  const setHover = useCallback(
    (place: Place | null) => {
      const cur = carry.ui.getState().hover;
      if ((cur ? placeKey(cur) : null) !== (place ? placeKey(place) : null)) carry.ui.setState({ hover: place });
    },
    [carry],
  );

  const slotElement = useCallback(
    (place: Place) => root.current?.querySelector(`[data-testid="diagram-pane"] [data-place="${placeKey(place)}"]`) ?? null,
    [],
  );

  const coordinateGetter = useMemo(
    () =>
      slotCoordinateGetter({
        family: () => store.getState().family,
        rectOf: (place) => slotElement(place)?.getBoundingClientRect() ?? null,
        onTarget: setHover,
      }),
    [store, slotElement, setHover],
  );
  const sensors = useSensors(
    useSensor(PointerSensor, { activationConstraint: { distance: 5 } }),
    useSensor(KeyboardSensor, { coordinateGetter }),
  );

  /**
   * What lies under a point: a slot that takes the carried part, or the palette; `under` is the
   * slot there even when it does not take the part (to say so on a drop).
   */
  const targetAt = (x: number, y: number, c: CarryData): { place: Place | null; palette: boolean; under: Place | null } => {
    const pane = root.current?.querySelector('[data-testid="diagram-pane"]');
    const palette = root.current?.querySelector('[data-testid="palette"]');
    for (const el of document.elementsFromPoint(x, y)) {
      if (palette?.contains(el)) return { place: null, palette: true, under: null };
      const g = el.closest('[data-place]');
      if (!g || !pane?.contains(g)) continue;
      const place = parsePlaceKey(g.getAttribute('data-place') ?? '');
      return { place: place && accepts(c.part, place) ? place : null, palette: false, under: place };
    }
    return { place: null, palette: false, under: null };
  };

  const announced = useRef<string | null>(null);
  const announcements = useMemo<Announcements>(
    () => ({
      onDragStart({ active }) {
        announced.current = null;
        const c = active.data.current as CarryData | undefined;
        if (!c?.part) return undefined;
        return `Picked up ${partNameWithHand(c.part)}${c.from ? ` from ${placeWords(c.from)}` : ''}. Arrow keys move between the slots that take it; Space puts it down; Escape puts it back.`;
      },
      onDragMove() {
        const { hover, overPalette, carrying } = carry.ui.getState();
        if (overPalette && carrying?.from) {
          if (announced.current === 'palette') return undefined;
          announced.current = 'palette';
          return 'Over the parts palette: drop to take the part off.';
        }
        const key = hover ? placeKey(hover) : '';
        if (key === announced.current) return undefined;
        announced.current = key;
        if (!hover) return undefined;
        const there = partNumberAt(store.getState().layout, hover);
        const p = there ? store.getState().catalog.byPartNumber.get(there) : undefined;
        return `Over ${placeWords(hover)}, ${p ? `holding a ${partName(p)}` : there ? `holding part ${there}` : 'empty'}.`;
      },
      onDragOver: () => undefined,
      // The result of a drop is read from the editor's own live region (with the findings).
      onDragEnd: () => '',
      onDragCancel({ active }) {
        const c = active.data.current as CarryData | undefined;
        return c?.part ? `Put back: ${partName(c.part)}${c.from ? ` stays at ${placeWords(c.from)}` : ''}.` : 'Put back.';
      },
    }),
    [carry, store],
  );

  const onDragStart = (_e: DragStartEvent) => {
    coordinateGetter.reset();
    carry.starting = false;
    const c = carry.data;
    carry.ui.setState({ carrying: c.part ? { part: c.part, from: c.from } : null, hover: null, overPalette: false });
  };

  const onDragMove = (e: DragMoveEvent) => {
    const start = e.activatorEvent;
    const c = carry.ui.getState().carrying;
    // Keyboard moves name their slot in the coordinate getter; pointer moves are found here.
    if (!c || !(start instanceof PointerEvent || start instanceof MouseEvent)) return;
    // The pointer's own position: dnd-kit's delta also counts the page scrolled meanwhile.
    const t = targetAt(carry.pointer.x, carry.pointer.y, c);
    if (t.palette !== carry.ui.getState().overPalette) carry.ui.setState({ overPalette: t.palette });
    setHover(t.place);
  };

  /** Nothing was placed: say so, and say where the part goes. */
  const dropMissed = (c: CarryData, under: Place | null) => {
    const what = partNameWithHand(c.part);
    const goes =
      c.part.kind === 'element'
        ? 'a half-position of the element ring'
        : c.part.kind === 'cover-plate'
          ? 'a cage-top slot'
          : 'a place on the rotor strip';
    const where = under ? `${placeLabel(under)} does not take a ${what}` : `Not over a slot that takes the ${what}`;
    const stays = c.from ? ` It stays at ${placeWords(c.from)}.` : '';
    store.getState().announce(`Nothing placed. ${where}; it goes in ${goes}, shown dashed while you carry it.${stays}`);
  };

  /** Puts the carried part where it was dropped (or takes it off over the palette). */
  const drop = (byKeyboard: boolean) => {
    const ui = carry.ui.getState();
    const c = ui.carrying;
    let { hover, overPalette } = ui;
    let under: Place | null = null;
    if (c && !byKeyboard) {
      // A mouse drop goes where the pointer is now, whatever the last move event said.
      const t = targetAt(carry.pointer.x, carry.pointer.y, c);
      hover = t.place;
      overPalette = t.palette;
      under = t.under;
    }
    carry.end();
    if (!c) return;
    const s = store.getState();
    if (overPalette) {
      if (c.from) s.removePart(c.from);
      else s.announce(`Put back: ${partName(c.part)}.`);
      return;
    }
    if (!hover || !accepts(c.part, hover)) return dropMissed(c, under);
    // After a keyboard drop, focus goes to where the part now is (the selection goes there too).
    const focus = byKeyboard;
    if (c.from) {
      if (!s.movePart(c.from, hover, { focus }) && focus) s.select(c.from, { focus });
    } else if (!s.placePart(c.part.partNumber, hover, { focus }) && focus) s.select(hover, { focus });
  };

  // dnd-kit asks before it ends a drag whether to cancel the drop, and waits for the answer.
  // The drop is made right there, and the answer (never cancel) comes after the next frame is
  // painted: the part and its findings are painted first, and dnd-kit tidies its own state
  // (which re-renders its context twice) after that frame, not before it.
  const cancelDrop = ({ activatorEvent }: { activatorEvent: Event | null }) => {
    drop(typeof KeyboardEvent !== 'undefined' && activatorEvent instanceof KeyboardEvent);
    return new Promise<boolean>((resolve) => afterPaint(() => resolve(false)));
  };

  // The drop was made in cancelDrop; this only makes sure nothing is left marked as carried.
  const onDragEnd = (_e: DragEndEvent) => carry.end();

  return (
    <div ref={root} className="cage-editor flex flex-col gap-3" data-testid="cage-editor">
      <header className="flex flex-wrap items-baseline justify-between gap-x-4 gap-y-1">
        <div>
          <h1 className="text-2xl font-bold">{layoutName}</h1>
          <p className="text-sm text-ink-muted">
            {machineName} · {familyName}
            {!canEdit && <span className="ml-2 rounded bg-steel-200 px-1.5 py-0.5 text-xs font-semibold text-ink-soft">Read only</span>}
          </p>
        </div>
      </header>
      <p id={INSTRUCTIONS_ID} className="sr-only">
        {INSTRUCTIONS}
      </p>
      <UnsavedGuard />
      <Toolbar />
      <CarryProvider value={carry}>
        <DndContext
          sensors={sensors}
          collisionDetection={collision}
          cancelDrop={cancelDrop}
          onDragStart={onDragStart}
          onDragMove={onDragMove}
          onDragEnd={onDragEnd}
          onDragCancel={({ activatorEvent }) => {
            carry.end();
            // Put back with the keys: focus stays where the part was picked up.
            const n = carry.node;
            if (activatorEvent instanceof KeyboardEvent && (n instanceof HTMLElement || n instanceof SVGElement))
              n.focus({ preventScroll: true });
          }}
          // Focus is ours to place after a drop (the slot the part went to), not dnd-kit's.
          accessibility={{ announcements, restoreFocus: false, screenReaderInstructions: { draggable: INSTRUCTIONS } }}
        >
          <CarryHandle carry={carry} disabled={!canEdit} />
          {/* From tablet width up each column is contained (layout and paint): a drop that changes
              the findings or one slot lays out and repaints that column, not the others. Not on
              phones, where the palette opens as a fixed sheet that must stay fixed to the screen. */}
          <div className="grid grid-cols-1 gap-3 md:grid-cols-2 xl:grid-cols-[19rem_minmax(0,1fr)_20rem] xl:items-start">
            <div className="min-w-0 md:[contain:layout_paint]">
              <Palette />
            </div>
            <div className="order-first min-w-0 md:col-span-2 md:[contain:layout_paint] xl:sticky xl:top-2 xl:order-none xl:col-span-1">
              <DiagramPane />
              <details className="mt-2 text-sm text-ink-soft">
                <summary className="cursor-pointer font-semibold">How to use the drawing</summary>
                <p className="mt-1 max-w-prose">{INSTRUCTIONS}</p>
              </details>
            </div>
            <div className="flex min-w-0 flex-col gap-3 md:[contain:layout_paint]">
              <FindingsList />
              <SettingsPanel />
            </div>
          </div>
          <CarryOverlay />
        </DndContext>
      </CarryProvider>
      <LiveRegion />
      <ConflictDialog />
    </div>
  );
}
