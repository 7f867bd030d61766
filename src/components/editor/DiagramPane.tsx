/**
 * The drawing in the editor: the shared CageDiagram with each slot one stop of a roving tab
 * order (Tab enters the drawing, the arrow keys walk its slots in the drawing's order), a place
 * to pick a placed part up (pointer, or Space / Enter), and the drop highlights on top.
 */
import { memo, useCallback, useEffect, useMemo, useRef, type KeyboardEvent, type ReactNode } from 'react';
import { allPlaces, placeKey } from '~/lib/domain/places';
import type { MachineFamily, Place } from '~/lib/domain/schemas';
import { CageDiagram, type SlotAttrs, type SlotInfo } from '~/components/cage/CageDiagram';
import { diagramGeometry, slotBox } from '~/components/cage/geometry';
import { IRIS } from '~/components/cage/palette';
import { afterPaint } from './after-paint';
import { isPickUpKey, keepKeyForSensor, useCarry, useCarryUi } from './carry';
import { accepts } from '~/lib/domain/layout-edits';
import { partTitle } from './part-visuals';
import { partName } from '~/lib/domain/vocabulary';
import { SlotDetails } from './SlotDetails';
import { ARROW_DIRECTION, slotsFor, stepPlace } from './keyboard';
import { useEditor, useEditorStoreApi } from './store/context';

import { INSTRUCTIONS_ID } from './instructions';
const GEOMETRY_OPTIONS = { compact: false, endView: false } as const;
/** The smallest type in the (non-compact) drawing, in drawing units, and the least it may show at. */
const SMALLEST_FONT_UNITS = 9;
const MIN_TEXT_PX = 11;

