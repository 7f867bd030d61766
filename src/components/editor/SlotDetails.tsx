/**
 * What the slot under the pointer (or the selected one) holds: part, part number, opening sizes
 * and open area, and how the opening compares with the crop's kernel. Shown under the drawing.
 */
import { memo } from 'react';
import { kernelPassage } from '~/lib/domain/cage-metrics';
import { capitalise } from '~/lib/domain/words';
import { cropPrograms } from '~/lib/domain/crops';
import { placeKey } from '~/lib/domain/places';
import { formatLength, mm, type UnitSystem } from '~/lib/domain/units';
import type { CatalogPart, CropId, Place } from '~/lib/domain/schemas';
import { kernelsOf, openingWords, partNameWithHand, placeWords } from '~/lib/domain/vocabulary';
import { useCarryUi } from './carry';
import { useEditor, useEditorLazy } from './store/context';
import { partNumberAt } from '~/lib/domain/layout-edits';

function kernelWords(part: CatalogPart, crop: CropId, units: UnitSystem): string | null {
  if (part.kind !== 'element') return null;
  const c = cropPrograms[crop];
  const p = kernelPassage(part.openingMm, c.kernel);
  const len = (x: number) => formatLength(mm(x), units);
  const kernels = capitalise(kernelsOf(crop));
  if (p.verdict === 'closed') return `No opening: ${kernelsOf(crop)} do not pass here.`;
  const by =
    p.opening === 'hole'
      ? `through a round hole by their middle size (${len(p.meanSizeMm)})`
      : `by their smallest size (${len(p.meanSizeMm)})`;
  if (p.verdict === 'blocked') return `${kernels} pass ${by}: they do not pass here, short by ${len(-p.meanMarginMm!)}.`;
  if (p.verdict === 'tight')
    return `${kernels} pass ${by}; the larger ones (about ${len(p.largerSizeMm)}) need ${len(p.requiredMarginMm)} to spare: tight here, short by ${len(-p.spareMm!)}.`;
  return `${kernels} pass ${by}; the larger ones (about ${len(p.largerSizeMm)}) pass with ${len(p.requiredMarginMm)} to spare and ${len(p.spareMm!)} more.`;
}

/** Memoised: it has no props, and the drawing re-rendering for an edit does not re-render it. */
export const SlotDetails = memo(function SlotDetails() {
  const hovered = useCarryUi((s) => s.pointed);
  // The details line follows an edit a moment after the drawing does (see useEditorLazy).
  const selected = useEditorLazy((s) => s.selectedPlace);
  const layout = useEditorLazy((s) => s.layout);
  const units = useEditorLazy((s) => s.units);
  const catalog = useEditor((s) => s.catalog);
  const place: Place | null = hovered ?? (selected && selected.kind !== 'setting' ? selected : null);
  const partNumber = place ? partNumberAt(layout, place) : undefined;
  const part = partNumber ? catalog.byPartNumber.get(partNumber) : undefined;
  const crop = layout.crop;
  if (!place) {
    return (
      <p className="text-sm text-ink-muted" data-testid="slot-details">
        Point at a slot, or select one, to see what it holds.
      </p>
    );
  }
  const where = placeWords(place);
  return (
    <div className="text-sm" data-testid="slot-details" data-detail-of={placeKey(place)} aria-live="off">
      <p>
        <span className="font-semibold">{where.charAt(0).toUpperCase() + where.slice(1)}:</span>{' '}
        {part ? (
          <>
            {partNameWithHand(part)} <span className="text-ink-muted">· {part.partNumber}</span>
            {part.kind === 'element' && (
              <span className="text-ink-muted">
                {' '}
                · {openingWords(part, units)} · open area {Math.round(part.openArea * 100)} %
              </span>
            )}
          </>
        ) : partNumber ? (
          `part ${partNumber}, not in the catalog`
        ) : (
          <span className="text-ink-muted">empty</span>
        )}
      </p>
      {part && kernelWords(part, crop, units) && <p className="text-ink-soft">{kernelWords(part, crop, units)}</p>}
    </div>
  );
});
