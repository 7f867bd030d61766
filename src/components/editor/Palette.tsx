/**
 * The parts palette: the family's catalog, searchable and filtered by zone, type and hand, with
 * what is on the shelf. Each part is picked up with the mouse, or with Space and carried with
 * the arrow keys; a click puts it into the selected slot when it goes there.
 */
import { isPickUpKey, keepKeyForSensor, useCarry, useCarryUi } from './carry';
import { INSTRUCTIONS_ID } from './instructions';
import { memo, useDeferredValue, useEffect, useMemo, useRef, useState } from 'react';
import type { CatalogPart, ElementType, Side, Zone } from '~/lib/domain/schemas';
import { formatLength, mm, type UnitSystem } from '~/lib/domain/units';
import { ELEMENT_TYPES, elementTypeLabel, partName, partNameWithHand, placeWords } from '~/lib/domain/vocabulary';
import { PartSwatch, partDetail, partTitle } from './part-visuals';
import { useEditor, useEditorLazy, useEditorStoreApi } from './store/context';
import { accepts } from '~/lib/domain/layout-edits';
import type { StockCount } from './store/types';

type TypeFilter = 'all' | ElementType | 'cover-plate' | 'rotor-bar';

/** "Fine-wire", "Fine-wire concave", "Right cover plate", "Rasp bar". */
function shortName(p: CatalogPart): string {
  if (p.kind === 'element') return `${elementTypeLabel(p.elementType)}${p.role === 'either' ? '' : ` ${p.role}`}`;
  return partTitle(p);
}

function stockWords(s: StockCount | undefined): string {
  if (!s || (s.own === 0 && s.dealer === 0)) return 'none on the shelf';
  const parts: string[] = [];
  if (s.own) parts.push(`${s.own} on the farm`);
  if (s.dealer) parts.push(`${s.dealer} at the dealer`);
  return parts.join(' · ');
}

/** What a palette entry shows; memoised so drags (which re-render every draggable) skip it. */
const PaletteItemBody = memo(function PaletteItemBody({
  part,
  units,
  stock,
}: {
  part: CatalogPart;
  units: UnitSystem;
  stock: StockCount | undefined;
}) {
  const detail =
    part.kind === 'element'
      ? part.openingMm
        ? formatLength(mm(part.openingMm.width), units) + ' gap'
        : 'no opening'
      : partDetail(part, units);
  const inStock = !!stock && stock.own + stock.dealer > 0;
  return (
    <>
      <PartSwatch part={part} id={`pal-${part.partNumber}`} />
      <span className="min-w-0 flex-1">
        <span className="block truncate text-sm font-semibold text-ink">
          {shortName(part)}
          {part.kind === 'element' && <span className="font-normal text-ink-soft"> · {part.hand}</span>}
        </span>
        <span className="block truncate text-xs text-ink-muted">
          {part.partNumber}
          {detail && ` · ${detail}`}
        </span>
      </span>
      <span
        className={`max-w-[7.5rem] shrink-0 rounded px-1.5 py-0.5 text-right text-xs font-semibold leading-tight ${inStock ? 'bg-ok-soft text-ok' : 'bg-steel-100 text-ink-muted'}`}
        data-testid="stock-badge"
      >
        {inStock ? stockWords(stock) : 'to order'}
      </span>
    </>
  );
});

