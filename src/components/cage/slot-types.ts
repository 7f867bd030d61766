/** What the diagram knows about one slot, handed to `renderSlot` / `slotProps` hooks. */
import type { SVGProps } from 'react';
import type { CatalogPart, Finding, Place, Severity } from '~/lib/domain/schemas';

export interface SlotInfo {
  place: Place;
  /** placeKey(place): 'element:2:left', 'cover:2:right', 'bar:1:4'. */
  key: string;
  /** The part placed here, when there is one and the catalog knows it. */
  part: CatalogPart | undefined;
  /** The placed part number (also when the catalog does not know it). */
  partNumber: string | undefined;
  /** Findings pinned here, most serious first. */
  findings: readonly Finding[];
  /** The most serious of them. */
  severity: Severity | undefined;
  /** Whether this slot may take a part at all (a cage-top section without a plate seat: false). */
  seat: boolean;
  selected: boolean;
  highlighted: boolean;
  changed: boolean;
  /** The slot's accessible name: place, content, findings. */
  label: string;
  /** Outer box of the slot in SVG units. */
  box: { x: number; y: number; w: number; h: number };
}

/** Attributes the diagram puts on each slot's <g>; a custom renderSlot must spread them. */
export type SlotAttrs = SVGProps<SVGGElement> & { 'data-place': string };
