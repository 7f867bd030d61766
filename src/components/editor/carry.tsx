/**
 * Carrying a part with dnd-kit, with one draggable for the whole island. Palette entries and
 * placed parts do not register a draggable each: when one is picked up (pointer down, or Space /
 * Enter), it hands its element and part to the single carry handle, which starts the drag. The
 * slot under the part is worked out here too (pointer position, or the keyboard's next slot),
 * not by dnd-kit droppables. dnd-kit re-renders every hook user on each drag event; with one
 * handle and no droppables a drag re-renders two small components instead of every slot and
 * palette entry.
 */
import { useDraggable } from '@dnd-kit/core';
import { createContext, useContext, useLayoutEffect, type KeyboardEvent, type PointerEvent } from 'react';
import { createStore, useStore, type StoreApi } from 'zustand';
import type { CatalogPart, Place } from '~/lib/domain/schemas';

export const CARRY_ID = 'carry';

/** What a carried part is (on dnd-kit's `active.data.current`). */
export interface CarryData {
  part: CatalogPart;
  /** Where it was picked up from; absent when it comes from the palette. */
  from?: Place;
}

export interface CarryUi {
  carrying: CarryData | null;
  /** The slot the part would go into if dropped now (only slots that take it). */
  hover: Place | null;
  /** The pointer is over the parts palette (a placed part dropped there comes off). */
  overPalette: boolean;
  /** The slot under the pointer when nothing is carried (its details show under the drawing). */
  pointed: Place | null;
  /**
   * A part chosen with a tap or click and not carried: the next slot tapped that takes it gets
   * it (phones, where dragging over a scrolling page is awkward).
   */
  armed: CatalogPart | null;
}

type StartEvent = PointerEvent<Element> | KeyboardEvent<Element>;

export interface Carry {
  /** The object dnd-kit holds as the draggable's data; filled in when a drag starts. */
  readonly data: { part: CatalogPart | null; from?: Place };
  readonly ui: StoreApi<CarryUi>;
  /**
   * A key has picked a part up but dnd-kit has not started the drag yet (it starts in an effect,
   * and its keyboard sensor listens only from the next task). Keys in that gap belong to the drag,
   * not to the drawing's own arrow-key moves.
   */
  starting: boolean;
  /** Start carrying `part` (from `from`, or the palette) with this pointer or key event on `node`. */
  begin: (e: StartEvent, part: CatalogPart, from: Place | undefined, node: Element) => void;
  /** Nothing is carried any more (dropped, put back, or tidied after a drop). */
  end: () => void;
  /** The element the part was picked up from (focus goes back there when a keyboard carry is put back). */
  node: Element | null;
  /**
   * Where the pointer is now, in viewport pixels, kept by a window listener while the editor is
   * open. dnd-kit's drag delta counts the page's scrolling during the drag (its auto-scroll
   * included) on top of the pointer's own movement, so it cannot say what is under the pointer.
   */
  pointer: { x: number; y: number };
}

export function createCarry(): Carry {
  return {
    data: { part: null },
    ui: createStore<CarryUi>()(() => ({ carrying: null, hover: null, overPalette: false, pointed: null, armed: null })),
    starting: false,
    node: null,
    pointer: { x: 0, y: 0 },
    begin: () => {},
    end() {
      this.starting = false;
      const { carrying, hover, overPalette } = this.ui.getState();
      if (carrying || hover || overPalette) this.ui.setState({ carrying: null, hover: null, overPalette: false });
    },
  };
}

const CarryContext = createContext<Carry | null>(null);
export const CarryProvider = CarryContext.Provider;

export function useCarry(): Carry {
  const c = useContext(CarryContext);
  if (!c) throw new Error('useCarry outside <CarryProvider>');
  return c;
}

export function useCarryUi<T>(selector: (s: CarryUi) => T): T {
  return useStore(useCarry().ui, selector);
}

/** The keys dnd-kit's keyboard sensor acts on while a part is carried. */
const SENSOR_KEYS = new Set(['Space', 'Enter', 'Escape', 'Tab', 'ArrowRight', 'ArrowLeft', 'ArrowUp', 'ArrowDown']);
const replayed = new WeakSet<Event>();

/**
 * For a key that reached a carried part's own handler: the keyboard sensor starts listening a
 * task after the pick-up, and a busy browser runs queued key presses before that task. A key
 * the sensor did not take (it prevents the default of every key it handles) is played again
 * once, a task later, when the sensor listens. Without this a quick Space, arrow could lose
 * the arrow.
 */
export function keepKeyForSensor(e: KeyboardEvent<Element>, carry: Carry) {
  const native = e.nativeEvent;
  if (!SENSOR_KEYS.has(native.code) || replayed.has(native)) return;
  const target = e.currentTarget;
  setTimeout(() => {
    if (native.defaultPrevented || !(carry.starting || carry.ui.getState().carrying)) return;
    const again = new globalThis.KeyboardEvent('keydown', {
      key: native.key,
      code: native.code,
      shiftKey: native.shiftKey,
      bubbles: true,
      cancelable: true,
    });
    replayed.add(again);
    target.dispatchEvent(again);
  }, 0);
}

/** Whether a key starts carrying (the keyboard sensor's start keys). */
export const isPickUpKey = (e: { code: string; key: string }) =>
  e.code === 'Space' || e.code === 'Enter' || e.key === ' ' || e.key === 'Enter';

/** The island's one draggable. Renders nothing; wires `carry.begin` to dnd-kit's activators. */
export function CarryHandle({ carry, disabled }: { carry: Carry; disabled: boolean }) {
  const { setNodeRef, setActivatorNodeRef, listeners } = useDraggable({ id: CARRY_ID, data: carry.data, disabled });
  useLayoutEffect(() => {
    carry.begin = (e, part, from, node) => {
      if (!listeners) return;
      carry.data.part = part;
      carry.data.from = from;
      carry.node = node;
      if (e.type === 'pointerdown') {
        const pe = e as PointerEvent<Element>;
        carry.pointer.x = pe.clientX;
        carry.pointer.y = pe.clientY;
      }
      setNodeRef(node as HTMLElement);
      setActivatorNodeRef(node as HTMLElement);
      if (e.type === 'pointerdown') listeners.onPointerDown?.(e);
      else if (e.type === 'keydown') {
        listeners.onKeyDown?.(e);
        // The keyboard sensor prevents the default of a key it starts a drag with.
        if (e.nativeEvent.defaultPrevented) carry.starting = true;
      }
    };
  });
  return null;
}
