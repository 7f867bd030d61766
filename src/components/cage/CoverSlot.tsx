/** A cover-plate slot on one side of one cage-top section. */
import { memo } from 'react';
import { INK, INK_MUTED, STEEL } from './palette';
import { patternId } from './patterns';
import type { SlotInfo } from './slot-types';
import { SlotMarks } from './SlotMarks';

function CoverSlotView({ info, prefix, compact }: { info: SlotInfo; prefix: string; compact: boolean }) {
  const { x, y, w, h } = info.box;
  const plate = info.part?.kind === 'cover-plate' ? info.part : undefined;
  const filled = !!info.partNumber;
  const fs = compact ? 10 : 11.5;
  let text: string;
  if (plate) text = compact ? 'Cover plate' : `Cover plate · ${plate.partNumber}`;
  else if (filled) text = `Unknown part ${info.partNumber}`;
  else text = info.seat ? 'Plate seat (open)' : 'No plate seat';
  const textW = text.length * fs * 0.55 + 14;
  // with a finding, the text moves left so the finding's tag fits at the right
  const cx = info.severity && !compact ? x + 8 + textW / 2 : x + w / 2;
  return (
    <>
      {filled ? (
        <rect
          x={x}
          y={y}
          width={w}
          height={h}
          rx={4}
          fill={`url(#${patternId(prefix, 'cover')})`}
          fillOpacity={0.9}
          stroke={STEEL[800]}
          strokeWidth={1.25}
        />
      ) : info.seat ? (
        <rect
          x={x}
          y={y}
          width={w}
          height={h}
          rx={4}
          fill="#ffffff"
          fillOpacity={0.35}
          stroke={STEEL[600]}
          strokeWidth={1.25}
          strokeDasharray="6 4"
        />
      ) : (
        <rect x={x} y={y} width={w} height={h} rx={4} fill="none" stroke="none" />
      )}
      {(filled || info.seat || !compact) && (
        <>
          <rect
            x={cx - textW / 2}
            y={y + h / 2 - fs * 0.8}
            width={textW}
            height={fs * 1.6}
            rx={fs * 0.8}
            fill="#fff"
            fillOpacity={filled || info.seat ? 0.95 : 0.75}
          />
          <text
            x={cx}
            y={y + h / 2 + fs * 0.36}
            textAnchor="middle"
            fontSize={fs}
            fontWeight={filled ? 700 : 400}
            fill={filled ? INK : INK_MUTED}
          >
            {text}
          </text>
        </>
      )}
      <SlotMarks info={info} compact={compact} />
    </>
  );
}

export const CoverSlot = memo(CoverSlotView);