/** The part chosen with a tap, waiting for a slot; a button lets go of it (its own state only). */
const ChosenPart = memo(function ChosenPart() {
  const carry = useCarry();
  const armed = useCarryUi((s) => s.armed);
  useEffect(() => {
    if (!armed) return;
    const onKey = (e: globalThis.KeyboardEvent) => {
      if (e.key === 'Escape') carry.ui.setState({ armed: null });
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [armed, carry]);
  if (!armed) return null;
  return (
    <div
      className="mb-2 flex flex-wrap items-center justify-between gap-2 rounded-md border border-iris-400 bg-iris-50 px-2 py-1.5 text-sm text-iris-800"
      data-testid="chosen-part"
    >
      <span>
        <span className="font-semibold">{partTitle(armed)}</span>
        {armed.kind === 'element' ? ` · ${armed.hand}` : ''}: tap a dashed slot to put it there.
      </span>
      <button type="button" className="btn py-1" onClick={() => carry.ui.setState({ armed: null })}>
        Let go
      </button>
    </div>
  );
});

interface EditorSlotProps {
  info: SlotInfo;
  attrs: SlotAttrs;
  canEdit: boolean;
  children: ReactNode;
}

const selectsNoSlot = (s: { selectedPlace: Place | null }) => s.selectedPlace === null || s.selectedPlace.kind === 'setting';
const never = () => false;

const EditorSlot = memo(function EditorSlot({ info, attrs, canEdit, children }: EditorSlotProps) {
  const store = useEditorStoreApi();
  const carry = useCarry();
  // The drawing's one tab stop: the selected slot, or its first element slot while no slot is
  // selected. Only that first slot watches the selection; the rest know it from `info`.
  const first = useEditor((s) => info.key === firstElementKey(s.family));
  const noSlotSelected = useEditor(first ? selectsNoSlot : never);
  const tabStop = info.selected || (first && noSlotSelected);
  const movable = canEdit && !!info.part;

  const onKeyDown = (e: KeyboardEvent<SVGGElement>) => {
    // The keyboard sensor has the keys while a part is carried.
    if (carry.starting || carry.ui.getState().carrying) return keepKeyForSensor(e, carry);
    const dir = ARROW_DIRECTION[e.key];
    if (dir) {
      e.preventDefault();
      const s = store.getState();
      // From the selected slot: focus follows the selection a frame later, so a quick second
      // arrow may still reach the slot it left.
      const from = s.selectedPlace && s.selectedPlace.kind !== 'setting' ? s.selectedPlace : info.place;
      const next = stepPlace(s.family, allPlaces(s.family), from, dir);
      if (next) s.select(next, { focus: true });
      return;
    }
    if (!isPickUpKey(e) || !canEdit) return;
    if (info.part) carry.begin(e, info.part, info.place, e.currentTarget);
    else {
      e.preventDefault();
      store
        .getState()
        .announce(
          `${info.label}. To fill it, pick a part up in the palette with Space, move here with the arrow keys, and drop it with Space.`,
        );
    }
  };

  return (
    <g
      {...attrs}
      role="button"
      tabIndex={tabStop ? 0 : -1}
      aria-roledescription={movable ? 'slot with a part you can move' : 'slot'}
      aria-describedby={canEdit ? INSTRUCTIONS_ID : undefined}
      aria-pressed={info.selected}
      onPointerDown={movable ? (e) => carry.begin(e, info.part!, info.place, e.currentTarget) : undefined}
      onKeyDown={onKeyDown}
      onClick={() => {
        // A part chosen in the palette (tap, then tap a slot) goes into the slot tapped.
        const armed = carry.ui.getState().armed;
        if (armed && canEdit) {
          if (accepts(armed, info.place)) {
            carry.ui.setState({ armed: null });
            store.getState().placePart(armed.partNumber, info.place, { focus: true });
          } else store.getState().announce(`${info.label.split(':')[0]} does not take a ${partName(armed)}; tap a dashed slot.`);
          return;
        }
        store.getState().select(info.place);
      }}
      onFocus={() => {
        if (!info.selected) store.getState().select(info.place);
      }}
      onPointerEnter={() => carry.ui.setState({ pointed: info.place })}
      onPointerLeave={() => {
        if (carry.ui.getState().pointed === info.place) carry.ui.setState({ pointed: null });
      }}
      className="cage-slot"
      style={{ cursor: movable ? 'grab' : 'pointer', outline: 'none', touchAction: movable ? 'none' : undefined }}
    >
      {children}
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

/** While a part is carried: the slots that take it (dashed), the one it is over (solid), its source (faded). */
function DropHighlights({ family }: { family: MachineFamily }) {
  const carried = useCarryUi((s) => s.carrying);
  const armed = useCarryUi((s) => s.armed);
  const hover = useCarryUi((s) => s.hover);
  const geo = useMemo(() => diagramGeometry(family, GEOMETRY_OPTIONS), [family]);
  // A part chosen with a tap shows its slots the same way as one carried.
  const carrying = carried ?? (armed ? { part: armed, from: undefined } : null);
  const carryingPart = carrying?.part;
  const targets = useMemo(() => (carryingPart ? slotsFor(family, carryingPart) : []), [family, carryingPart]);
  if (!carrying) return null;
  const hoverKey = hover ? placeKey(hover) : null;
  const from = carrying.from ? slotBox(family, geo, carrying.from) : null;
  return (
    <g pointerEvents="none" aria-hidden="true" data-testid="drop-highlights">
      {from && <rect x={from.x} y={from.y} width={from.w} height={from.h} rx={5} fill="#fff" fillOpacity={0.5} />}
      {targets.map((p) => {
        const b = slotBox(family, geo, p);
        if (!b) return null;
        const over = placeKey(p) === hoverKey;
        return (
          <rect
            key={placeKey(p)}
            x={b.x - 1}
            y={b.y - 1}
            width={b.w + 2}
            height={b.h + 2}
            rx={6}
            fill={over ? IRIS[100] : 'none'}
            fillOpacity={0.55}
            stroke={IRIS[500]}
            strokeWidth={over ? 4 : 1.5}
            strokeDasharray={over ? undefined : '4 4'}
          />
        );
      })}
    </g>
  );
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

  // Move keyboard focus to the selected place when asked (finding chosen, arrow keys, a keyboard
  // drop), after the frame that shows the edit is painted: focusing and scrolling restyle the
  // page and run focus handlers, and the part and its findings are painted without waiting for
  // them (the focus ring follows one frame later).
  useEffect(() => {
    if (focusSeq === 0) return;
    return afterPaint(() => {
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
    });
  }, [focusSeq, store]);

  const renderSlot = useCallback(
    (info: SlotInfo, attrs: SlotAttrs, drawing: ReactNode) => (
      <EditorSlot info={info} attrs={attrs} canEdit={canEdit}>
        {drawing}
      </EditorSlot>
    ),
    [canEdit],
  );
  const overlay = useMemo(() => <DropHighlights family={family} />, [family]);
  // On a phone the drawing keeps a size at which its smallest words are 11 CSS px or more.
  const minWidth = useMemo(() => (diagramGeometry(family, GEOMETRY_OPTIONS).width * MIN_TEXT_PX) / SMALLEST_FONT_UNITS, [family]);

  return (
    <div
      ref={box}
      id="editor-drawing"
      tabIndex={-1}
      // The skip link lands here; focus goes on to the drawing's own tab stop (a slot).
      onFocus={(e) => {
        if (e.target !== e.currentTarget) return;
        box.current?.querySelector<SVGGElement>('[data-place][tabindex="0"]')?.focus();
      }}
      className="cage-pane outline-none rounded-lg [contain:layout_paint] border border-steel-200 bg-white p-2 shadow-sm sm:p-3"
      data-testid="diagram-pane"
    >
      <ChosenPart />
      <p className="mb-1 text-sm text-ink-soft md:hidden" data-testid="drawing-scroll-hint">
        The drawing is wider than the screen: swipe it sideways to see the rear positions.
      </p>
      <div
        className="cage-scroll -mx-2 overflow-x-auto px-2 sm:-mx-3 sm:px-3"
        style={{ ['--cage-min-w' as string]: `${Math.ceil(minWidth)}px` }}
        data-testid="drawing-scroll"
      >
        <CageDiagram
          family={family}
          layout={layout}
          catalog={catalog}
          findings={findings}
          units={units}
          selectedPlace={selected}
          highlightPlaces={highlight}
          renderSlot={renderSlot}
          overlay={overlay}
          compact={GEOMETRY_OPTIONS.compact}
          endView={GEOMETRY_OPTIONS.endView}
          title={`Cage diagram, ${family.name}: the cage unrolled, front on the left`}
        />
      </div>
      <div className="mt-2 border-t border-steel-100 px-1 pt-2">
        <SlotDetails />
      </div>
    </div>
  );
}
