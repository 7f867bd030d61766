/**
 * Severity icons, told apart by shape as well as colour: an octagon with a cross (blocks fit),
 * a triangle with an exclamation mark (hurts the crop), a circle with an "i" (advice).
 * Drawn centred on (x, y) with the given size, for use inside the diagram's SVG or in a small
 * standalone <svg> (see SeverityBadge).
 */
import { memo } from 'react';
import type { Severity } from '~/lib/domain/schemas';
import { SEVERITY_STYLE } from './palette';

export function SeverityIcon({ severity, x, y, size = 18 }: { severity: Severity; x: number; y: number; size?: number }) {
  const s = size / 2;
  const { colour } = SEVERITY_STYLE[severity];
  if (severity === 'blocks-fit') {
    const k = s * 0.414; // octagon: side offset for a regular octagon of half-width s
    const pts = [
      [-k, -s],
      [k, -s],
      [s, -k],
      [s, k],
      [k, s],
      [-k, s],
      [-s, k],
      [-s, -k],
    ]
      .map(([a, b]) => `${x + a!},${y + b!}`)
      .join(' ');
    const c = s * 0.42;
    return (
      <g aria-hidden="true">
        <polygon points={pts} fill={colour} stroke="#fff" strokeWidth={1.25} />
        <path
          d={`M${x - c},${y - c}L${x + c},${y + c}M${x + c},${y - c}L${x - c},${y + c}`}
          stroke="#fff"
          strokeWidth={size / 8}
          strokeLinecap="round"
        />
      </g>
    );
  }
  if (severity === 'hurts-crop') {
    const pts = `${x},${y - s} ${x + s * 1.08},${y + s * 0.85} ${x - s * 1.08},${y + s * 0.85}`;
    return (
      <g aria-hidden="true">
        <polygon points={pts} fill={colour} stroke="#fff" strokeWidth={1.25} strokeLinejoin="round" />
        <path d={`M${x},${y - s * 0.4}V${y + s * 0.25}`} stroke="#fff" strokeWidth={size / 8} strokeLinecap="round" />
        <circle cx={x} cy={y + s * 0.55} r={size / 16} fill="#fff" />
      </g>
    );
  }
  return (
    <g aria-hidden="true">
      <circle cx={x} cy={y} r={s} fill={colour} stroke="#fff" strokeWidth={1.25} />
      <circle cx={x} cy={y - s * 0.45} r={size / 16} fill="#fff" />
      <path d={`M${x},${y - s * 0.1}V${y + s * 0.55}`} stroke="#fff" strokeWidth={size / 8} strokeLinecap="round" />
    </g>
  );
}

/** A small inline icon for HTML lists (findings list, legends). */
export const SeverityBadge = memo(function SeverityBadge({
  severity,
  size = 16,
  className,
}: {
  severity: Severity;
  size?: number;
  className?: string;
}) {
  return (
    <svg width={size} height={size} viewBox={`0 0 ${size} ${size}`} className={className} aria-hidden="true" focusable="false">
      <SeverityIcon severity={severity} x={size / 2} y={size / 2} size={size - 1.5} />
    </svg>
  );
});