const PaletteItem = memo(function PaletteItem({
  part,
  units,
  stock,
  canEdit,
  tabStop,
}: {
  part: CatalogPart;
  units: UnitSystem;
  stock: StockCount | undefined;
  canEdit: boolean;
  tabStop: boolean;
}) {
  const store = useEditorStoreApi();
  const carry = useCarry();
  return (
    <div
      role="option"
      aria-selected={tabStop}
      aria-disabled={!canEdit || undefined}
      tabIndex={tabStop ? 0 : -1}
      aria-roledescription="part to place"
      aria-describedby={canEdit ? `${PALETTE_KEYS_ID} ${INSTRUCTIONS_ID}` : undefined}
      aria-label={`${partTitle(part)}${part.kind === 'element' ? `, ${part.hand} hand` : ''}, ${part.partNumber}. ${stockWords(stock)}.`}
      onPointerDown={canEdit ? (e) => carry.begin(e, part, undefined, e.currentTarget) : undefined}
      onKeyDown={(e) => {
        if (!canEdit) return;
        // While a part is carried, the keyboard sensor has the keys (Space drops it).
        if (carry.starting || carry.ui.getState().carrying) keepKeyForSensor(e, carry);
        else if (isPickUpKey(e)) carry.begin(e, part, undefined, e.currentTarget);
      }}
      onClick={() => {
        if (!canEdit) return;
        const s = store.getState();
        const target = s.selectedPlace;
        if (target && accepts(part, target) && !carry.ui.getState().armed) {
          s.placePart(part.partNumber, target);
          return;
        }
        // Otherwise the part is chosen: the next slot tapped that takes it gets it.
        const was = carry.ui.getState().armed;
        if (was?.partNumber === part.partNumber) {
          carry.ui.setState({ armed: null });
          s.announce(`Let go of the ${partName(part)}.`);
          return;
        }
        carry.ui.setState({ armed: part });
        s.announce(`Chosen: ${partNameWithHand(part)}. Tap or click a slot that takes it (dashed in the drawing) to put it there.`);
      }}
      className={`palette-option flex w-full items-center md:touch-none gap-2.5 rounded-md border border-steel-200 bg-white px-2 py-1.5 text-left outline-none focus-visible:ring-2 focus-visible:ring-iris-500 ${
        canEdit ? 'cursor-pointer hover:border-iris-400 hover:bg-iris-50' : 'cursor-default'
      }`}
      data-part={part.partNumber}
    >
      <PaletteItemBody part={part} units={units} stock={stock} />
    </div>
  );
});

/** The keys of the parts list, for screen readers (the list is one tab stop). */
const PALETTE_KEYS_ID = 'palette-keys';
const LIST_KEYS: Record<string, (i: number, n: number) => number> = {
  ArrowDown: (i, n) => Math.min(n - 1, i + 1),
  ArrowUp: (i) => Math.max(0, i - 1),
  Home: () => 0,
  End: (_i, n) => n - 1,
  PageDown: (i, n) => Math.min(n - 1, i + 8),
  PageUp: (i) => Math.max(0, i - 8),
};

