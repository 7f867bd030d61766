/** Small pictures and words for a catalog part, shared by the palette and the drag overlay. */
import type { CatalogPart } from '~/lib/domain/schemas';
import type { UnitSystem } from '~/lib/domain/units';
import { ElementSwatch } from '~/components/cage/patterns';
import { STEEL } from '~/components/cage/palette';
import { openingWords, partName } from '~/lib/domain/vocabulary';

export function PartSwatch({ part, id }: { part: CatalogPart; id: string }) {
  if (part.kind === 'element') return <ElementSwatch type={part.elementType} prefix={id} width={40} height={28} />;
  if (part.kind === 'cover-plate')
    return (
      <svg width={40} height={28} viewBox="0 0 40 28" aria-hidden="true" focusable="false">
        <rect x={1} y={5} width={38} height={18} rx={3} fill={STEEL[500]} stroke={STEEL[800]} />
        <rect x={8} y={11} width={10} height={5} rx={2.5} fill={STEEL[200]} />
        <rect x={22} y={11} width={10} height={5} rx={2.5} fill={STEEL[200]} />
      </svg>
    );
  const dark = part.barKind === 'straight' || part.barKind === 'discharge';
  return (
    <svg width={40} height={28} viewBox="0 0 40 28" aria-hidden="true" focusable="false">
      {part.barKind === 'discharge' ? (
        <path d="M3,10H28L37,6V22L28,18H3Z" fill={STEEL[700]} />
      ) : (
        <rect x={3} y={9} width={34} height={10} rx={part.barKind === 'straight' ? 1 : 3} fill={dark ? STEEL[800] : STEEL[500]} />
      )}
      {part.barKind === 'rasp' || part.barKind === 'spike-rasp'
        ? [8, 14, 20, 26, 32].map((x) => <line key={x} x1={x - 2} x2={x + 2} y1={17} y2={11} stroke={STEEL[200]} strokeWidth={1.3} />)
        : null}
      {part.barKind === 'spike-rasp' && [9, 21, 33].map((x) => <path key={x} d={`M${x - 3},9L${x},4L${x + 3},9Z`} fill={STEEL[700]} />)}
    </svg>
  );
}

/** "Wide-wire element" + "left hand · 14.0 mm opening". */
export function partTitle(part: CatalogPart): string {
  const w = partName(part);
  return w.charAt(0).toUpperCase() + w.slice(1);
}

export function partDetail(part: CatalogPart, units: UnitSystem): string {
  if (part.kind === 'element') return `${part.hand} hand · ${openingWords(part, units)}`;
  if (part.kind === 'cover-plate') return part.slotted ? 'slotted for vane bolts' : 'not slotted';
  return '';
}
