/** One half-position of the element ring: the element's pattern, its label, its hand, findings. */
import { memo } from 'react';
import type { Side } from '~/lib/domain/schemas';
import type { UnitSystem } from '~/lib/domain/units';
import { formatLength, mm } from '~/lib/domain/units';
import { INK, INK_MUTED, STEEL } from './palette';
import { patternId } from './patterns';
import type { SlotInfo } from './slot-types';
import { SlotMarks } from './SlotMarks';
import { elementTypeLabel } from '~/lib/domain/vocabulary';
import { fitLabel } from './fit-text';

interface Props {
  info: SlotInfo;
  side: Side;
  prefix: string;
  units: UnitSystem;
  compact: boolean;
}

function ElementSlotView({ info, side, prefix, units, compact }: Props) {
  const { x, y, w, h } = info.box;
  const part = info.part?.kind === 'element' ? info.part : undefined;
  const labelH = compact ? 24 : 38;
  const faceH = h - labelH;
  const handTab = side === 'left' ? 'LEFT' : 'RIGHT';
  let line2 = '';
  if (part && !compact) {
    const gap = part.openingMm ? formatLength(mm(part.openingMm.width), units) : 'no gap';
    // Part number and opening, or as much as the slot holds (the details panel has the rest).
    line2 = fitLabel([`${part.partNumber} · ${gap}`, part.partNumber], w - 16, 10.5);
  }
  const foreignHand = part && part.hand !== side;
  return (
    <>
      <rect x={x} y={y} width={w} height={h} rx={5} fill="#fff" stroke={STEEL[300]} strokeWidth={1} />
      {part ? (
        <rect
          x={x + 4}
          y={y + 4}
          width={w - 8}
          height={faceH - 4}
          rx={3}
          fill={`url(#${patternId(prefix, part.elementType)})`}
          stroke={STEEL[600]}
          strokeWidth={1}
        />
      ) : info.partNumber ? (
        <rect x={x + 4} y={y + 4} width={w - 8} height={faceH - 4} rx={3} fill={STEEL[200]} stroke={STEEL[600]} strokeDasharray="4 3" />
      ) : (
        <rect
          x={x + 4}
          y={y + 4}
          width={w - 8}
          height={faceH - 4}
          rx={3}
          fill={`url(#${patternId(prefix, 'empty')})`}
          stroke={STEEL[400]}
          strokeDasharray="5 4"
        />
      )}
      {/* the slot's hand, written in it */}
      <rect x={x + 8} y={y + 8} width={handTab.length * 7 + 10} height={15} rx={3} fill={STEEL[800]} />
      <text x={x + 13} y={y + 19.5} fontSize={10} fontWeight={700} letterSpacing={0.8} fill="#fff">
        {handTab}
      </text>
      {!part && !info.partNumber && (
        <text x={x + w / 2} y={y + faceH / 2 + 8} textAnchor="middle" fontSize={compact ? 10 : 11.5} fill={INK_MUTED}>
          empty
        </text>
      )}
      <text x={x + 8} y={y + faceH + (compact ? 15 : 16)} fontSize={compact ? 11.5 : 13.5} fontWeight={700} fill={INK}>
        {part ? elementTypeLabel(part.elementType) : info.partNumber ? 'Unknown part' : ''}
      </text>
      {!compact && foreignHand ? (
        <text x={x + 8} y={y + faceH + 31} fontSize={10.5} fontWeight={700} fill="#b3261e">
          {`${part!.hand}-hand part`}
        </text>
      ) : (
        !compact &&
        (line2 || info.partNumber) && (
          <text x={x + 8} y={y + faceH + 31} fontSize={10.5} fill={INK_MUTED}>
            {line2 || fitLabel([info.partNumber ?? ''], w - 16, 10.5)}
          </text>
        )
      )}
      <SlotMarks info={info} compact={compact} tagY={faceH - 24} />
    </>
  );
}

export const ElementSlot = memo(ElementSlotView);