/** Search, filters and the parts list (no drag state here, so drags never re-render the inputs). */
const PaletteContents = memo(function PaletteContents() {
  const catalog = useEditor((s) => s.catalog.parts);
  const units = useEditor((s) => s.units);
  const stock = useEditor((s) => s.stock);
  const canEdit = useEditor((s) => s.canEdit);
  const [query, setQuery] = useState('');
  const [zone, setZone] = useState<'any' | Zone>('any');
  const [type, setType] = useState<TypeFilter>('all');
  const [hand, setHand] = useState<'any' | Side>('any');
  const q = useDeferredValue(query.trim().toLowerCase());
  // The parts list is one tab stop (a roving tabindex): the part last moved to with the arrows.
  const [active, setActive] = useState<string | null>(null);
  const carry = useCarry();

  const shown = useMemo(() => {
    return catalog.filter((p) => {
      if (type !== 'all') {
        if (type === 'cover-plate' || type === 'rotor-bar') {
          if (p.kind !== type) return false;
        } else if (p.kind !== 'element' || p.elementType !== type) return false;
      }
      if (zone !== 'any' && p.kind === 'element' && !p.zones.includes(zone)) return false;
      if (zone !== 'any' && p.kind !== 'element') return false;
      if (hand !== 'any' && ((p.kind === 'element' && p.hand !== hand) || (p.kind === 'cover-plate' && p.side !== hand))) return false;
      if (q) {
        const hay =
          `${p.name} ${p.partNumber} ${partTitle(p)} ${p.kind === 'element' ? `${p.hand} ${elementTypeLabel(p.elementType)}` : ''}`.toLowerCase();
        if (!q.split(/\s+/).every((w) => hay.includes(w))) return false;
      }
      return true;
    });
  }, [catalog, type, zone, hand, q]);

  const groups: { title: string; parts: CatalogPart[] }[] = [
    { title: 'Elements', parts: shown.filter((p) => p.kind === 'element') },
    { title: 'Cover plates', parts: shown.filter((p) => p.kind === 'cover-plate') },
    { title: 'Rotor bars', parts: shown.filter((p) => p.kind === 'rotor-bar') },
  ].filter((g) => g.parts.length > 0);
  const ordered = groups.flatMap((g) => g.parts);
  const stop = active && ordered.some((p) => p.partNumber === active) ? active : (ordered[0]?.partNumber ?? null);

  return (
    <>
      <div className="mt-3 flex flex-col gap-2">
        <label className="block">
          <span className="field-label">Search parts</span>
          <input
            type="search"
            className="field-input py-1.5 text-sm"
            value={query}
            onChange={(e) => setQuery(e.target.value)}
            placeholder="Name or part number"
          />
        </label>
        <div className="grid grid-cols-3 gap-2">
          <div>
            <label htmlFor="palette-zone" className="field-label">
              Zone
            </label>
            <select
              id="palette-zone"
              className="field-input py-1.5 text-sm"
              value={zone}
              onChange={(e) => setZone(e.target.value as typeof zone)}
            >
              <option value="any">Any</option>
              <option value="threshing">Threshing</option>
              <option value="separating">Separating</option>
            </select>
          </div>
          <div>
            <label htmlFor="palette-type" className="field-label">
              Type
            </label>
            <select
              id="palette-type"
              className="field-input py-1.5 text-sm"
              value={type}
              onChange={(e) => setType(e.target.value as TypeFilter)}
            >
              <option value="all">All</option>
              {ELEMENT_TYPES.map((t) => (
                <option key={t} value={t}>
                  {elementTypeLabel(t)}
                </option>
              ))}
              <option value="cover-plate">Cover plate</option>
              <option value="rotor-bar">Rotor bar</option>
            </select>
          </div>
          <div>
            <label htmlFor="palette-hand" className="field-label">
              Hand
            </label>
            <select
              id="palette-hand"
              className="field-input py-1.5 text-sm"
              value={hand}
              onChange={(e) => setHand(e.target.value as typeof hand)}
            >
              <option value="any">Any</option>
              <option value="left">Left</option>
              <option value="right">Right</option>
            </select>
          </div>
        </div>
      </div>
      <p className="mt-2 text-xs text-ink-muted" aria-live="polite">
        {shown.length} of {catalog.length} parts
      </p>
      <p id={PALETTE_KEYS_ID} className="sr-only">
        Up and Down arrows move through the parts; Home and End go to the first and last.
      </p>
      {/* The options take focus themselves (one tab stop, arrows move it); the list only hears their events. */}
      {/* eslint-disable-next-line jsx-a11y/interactive-supports-focus */}
      <div
        role="listbox"
        aria-labelledby="palette-h"
        className="mt-1"
        data-testid="palette-list"
        onFocus={(e) => {
          const pn = (e.target as HTMLElement).dataset?.part;
          if (pn && pn !== active) setActive(pn);
        }}
        onKeyDown={(e) => {
          // Carrying, the arrows move the part (the keyboard sensor has them).
          if (carry.starting || carry.ui.getState().carrying) return;
          const step = LIST_KEYS[e.key];
          if (!step) return;
          const options = [...e.currentTarget.querySelectorAll<HTMLElement>('[role="option"]')];
          const i = options.findIndex((o) => o.contains(e.target as Node));
          if (i < 0) return;
          e.preventDefault();
          const next = options[step(i, options.length)];
          if (!next) return;
          setActive(next.dataset.part ?? null);
          next.focus();
          next.scrollIntoView?.({ block: 'nearest' });
        }}
      >
        {groups.map((g) => (
          <div key={g.title} role="group" aria-label={g.title} className="mt-3">
            <div aria-hidden="true" className="text-xs font-bold uppercase tracking-wide text-ink-soft">
              {g.title}
            </div>
            <div className="mt-1 flex flex-col gap-1">
              {g.parts.map((p) => (
                <PaletteItem
                  key={p.partNumber}
                  part={p}
                  units={units}
                  stock={stock[p.partNumber]}
                  canEdit={canEdit}
                  tabStop={p.partNumber === stop}
                />
              ))}
            </div>
          </div>
        ))}
      </div>
    </>
  );
});

