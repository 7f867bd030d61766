/** One rotor bar place: the bar drawn by kind, the in-line mark, findings. */
import { memo } from 'react';
import type { BarKind } from '~/lib/domain/schemas';
import { INK, INK_MUTED, SEVERITY_STYLE, STEEL } from './palette';
import type { SlotInfo } from './slot-types';
import { CORNER_BADGE, SlotMarks } from './SlotMarks';
import { barKindLabel } from '~/lib/domain/vocabulary';
import { fitLabel } from './fit-text';

/** The severity icon's size on a bar, and the room it takes at the slot's right end. */
export const BAR_ICON = 14;
const ICON_ROOM = BAR_ICON + 8;

function BarShape({ kind, x, y, w }: { kind: BarKind; x: number; y: number; w: number }) {
  // y is the bar's centre line.
  switch (kind) {
    case 'rasp':
    case 'spike-rasp':
    case 'smooth-rasp': {
      const ridges: number[] = [];
      for (let rx = x + 6; rx < x + w - 4; rx += 7) ridges.push(rx);
      return (
        <g>
          {kind === 'spike-rasp' &&
            ridges
              .filter((_, i) => i % 2 === 0)
              .map((rx) => <path key={rx} d={`M${rx - 3},${y - 4}L${rx},${y - 10}L${rx + 3},${y - 4}Z`} fill={STEEL[700]} />)}
          <rect
            x={x}
            y={y - 5}
            width={w}
            height={10}
            rx={3}
            fill={kind === 'smooth-rasp' ? STEEL[400] : STEEL[500]}
            stroke={STEEL[800]}
            strokeWidth={0.75}
          />
          {kind === 'smooth-rasp' ? (
            <line x1={x + 4} x2={x + w - 4} y1={y - 1.5} y2={y - 1.5} stroke={STEEL[200]} strokeWidth={1.4} strokeLinecap="round" />
          ) : (
            ridges.map((rx) => <line key={rx} x1={rx} x2={rx + 4} y1={y + 4} y2={y - 4} stroke={STEEL[200]} strokeWidth={1.3} />)
          )}
        </g>
      );
    }
    case 'straight':
      return (
        <g>
          <rect x={x - 6} y={y - 6} width={w + 12} height={12} rx={2} fill={STEEL[800]} />
          <circle cx={x + 4} cy={y} r={2.2} fill={STEEL[200]} />
          <circle cx={x + w - 4} cy={y} r={2.2} fill={STEEL[200]} />
        </g>
      );
    case 'discharge':
      return (
        <path
          d={`M${x},${y - 5}H${x + w - 14}L${x + w},${y - 9}V${y + 9}L${x + w - 14},${y + 5}H${x}Z`}
          fill={STEEL[700]}
          stroke={STEEL[900]}
          strokeWidth={0.75}
        />
      );
  }
}

interface SpanEnd {
  end: 'front' | 'rear';
  /** The front position of the pair. */
  front: number;
}

function BarSlotView({ info, inLine, compact, span }: { info: SlotInfo; inLine: boolean; compact: boolean; span?: SpanEnd | undefined }) {
  const { x, y, w, h } = info.box;
  const bar = info.part?.kind === 'rotor-bar' ? info.part : undefined;
  const midY = y + (compact ? 11 : 12);
  // A straight bar runs on from its front mount into the rear one: one part across two mounts.
  const barX = span?.end === 'rear' ? x : x + 22;
  const barW = span ? w - 22 : w - 44;
  const sev = info.severity ? SEVERITY_STYLE[info.severity] : undefined;
  const fontSize = compact ? 9 : 10;
  const name = bar
    ? barKindLabel(bar.barKind)
    : info.partNumber
      ? 'Unknown part'
      : span?.end === 'rear'
        ? `Straight, from pos. ${span.front}`
        : 'no bar';
  const where =
    span?.end === 'front' && bar?.barKind === 'straight'
      ? `${name} · 2 mounts`
      : inLine && span?.end !== 'rear'
        ? `${name} · in line`
        : name;
  // The label never runs past its slot; with a finding it keeps clear of the icon's column too
  // (on both sides, as it is centred) where the icon reaches down into the label's lane.
  const iconInLane = compact;
  // A compare view's corner badge takes the lane's right end (and, the label being centred, as much on the left).
  const room = w - 8 - Math.max(sev && iconInLane ? 2 * ICON_ROOM : 0, info.changed ? 2 * (CORNER_BADGE + 4) : 0);
  const label = fitLabel(
    sev && !compact ? [`${where} · ${sev.words}`, `${name} · ${sev.words}`, where, name] : [where, name],
    room,
    fontSize,
  );
  const withSev = sev && !compact && label.endsWith(` · ${sev.words}`);
  const words = withSev ? label.slice(0, -` · ${sev!.words}`.length) : label;
  return (
    <>
      <rect x={x} y={y} width={w} height={h} rx={3} fill="#fff" fillOpacity={0.6} stroke="none" />
      {inLine && (
        // two short bars one behind the other: the place where two rasp bars stand in line
        <g aria-hidden="true">
          <rect x={x + 5} y={midY - 8} width={4} height={7} rx={1} fill={STEEL[600]} />
          <rect x={x + 5} y={midY + 1} width={4} height={7} rx={1} fill={STEEL[600]} />
        </g>
      )}
      {bar ? (
        <BarShape kind={bar.barKind} x={barX} y={midY} w={barW} />
      ) : span?.end === 'rear' ? (
        <BarShape kind="straight" x={barX} y={midY} w={barW} />
      ) : (
        <rect x={barX} y={midY - 5} width={barW} height={10} rx={3} fill="none" stroke={STEEL[400]} strokeDasharray="4 3" />
      )}
      <text
        x={x + w / 2}
        y={y + h - (compact ? 5 : 6)}
        textAnchor="middle"
        fontSize={fontSize}
        fill={bar ? INK : INK_MUTED}
        data-bar-label=""
      >
        {words}
        {withSev && <tspan fill={sev!.colour} fontWeight={700}>{`\u00a0· ${sev!.words}`}</tspan>}
      </text>
      <SlotMarks info={info} compact={compact} words={false} iconY={midY - y} iconSize={BAR_ICON} changedAt="corner" />
    </>
  );
}

export const BarSlot = memo(BarSlotView);
