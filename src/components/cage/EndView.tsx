/**
 * The end-view inset: the cage seen from the front, so a class sees what the developed view
 * unrolls — the cage top above, the left and right halves of the element ring below, the rotor
 * with its rasp-bar rows, and the clearance between rotor and ring (drawn enlarged, labelled).
 */
import type { MachineFamily } from '~/lib/domain/schemas';
import type { UnitSystem } from '~/lib/domain/units';
import { formatLength, mm } from '~/lib/domain/units';
import { INK, INK_MUTED, STEEL } from './palette';

interface Props {
  family: MachineFamily;
  cx: number;
  cy: number;
  r: number;
  clearanceMm: number;
  diameterMm: number;
  units: UnitSystem;
}

const pt = (cx: number, cy: number, r: number, deg: number) => {
  // 0° at the top, clockwise (seen from the front).
  const a = ((deg - 90) * Math.PI) / 180;
  return [cx + r * Math.cos(a), cy + r * Math.sin(a)] as const;
};

function arc(cx: number, cy: number, r: number, from: number, to: number) {
  const [x1, y1] = pt(cx, cy, r, from);
  const [x2, y2] = pt(cx, cy, r, to);
  const large = (to - from + 360) % 360 > 180 ? 1 : 0;
  return `M${x1},${y1}A${r},${r} 0 ${large} 1 ${x2},${y2}`;
}

export function EndView({ family, cx, cy, r, clearanceMm, diameterMm, units }: Props) {
  const ringW = 12;
  const rotorR = r - ringW / 2 - 16; // the gap is drawn enlarged so it can be seen and labelled
  // Around the rotor seen from the front, the developed view's left side runs 270°→180°.
  return (
    <g aria-hidden="true">
      <text x={cx} y={cy - r - 28} textAnchor="middle" fontSize={12} fontWeight={700} fill={INK}>
        End view from the front
      </text>
      {/* cage top */}
      <path d={arc(cx, cy, r, 270, 90)} stroke={STEEL[400]} strokeWidth={ringW} fill="none" />
      {/* element ring halves */}
      <path d={arc(cx, cy, r, 180, 270)} stroke={STEEL[600]} strokeWidth={ringW} fill="none" strokeDasharray="2 2" />
      <path d={arc(cx, cy, r, 90, 180)} stroke={STEEL[600]} strokeWidth={ringW} fill="none" strokeDasharray="2 2" />
      <path d={arc(cx, cy, r + ringW / 2 + 1, 180, 270)} stroke={STEEL[800]} strokeWidth={1.2} fill="none" />
      <path d={arc(cx, cy, r + ringW / 2 + 1, 90, 180)} stroke={STEEL[800]} strokeWidth={1.2} fill="none" />
      <text x={cx - r * 0.74 - 12} y={cy + r * 0.74 + 16} textAnchor="end" fontSize={11} fill={INK}>
        left half
      </text>
      <text x={cx + r * 0.74 + 12} y={cy + r * 0.74 + 16} fontSize={11} fill={INK}>
        right half
      </text>
      <text x={cx} y={cy - r - 11} textAnchor="middle" fontSize={10.5} fill={INK_MUTED}>
        cage top
      </text>
      {/* rotor */}
      <circle cx={cx} cy={cy} r={rotorR} fill={STEEL[200]} stroke={STEEL[600]} strokeWidth={1.2} />
      <circle cx={cx} cy={cy} r={rotorR * 0.22} fill={STEEL[400]} />
      {family.rotorBarRows.map((row) => {
        const [bx, by] = pt(cx, cy, rotorR - 3, row.angleDeg);
        return (
          <g key={row.index} transform={`rotate(${row.angleDeg} ${bx} ${by})`}>
            <rect x={bx - 7} y={by - 4} width={14} height={8} rx={2} fill={STEEL[700]} />
          </g>
        );
      })}
      {family.rotorBarRows.map((row) => {
        const [tx, ty] = pt(cx, cy, rotorR - 22, row.angleDeg);
        return (
          <text key={row.index} x={tx} y={ty + 4} textAnchor="middle" fontSize={10} fill={INK_MUTED}>
            {row.index}
          </text>
        );
      })}
      {/* clearance at the bottom */}
      <line x1={cx} y1={cy + rotorR} x2={cx} y2={cy + r - ringW / 2} stroke={INK} strokeWidth={1} />
      <path d={`M${cx - 4},${cy + rotorR + 5}L${cx},${cy + rotorR}L${cx + 4},${cy + rotorR + 5}`} fill="none" stroke={INK} />
      <path
        d={`M${cx - 4},${cy + r - ringW / 2 - 5}L${cx},${cy + r - ringW / 2}L${cx + 4},${cy + r - ringW / 2 - 5}`}
        fill="none"
        stroke={INK}
      />
      <text x={cx} y={cy + r + 30} textAnchor="middle" fontSize={11.5} fill={INK}>
        clearance {formatLength(mm(clearanceMm), units)} (drawn enlarged)
      </text>
      <text x={cx} y={cy + r + 46} textAnchor="middle" fontSize={11.5} fill={INK_MUTED}>
        rotor ⌀ {formatLength(mm(diameterMm), units)} · rows 1–{family.rotorBarRows.length} numbered
      </text>
    </g>
  );
}

/** The end view on its own (beside the clearance setting, or on a page without the full drawing). */
export function CageEndView({
  family,
  clearanceMm,
  drum,
  units,
  className,
}: {
  family: MachineFamily;
  clearanceMm: number;
  drum: string;
  units: UnitSystem;
  className?: string;
}) {
  const r = 88;
  const d = family.drumOptions.find((o) => o.id === drum) ?? family.drumOptions[0]!;
  const w = 2 * r + 170;
  const h = 2 * r + 110;
  return (
    <svg
      viewBox={`0 0 ${w} ${h}`}
      width="100%"
      className={className}
      role="img"
      aria-label={`End view from the front: rotor ⌀ ${formatLength(mm(d.diameterMm), units)}, clearance ${formatLength(mm(clearanceMm), units)}`}
      fontFamily='"Source Sans 3", system-ui, sans-serif'
      style={{ display: 'block', height: 'auto' }}
    >
      <EndView family={family} cx={w / 2} cy={r + 44} r={r} clearanceMm={clearanceMm} diameterMm={d.diameterMm} units={units} />
    </svg>
  );
}