/** The hint under the heading follows the selected slot, after the frame that shows an edit. */
function PaletteHint() {
  const canEdit = useEditor((s) => s.canEdit);
  const selected = useEditorLazy((s) => s.selectedPlace);
  return (
    <p className="mt-0.5 text-xs text-ink-muted" data-testid="palette-hint">
      {canEdit
        ? selected && selected.kind !== 'setting'
          ? `Click a part to put it at ${placeWords(selected)}, or drag it onto the drawing.`
          : 'Drag a part onto the drawing; or tap it, then tap a slot; or pick it up with Space and move with the arrow keys.'
        : 'Read only: you may look, not change.'}
    </p>
  );
}

/** While a placed part is carried: the palette is where it comes off. */
function TakeOffHint() {
  const fromSlot = useCarryUi((s) => !!s.carrying?.from);
  const over = useCarryUi((s) => s.overPalette);
  if (!fromSlot) return null;
  return (
    <div
      className={`mt-2 rounded border border-dashed p-2 text-center text-sm ${over ? 'border-iris-600 bg-iris-100 font-semibold text-iris-800' : 'border-iris-400 bg-iris-50 text-iris-700'}`}
    >
      Drop here to take the part off
    </div>
  );
}

/**
 * The parts palette (also where a placed part is dropped to take it off). On a phone it is a
 * sheet over the bottom of the screen, opened with the "Parts" button, and it closes when a part
 * is chosen so the drawing is there to tap.
 */
export function Palette() {
  const [open, setOpen] = useState(false);
  const armed = useCarryUi((s) => s.armed);
  const sheet = useRef<HTMLElement>(null);
  const opener = useRef<HTMLButtonElement>(null);
  useEffect(() => {
    if (armed) setOpen(false);
  }, [armed]);
  useEffect(() => {
    if (open) sheet.current?.querySelector<HTMLElement>('[data-sheet-close]')?.focus();
  }, [open]);
  const close = () => {
    setOpen(false);
    opener.current?.focus();
  };
  return (
    <>
      <button
        ref={opener}
        type="button"
        className="btn-primary fixed bottom-3 right-3 z-30 shadow-lg md:hidden"
        aria-expanded={open}
        aria-controls="palette"
        onClick={() => setOpen(true)}
        data-testid="parts-sheet-open"
      >
        {armed ? `Parts · ${partTitle(armed)}` : 'Parts'}
      </button>
      {/* Escape closes the sheet from whichever of its controls has focus (a delegated handler). */}
      {/* eslint-disable-next-line jsx-a11y/no-noninteractive-element-interactions */}
      <section
        ref={sheet}
        id="palette"
        aria-labelledby="palette-h"
        onKeyDown={(e) => {
          if (open && e.key === 'Escape') {
            e.stopPropagation();
            close();
          }
        }}
        className={`palette-sheet rounded-lg [contain:layout_paint] border border-steel-200 bg-white p-3 shadow-sm max-md:fixed max-md:inset-x-0 max-md:bottom-0 max-md:z-40 max-md:max-h-[80vh] max-md:overflow-y-auto max-md:rounded-b-none max-md:shadow-2xl ${open ? '' : 'max-md:hidden'}`}
        data-testid="palette"
        data-open={open || undefined}
      >
        <div className="flex items-baseline justify-between gap-2">
          <h2 id="palette-h" className="text-base font-semibold">
            Parts
          </h2>
          <button type="button" className="btn md:hidden" data-sheet-close onClick={close}>
            Close
          </button>
        </div>
        <PaletteHint />
        <TakeOffHint />
        <PaletteContents />
      </section>
    </>
  );
}
