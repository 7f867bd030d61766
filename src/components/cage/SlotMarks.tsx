/**
 * What lies on top of any slot: the finding outline with its icon and words, the user's
 * selection ring, the highlight of a chosen finding, and the "changed" badge of compare views.
 */
import { IRIS, SEVERITY_STYLE, CHANGED_COLOUR } from './palette';
import { SeverityIcon } from './SeverityIcon';
import type { SlotInfo } from './slot-types';

/** Width of the small corner "Δ" badge (rotor bars). */
export const CORNER_BADGE = 16;

/**
 * tagY: where the severity tag sits, from the slot's top (default: near the top edge).
 * iconY: where the lone severity icon is centred, from the slot's top (default: near the top
 * edge); iconSize its size. Rotor bars put it in the bar's lane so it never meets the label.
 * changedAt: where the compare views' "Δ changed" badge sits: across the top edge, or (rotor
 * bars, whose rows touch) a small "Δ" in the slot's lower right corner, inside the slot.
 */
export function SlotMarks({
  info,
  compact,
  words = true,
  tagY = 6,
  iconY,
  iconSize,
  changedAt = 'top',
}: {
  info: SlotInfo;
  compact: boolean;
  words?: boolean;
  tagY?: number;
  iconY?: number;
  iconSize?: number;
  changedAt?: 'top' | 'corner';
}) {
  const { x, y, w, h } = info.box;
  const sev = info.severity ? SEVERITY_STYLE[info.severity] : undefined;
  const showWords = words && !compact && w >= 110 && h >= 30;
  const tagW = sev ? sev.words.length * 5.6 + 28 : 0;
  return (
    <g aria-hidden="true" pointerEvents="none">
      {info.highlighted && (
        <rect
          x={x - 5}
          y={y - 5}
          width={w + 10}
          height={h + 10}
          rx={8}
          fill="none"
          stroke={IRIS[500]}
          strokeWidth={3}
          strokeDasharray="10 4"
        />
      )}
      {info.selected && (
        <rect x={x - 2.5} y={y - 2.5} width={w + 5} height={h + 5} rx={7} fill="none" stroke={IRIS[700]} strokeWidth={3.5} />
      )}
      {sev && (
        <>
          <rect
            x={x + 1.5}
            y={y + 1.5}
            width={w - 3}
            height={h - 3}
            rx={4}
            fill="none"
            stroke={sev.colour}
            strokeWidth={sev.strokeWidth}
            strokeDasharray={sev.dash}
          />
          {showWords ? (
            <g>
              <rect
                x={x + w - tagW - 5}
                y={y + tagY}
                width={tagW}
                height={19}
                rx={9.5}
                fill="#fff"
                stroke={sev.colour}
                strokeWidth={1.25}
              />
              <SeverityIcon severity={info.severity!} x={x + w - tagW + 6} y={y + tagY + 9.5} size={14} />
              <text x={x + w - tagW + 16} y={y + tagY + 13.5} fontSize={10.5} fontWeight={700} fill={sev.colour}>
                {sev.words}
              </text>
            </g>
          ) : (
            <g data-mark="severity">
              <SeverityIcon
                severity={info.severity!}
                x={x + w - 11}
                y={y + (iconY ?? Math.min(11, h / 2))}
                size={iconSize ?? (compact ? 14 : 16)}
              />
            </g>
          )}
        </>
      )}
      {info.changed && changedAt === 'corner' && (
        <g data-mark="changed">
          <rect
            x={x + w - CORNER_BADGE - 2}
            y={y + h - 15}
            width={CORNER_BADGE}
            height={13}
            rx={3}
            fill={CHANGED_COLOUR}
            stroke="#fff"
            strokeWidth={1}
          />
          <text x={x + w - 2 - CORNER_BADGE / 2} y={y + h - 5} textAnchor="middle" fontSize={9} fontWeight={700} fill="#fff">
            Δ
          </text>
        </g>
      )}
      {info.changed && changedAt === 'top' && (
        <g>
          <rect x={x + w / 2 - 36} y={y - 8} width={72} height={15} rx={3} fill={CHANGED_COLOUR} stroke="#fff" strokeWidth={1.5} />
          <text x={x + w / 2} y={y + 3} textAnchor="middle" fontSize={9} fontWeight={700} fill="#fff" letterSpacing={0.4}>
            Δ CHANGED
          </text>
        </g>
      )}
    </g>
  );
}
