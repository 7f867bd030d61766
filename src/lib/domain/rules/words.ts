/** Plain words for places and parts, so findings speak of positions and parts, never ids. */
import type { CatalogPart, ElementType, Side } from '../schemas';

const ELEMENT_WORDS: Record<ElementType, string> = {
  'fine-wire': 'fine-wire',
  'wide-wire': 'wide-wire',
  'skip-wire': 'skip-wire',
  'round-bar': 'round-bar',
  perforated: 'perforated-plate',
  blank: 'blank-plate',
  'close-bar': 'close-bar',
};

export const elementWord = (t: ElementType): string => ELEMENT_WORDS[t];

export function partWords(p: CatalogPart): string {
  switch (p.kind) {
    case 'element':
      return `${p.hand}-hand ${ELEMENT_WORDS[p.elementType]} ${p.role === 'either' ? 'element' : p.role}`;
    case 'cover-plate':
      return `${p.side} cover plate`;
    case 'rotor-bar':
      return p.barKind === 'rasp' ? 'rasp bar' : `${p.barKind.replace('-', ' ')} bar`;
  }
}

export const halfWords = (position: number, side: Side): string => `position ${position}, ${side} half`;
export const coverWords = (section: number, side: Side): string => `cage-top section ${section}, ${side} side`;
export const barWords = (row: number, position: number): string => `rotor bar row ${row} at position ${position}`;

export function listWords(items: readonly (string | number)[]): string {
  if (items.length <= 1) return items.join('');
  return `${items.slice(0, -1).join(', ')} and ${items[items.length - 1]}`;
}

export const fmtMm = (n: number): string => `${(Math.round(n * 100) / 100).toString()} mm`;
