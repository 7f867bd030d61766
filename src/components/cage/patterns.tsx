/**
 * Fill patterns of our own design, one per element type, drawn to show how the part is built:
 * bars as heavy vertical strokes, wires as thin strokes across them (fine, wide or with wires
 * taken out), round bars as rounded strokes, a perforated plate as staggered holes, a blank plate
 * as solid plate, close-bar with bars and wires packed tighter. Each pattern id carries the
 * diagram instance's prefix so two diagrams on one page (a compare view) never share ids.
 */
import { memo } from 'react';
import type React from 'react';
import type { ElementType } from '~/lib/domain/schemas';
import { STEEL } from './palette';

export const patternId = (prefix: string, name: ElementType | 'cover' | 'no-seat' | 'empty') => `${prefix}-pat-${name}`;

const BAR = STEEL[600];
const WIRE = STEEL[700];
const GROUND = STEEL[100];

function BarsAndWires({ w, h, barW, wires, ghost = [] }: { w: number; h: number; barW: number; wires: number[]; ghost?: number[] }) {
  return (
    <>
      <rect width={w} height={h} fill={GROUND} />
      {ghost.map((y) => (
        <line key={`g${y}`} x1={0} x2={w} y1={y} y2={y} stroke={STEEL[400]} strokeWidth={1} strokeDasharray="1.5 3" />
      ))}
      {wires.map((y) => (
        <line key={y} x1={0} x2={w} y1={y} y2={y} stroke={WIRE} strokeWidth={1.4} />
      ))}
      <rect x={0} y={0} width={barW} height={h} fill={BAR} />
    </>
  );
}

type PatternName = Parameters<typeof patternId>[1];

/** All patterns, or `only` the named ones (a swatch needs one). */
export const PatternDefs = memo(function PatternDefs({ prefix, only }: { prefix: string; only?: readonly PatternName[] }) {
  const id = (n: PatternName) => patternId(prefix, n);
  const all = (
    <>
      <pattern id={id('fine-wire')} width={22} height={5} patternUnits="userSpaceOnUse">
        <BarsAndWires w={22} h={5} barW={4} wires={[2.5]} />
      </pattern>
      <pattern id={id('wide-wire')} width={22} height={11} patternUnits="userSpaceOnUse">
        <BarsAndWires w={22} h={11} barW={4} wires={[5.5]} />
      </pattern>
      <pattern id={id('skip-wire')} width={22} height={33} patternUnits="userSpaceOnUse">
        <BarsAndWires w={22} h={33} barW={4} wires={[5.5]} ghost={[16.5, 27.5]} />
      </pattern>
      <pattern id={id('round-bar')} width={22} height={12} patternUnits="userSpaceOnUse">
        <rect width={22} height={12} fill={GROUND} />
        <line x1={7} x2={19} y1={6} y2={6} stroke={BAR} strokeWidth={6} strokeLinecap="round" />
        <line x1={7} x2={19} y1={4.8} y2={4.8} stroke={STEEL[300]} strokeWidth={1.2} strokeLinecap="round" />
        <rect x={0} y={0} width={3} height={12} fill={STEEL[500]} />
      </pattern>
      <pattern id={id('perforated')} width={14} height={12} patternUnits="userSpaceOnUse">
        <rect width={14} height={12} fill={STEEL[300]} />
        <circle cx={3.5} cy={3} r={2.6} fill={STEEL[50]} stroke={STEEL[600]} strokeWidth={0.8} />
        <circle cx={10.5} cy={9} r={2.6} fill={STEEL[50]} stroke={STEEL[600]} strokeWidth={0.8} />
      </pattern>
      <pattern id={id('blank')} width={18} height={18} patternUnits="userSpaceOnUse">
        <rect width={18} height={18} fill={STEEL[400]} />
        <line x1={0} y1={18} x2={18} y2={0} stroke={STEEL[300]} strokeWidth={1} />
      </pattern>
      <pattern id={id('close-bar')} width={11} height={4} patternUnits="userSpaceOnUse">
        <BarsAndWires w={11} h={4} barW={4} wires={[2]} />
      </pattern>
      <pattern id={id('cover')} width={26} height={18} patternUnits="userSpaceOnUse">
        <rect width={26} height={18} fill={STEEL[500]} />
        <rect x={6} y={6} width={14} height={5} rx={2.5} fill={STEEL[200]} />
      </pattern>
      <pattern id={id('no-seat')} width={8} height={8} patternUnits="userSpaceOnUse" patternTransform="rotate(45)">
        <rect width={8} height={8} fill={STEEL[50]} />
        <line x1={0} y1={0} x2={0} y2={8} stroke={STEEL[200]} strokeWidth={2} />
      </pattern>
      <pattern id={id('empty')} width={10} height={10} patternUnits="userSpaceOnUse">
        <rect width={10} height={10} fill="#fff" />
        <circle cx={5} cy={5} r={0.9} fill={STEEL[300]} />
      </pattern>
    </>
  );
  if (!only) return <defs>{all}</defs>;
  const wanted = new Set(only.map(id));
  const kids = (all.props as { children: React.ReactElement<{ id: string }>[] }).children;
  return <defs>{kids.filter((k) => wanted.has(k.props.id))}</defs>;
});

/** A swatch of one element pattern, for legends and the palette (its own tiny SVG). */
export function ElementSwatch({
  type,
  prefix,
  width = 44,
  height = 26,
}: {
  type: ElementType;
  prefix: string;
  width?: number;
  height?: number;
}) {
  return (
    <svg width={width} height={height} viewBox={`0 0 ${width} ${height}`} aria-hidden="true" focusable="false">
      <PatternDefs prefix={prefix} only={[type]} />
      <rect x={0.5} y={0.5} width={width - 1} height={height - 1} rx={3} fill={`url(#${patternId(prefix, type)})`} stroke={STEEL[600]} />
    </svg>
  );
}
