/**
 * The drawing in the editor: the shared CageDiagram with each slot made a drop target, a
 * draggable (when it holds a part) and one stop of a roving tab order — Tab enters the drawing,
 * the arrow keys walk its slots in the drawing's order, Space picks a part up.
 */
import { useDraggable, useDroppable } from '@dnd-kit/core';
import { memo, useCallback, useEffect, useRef, type KeyboardEvent, type ReactNode } from 'react';
import { allPlaces, placeKey } from '../../lib/domain/places';
import type { MachineFamily } from '../../lib/domain/schemas';
import { CageDiagram, type SlotAttrs, type SlotInfo } from '../cage/CageDiagram';
import { IRIS } from '../cage/palette';
import { ARROW_DIRECTION, slotId, stepPlace, type CarryData } from './keyboard';
import { useEditor, useEditorStoreApi } from './store/context';
import { accepts } from './store/layout-edits';

export const INSTRUCTIONS_ID = 'cage-editor-instructions';

const NO_RESIZE_OBSERVER = { disabled: true } as const;

/**
 * The dnd-kit hooks of one slot. dnd-kit re-renders every hook user whenever a drag starts,
 * moves over a new target or ends, so this part stays small and hands plain values to the memoised
 * <g> below, which re-renders only when what it shows changes.
 */
function DndSlot({ info, attrs, children, canEdit }: { info: SlotInfo; attrs: SlotAttrs; children: ReactNode; canEdit: boolean }) {
  const tabStop = useEditor((s) => (s.selectedPlace ? placeKey(s.selectedPlace) === info.key : info.key === firstElementKey(s.family)));
  // Slots do not change size while a part is carried: no resize observers to set up per drag.
  const { setNodeRef: dropRef, isOver, active } = useDroppable({
    id: slotId(info.place),
    data: { place: info.place },
    disabled: !canEdit,
    resizeObserverConfig: NO_RESIZE_OBSERVER,
  });
  const draggable = canEdit && !!info.part;
  const carry: CarryData | undefined = info.part ? { part: info.part, from: info.place } : undefined;
  const { setNodeRef: dragRef, listeners, isDragging } = useDraggable({ id: `placed:${info.key}`, data: carry, disabled: !draggable });
  const ref = useCallback(
    (node: SVGGElement | null) => {
      dropRef(node as unknown as HTMLElement);
      dragRef(node as unknown as HTMLElement);
    },
    [dropRef, dragRef],
  );
  const carried = active?.data.current as CarryData | undefined;
  const takes = !!carried && accepts(carried.part, info.place);
  return (
    <SlotG
      info={info}
      attrs={attrs}
      gRef={ref}
      tabStop={tabStop}
      canEdit={canEdit}
      draggable={draggable}
      carrying={!!active}
      listeners={listeners}
      isDragging={isDragging}
      takes={takes}
      isOver={isOver}
    >
      {children}
    </SlotG>
  );
}

interface SlotGProps {
  info: SlotInfo;
  attrs: SlotAttrs;
  gRef: (node: SVGGElement | null) => void;
  tabStop: boolean;
  canEdit: boolean;
  draggable: boolean;
  carrying: boolean;
  listeners: ReturnType<typeof useDraggable>['listeners'];
  isDragging: boolean;
  takes: boolean;
  isOver: boolean;
  children: ReactNode;
}

