/**
 * The editor's screen: toolbar, parts palette, the drawing, settings and findings, wired to one
 * drag-and-drop context with pointer and keyboard sensors. Dropping a palette part places it,
 * dropping a placed part on another slot moves it (or swaps the two), dropping it on the palette
 * takes it off.
 */
import {
  DndContext,
  DragOverlay,
  useDndContext,
  KeyboardSensor,
  PointerSensor,
  pointerWithin,
  useSensor,
  useSensors,
  type Announcements,
  type CollisionDetection,
  type DragEndEvent,
  type DragStartEvent,
} from '@dnd-kit/core';
import { memo, useCallback, useMemo, useRef } from 'react';
import { partWordsWithHand, placeWords, partWords } from '../cage/words';
import { ConflictDialog } from './ConflictDialog';
import { DiagramPane, INSTRUCTIONS_ID } from './DiagramPane';
import { FindingsList } from './FindingsList';
import { placeFromSlotId, slotCoordinateGetter, type CarryData } from './keyboard';
import { LiveRegion } from './LiveRegion';
import { Palette, PALETTE_DROP_ID } from './Palette';
import { PartSwatch, partTitle } from './part-visuals';
import { SettingsPanel } from './SettingsPanel';
import { useEditor, useEditorStoreApi } from './store/context';
import { accepts, partNumberAt } from './store/layout-edits';
import { Toolbar } from './Toolbar';
import { useShortcuts } from './use-shortcuts';
import { useUnsavedGuard } from './use-unsaved-guard';

const INSTRUCTIONS =
  'To pick up a part, press Space. Carry it with the arrow keys: left and right step along the rotor from slot to slot, ' +
  'up and down go to the band above or below. Press Space again to put it down, or Escape to put it back. ' +
  'In the drawing, the arrow keys also move between slots, and Delete takes the part off the slot you are on.';

/** Only slots that take the carried part count; the palette counts when carrying a placed part. */
const collision: CollisionDetection = (args) => {
  const carry = args.active.data.current as CarryData | undefined;
  const droppableContainers = args.droppableContainers.filter((c) => {
    if (c.id === PALETTE_DROP_ID) return !!carry?.from && !!args.pointerCoordinates;
    const place = placeFromSlotId(c.id);
    return !!place && !!carry && accepts(carry.part, place);
  });
  const narrowed = { ...args, droppableContainers };
  if (args.pointerCoordinates) return pointerWithin(narrowed);
  // Keyboard: the coordinate getter centres the carried part on a slot, so the slot under its
  // centre is the one; a part just picked up in the palette is over nothing yet.
  const { collisionRect: c, droppableRects } = args;
  const cx = c.left + c.width / 2;
  const cy = c.top + c.height / 2;
  return droppableContainers
    .filter((d) => {
      const r = droppableRects.get(d.id);
      return !!r && cx >= r.left && cx <= r.left + r.width && cy >= r.top && cy <= r.top + r.height;
    })
    .map((d) => ({ id: d.id, data: { droppableContainer: d, value: 0 } }));
};

/** The part following the pointer (or the keyboard) while it is carried. */
const CarryOverlay = memo(function CarryOverlay() {
  const { active } = useDndContext();
  const carrying = active?.data.current as CarryData | undefined;
  // A wrapper that is always there, so the overlay coming and going never changes the
  // structure of the editor's children (sibling selectors would restyle the whole editor).
  return (
    <div className="editor-carry">
    <DragOverlay dropAnimation={null}>
      {carrying ? (
        <div className="pointer-events-none flex items-center gap-2 rounded-md border border-iris-500 bg-white px-2 py-1.5 text-sm font-semibold shadow-lg">
          <PartSwatch part={carrying.part} id="overlay" />
          {partTitle(carrying.part)}
          {carrying.part.kind === 'element' ? ` · ${carrying.part.hand === 'left' ? 'L' : 'R'}` : ''}
        </div>
      ) : null}
    </DragOverlay>
    </div>
  );
});

