/**
 * Bills of materials: the parts a layout needs beyond what the machine already carries and
 * what is on the shelf. A part on the machine counts wherever it sits, because it can be moved;
 * so for a fixed layout this is exactly the number of purchases the planner finds.
 */
import type { CatalogIndex } from '~/lib/domain/catalog';
import type { CatalogPart, Layout, Side } from '~/lib/domain/schemas';

export interface BomLine {
  partNumber: string;
  description: string;
  /** An element's hand or a cover plate's side; null for rotor bars. */
  hand: Side | null;
  quantity: number;
  unitPriceCents: number;
  lineTotalCents: number;
}

export interface Bom {
  lines: BomLine[];
  totalCents: number;
  /** Part numbers of the layout that the catalog does not know (nothing can be ordered for them). */
  unknown: string[];
}

export function handOf(part: CatalogPart): Side | null {
  return part.kind === 'element' ? part.hand : part.kind === 'cover-plate' ? part.side : null;
}

export function bomLine(part: CatalogPart, quantity: number): BomLine {
  return {
    partNumber: part.partNumber,
    description: part.name,
    hand: handOf(part),
    quantity,
    unitPriceCents: part.priceCents,
    lineTotalCents: part.priceCents * quantity,
  };
}

export function bomTotal(lines: readonly Pick<BomLine, 'quantity' | 'unitPriceCents'>[]): number {
  return lines.reduce((sum, l) => sum + l.quantity * l.unitPriceCents, 0);
}

/** Every part number a layout places, with how many times. */
export function partCounts(layout: Layout | null): Map<string, number> {
  const counts = new Map<string, number>();
  if (!layout) return counts;
  for (const { partNumber } of [...layout.elements, ...layout.coverPlates, ...layout.rotorBars])
    counts.set(partNumber, (counts.get(partNumber) ?? 0) + 1);
  return counts;
}

/** What `target` needs beyond `installed` and `shelf`, in catalog order. */
export function billOfMaterials(
  catalog: CatalogIndex,
  target: Layout,
  installed: Layout | null,
  shelf: Readonly<Record<string, number>>,
): Bom {
  const need = partCounts(target);
  const have = partCounts(installed);
  const lines: BomLine[] = [];
  const unknown: string[] = [];
  for (const [partNumber, n] of need) {
    const part = catalog.byPartNumber.get(partNumber);
    if (!part) {
      unknown.push(partNumber);
      continue;
    }
    const missing = n - (have.get(partNumber) ?? 0) - Math.max(0, shelf[partNumber] ?? 0);
    if (missing > 0) lines.push(bomLine(part, missing));
  }
  const order = new Map(catalog.parts.map((p, i) => [p.partNumber, i] as const));
  lines.sort((a, b) => (order.get(a.partNumber) ?? 0) - (order.get(b.partNumber) ?? 0));
  return { lines, totalCents: bomTotal(lines), unknown };
}

/** A short, stable fingerprint of a text (FNV-1a, 32 bits, hex). */
export function fingerprint(text: string): string {
  let h = 0x811c9dc5;
  for (let i = 0; i < text.length; i++) {
    h ^= text.charCodeAt(i);
    h = Math.imul(h, 0x01000193) >>> 0;
  }
  return h.toString(16).padStart(8, '0');
}