const SlotG = memo(function SlotG({ info, attrs, gRef, tabStop, canEdit, draggable, carrying, listeners, isDragging, takes, isOver, children }: SlotGProps) {
  const store = useEditorStoreApi();
  const onKeyDown = (e: KeyboardEvent<SVGGElement>) => {
    if (carrying) return; // the keyboard sensor has the keys while a part is carried
    const dir = ARROW_DIRECTION[e.key];
    if (dir) {
      e.preventDefault();
      const s = store.getState();
      const next = stepPlace(s.family, allPlaces(s.family), info.place, dir);
      if (next) s.select(next, { focus: true });
      return;
    }
    if (draggable) listeners?.onKeyDown?.(e as never);
    if ((e.key === 'Enter' || e.key === ' ') && !info.part && canEdit && !e.defaultPrevented) {
      e.preventDefault();
      store.getState().announce(`${info.label}. To fill it, pick a part up in the palette with Space, move here with the arrow keys, and drop it with Space.`);
    }
  };
  const { x, y, w, h } = info.box;
  return (
    <g
      ref={gRef}
      {...attrs}
      role="button"
      tabIndex={tabStop ? 0 : -1}
      aria-roledescription={draggable ? 'slot with a part you can move' : 'slot'}
      aria-describedby={canEdit ? INSTRUCTIONS_ID : undefined}
      aria-pressed={info.selected}
      onPointerDown={draggable ? (listeners?.onPointerDown as never) : undefined}
      onKeyDown={onKeyDown}
      onClick={() => store.getState().select(info.place)}
      onFocus={() => {
        if (!info.selected) store.getState().select(info.place);
      }}
      className="cage-slot"
      style={{ cursor: draggable ? 'grab' : 'pointer', outline: 'none', opacity: isDragging ? 0.55 : 1, touchAction: 'none' }}
    >
      {children}
      {takes && (
        <rect x={x - 1} y={y - 1} width={w + 2} height={h + 2} rx={6} fill={isOver ? IRIS[100] : 'none'} fillOpacity={0.55} stroke={IRIS[500]} strokeWidth={isOver ? 4 : 1.5} strokeDasharray={isOver ? undefined : '4 4'} pointerEvents="none" />
      )}
    </g>
  );
});

const firstKeys = new WeakMap<MachineFamily, string>();
/** The drawing's tab stop when nothing is selected: the first half-position. */
function firstElementKey(family: MachineFamily): string {
  let k = firstKeys.get(family);
  if (k === undefined) {
    const p = allPlaces(family).find((x) => x.kind === 'element');
    k = p ? placeKey(p) : '';
    firstKeys.set(family, k);
  }
  return k;
}

export function DiagramPane() {
  const store = useEditorStoreApi();
  const family = useEditor((s) => s.family);
  const layout = useEditor((s) => s.layout);
  const catalog = useEditor((s) => s.catalog);
  const findings = useEditor((s) => s.findings);
  const units = useEditor((s) => s.units);
  const selected = useEditor((s) => s.selectedPlace);
  const highlight = useEditor((s) => s.highlightPlaces);
  const canEdit = useEditor((s) => s.canEdit);
  const focusSeq = useEditor((s) => s.focusSeq);
  const box = useRef<HTMLDivElement>(null);

  // Move keyboard focus to the selected place when asked (finding chosen, arrow keys).
  useEffect(() => {
    if (focusSeq === 0) return;
    const place = store.getState().selectedPlace;
    if (!place) return;
    const el =
      place.kind === 'setting'
        ? document.getElementById(`setting-${place.field}`)
        : box.current?.querySelector<SVGGElement>(`[data-place="${placeKey(place)}"]`);
    if (el) {
      el.focus({ preventScroll: true });
      el.scrollIntoView?.({ block: 'nearest', inline: 'nearest' });
    }
  }, [focusSeq, store]);

  const renderSlot = useCallback(
    (info: SlotInfo, attrs: SlotAttrs, drawing: ReactNode) => (
      <DndSlot key={info.key} info={info} attrs={attrs} canEdit={canEdit}>
        {drawing}
      </DndSlot>
    ),
    [canEdit],
  );

  return (
    <div ref={box} className="cage-pane rounded-lg border border-steel-200 bg-white p-2 shadow-sm sm:p-3" data-testid="diagram-pane">
      <CageDiagram
        family={family}
        layout={layout}
        catalog={catalog}
        findings={findings}
        units={units}
        selectedPlace={selected}
        highlightPlaces={highlight}
        renderSlot={renderSlot}
        endView={false}
        title={`Cage diagram, ${family.name}: the cage unrolled, front on the left`}
      />
    </div>
  );
}