export function EditorApp() {
  const store = useEditorStoreApi();
  const canEdit = useEditor((s) => s.canEdit);
  const layoutName = useEditor((s) => s.layoutName);
  const machineName = useEditor((s) => s.machineName);
  const familyName = useEditor((s) => s.family.name);
  const dragging = useRef(false);

  useUnsavedGuard();
  useShortcuts(useCallback(() => dragging.current || store.getState().conflict !== null, [store]));

  const coordinateGetter = useMemo(() => slotCoordinateGetter(() => store.getState().family), [store]);
  const sensors = useSensors(
    useSensor(PointerSensor, { activationConstraint: { distance: 5 } }),
    useSensor(KeyboardSensor, { coordinateGetter }),
  );

  const announcements = useMemo<Announcements>(
    () => ({
      onDragStart({ active }) {
        const c = active.data.current as CarryData | undefined;
        if (!c) return undefined;
        return `Picked up ${partWordsWithHand(c.part)}${c.from ? ` from ${placeWords(c.from)}` : ''}. Arrow keys move between the slots that take it; Space puts it down; Escape puts it back.`;
      },
      onDragOver({ active, over }) {
        const c = active.data.current as CarryData | undefined;
        if (over?.id === PALETTE_DROP_ID) return 'Over the parts palette: drop to take the part off.';
        const place = placeFromSlotId(over?.id);
        if (!c || !place) return 'Not over a slot.';
        const there = partNumberAt(store.getState().layout, place);
        const p = there ? store.getState().catalog.byPartNumber.get(there) : undefined;
        return `Over ${placeWords(place)}, ${p ? `holding a ${partWords(p)}` : there ? `holding part ${there}` : 'empty'}.`;
      },
      // The result of a drop is read from the editor's own live region (with the findings).
      onDragEnd: () => '',
      onDragCancel({ active }) {
        const c = active.data.current as CarryData | undefined;
        return c ? `Put back: ${partWords(c.part)}${c.from ? ` stays at ${placeWords(c.from)}` : ''}.` : 'Put back.';
      },
    }),
    [store],
  );

  const onDragStart = (_e: DragStartEvent) => {
    dragging.current = true;
    coordinateGetter.reset();
  };

  const onDragEnd = (e: DragEndEvent) => {
    dragging.current = false;
    const c = e.active.data.current as CarryData | undefined;
    if (!c || !e.over) return;
    const s = store.getState();
    if (e.over.id === PALETTE_DROP_ID) {
      if (c.from) s.removePart(c.from);
    } else {
      const place = placeFromSlotId(e.over.id);
      if (place) {
        if (c.from) s.movePart(c.from, place);
        else s.placePart(c.part.partNumber, place);
      }
    }
  };

  return (
    <div className="cage-editor flex flex-col gap-3" data-testid="cage-editor">
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
      <Toolbar />
      <DndContext
        sensors={sensors}
        collisionDetection={collision}
        onDragStart={onDragStart}
        onDragEnd={onDragEnd}
        onDragCancel={() => {
          dragging.current = false;
        }}
        accessibility={{ announcements, screenReaderInstructions: { draggable: INSTRUCTIONS } }}
      >
        <div className="grid grid-cols-1 gap-3 md:grid-cols-2 xl:grid-cols-[19rem_minmax(0,1fr)_20rem] xl:items-start">
          <div className="min-w-0">
            <Palette />
          </div>
          <div className="min-w-0 md:order-first md:col-span-2 xl:order-none xl:col-span-1">
            <DiagramPane />
            <details className="mt-2 text-sm text-ink-soft">
              <summary className="cursor-pointer font-semibold">How to use the drawing</summary>
              <p className="mt-1 max-w-prose">{INSTRUCTIONS}</p>
            </details>
          </div>
          <div className="flex min-w-0 flex-col gap-3">
            <FindingsList />
            <SettingsPanel />
          </div>
        </div>
        <CarryOverlay />
      </DndContext>
      <LiveRegion />
      <ConflictDialog />
    </div>
  );
}
