/**
 * Where everything sits in the developed view, in SVG user units. Pure arithmetic over the
 * family, so the server and the island draw the same picture and tests can check it.
 *
 *   x: a label column, then one column per position, front (crop in) on the left.
 *   y: zone bands, position headers, cage top left, left half, right half, cage top right,
 *      then the rotor strip (one row per rasp-bar row).
 */
import type { MachineFamily, Place, Side } from '~/lib/domain/schemas';

export interface Band {
  y: number;
  h: number;
}

export interface DiagramGeometry {
  width: number;
  height: number;
  labelW: number;
  colW: number;
  /** Left edge of position i's column (1-based). */
  colX: (position: number) => number;
  /** x and width spanning a list of positions (a cage-top section). */
  spanX: (positions: readonly number[]) => { x: number; w: number };
  title: Band;
  zones: Band;
  headers: Band;
  coverTop: Record<Side, Band>;
  half: Record<Side, Band>;
  rotorTitle: Band;
  /** Row i's band (1-based row index, in the family's row order). */
  rotorRow: (rowIndex: number) => Band;
  rotorRows: number;
  /** The end-view inset's centre and radius, when drawn. */
  endView: { cx: number; cy: number; r: number } | null;
  drawingRight: number;
}

export interface GeometryOptions {
  compact?: boolean;
  endView?: boolean;
}

export function diagramGeometry(family: MachineFamily, opts: GeometryOptions = {}): DiagramGeometry {
  const compact = !!opts.compact;
  const labelW = compact ? 76 : 116;
  // Six-position cages get narrower columns so the drawing keeps a readable scale.
  const colW = compact ? 118 : family.positions.length > 4 ? 136 : 150;
  const n = family.positions.length;
  const gap = 6;
  let y = 0;
  const band = (h: number, after = gap): Band => {
    const b = { y, h };
    y += h + after;
    return b;
  };
  const title = band(22, 4);
  const zones = band(24, 2);
  const headers = band(20, 4);
  const coverLeft = band(compact ? 46 : 58);
  const left = band(compact ? 86 : 108);
  const right = band(compact ? 86 : 108);
  const coverRight = band(compact ? 46 : 58, 14);
  const rotorTitle = band(20, 4);
  // Tall enough for the bar, its label below and a finding's outline around both.
  const rowH = compact ? 32 : 38;
  const rowsTop = y;
  const rotorRows = family.rotorBarRows.length;
  y += rotorRows * rowH;
  const drawingRight = labelW + n * colW;
  const showEnd = opts.endView ?? !compact;
  const endR = 88;
  const endView = showEnd ? { cx: drawingRight + 70 + endR, cy: coverLeft.y + 30 + endR, r: endR } : null;
  const width = endView ? endView.cx + endR + 70 : drawingRight + 8;
  const height = Math.max(y + 6, endView ? endView.cy + endR + 70 : 0);
  const colX = (p: number) => labelW + (p - 1) * colW;
  return {
    width,
    height,
    labelW,
    colW,
    colX,
    spanX: (positions) => {
      const min = Math.min(...positions);
      const max = Math.max(...positions);
      return { x: colX(min), w: (max - min + 1) * colW };
    },
    title,
    zones,
    headers,
    coverTop: { left: coverLeft, right: coverRight },
    half: { left, right },
    rotorTitle,
    rotorRow: (i) => ({ y: rowsTop + (i - 1) * rowH, h: rowH }),
    rotorRows,
    endView,
    drawingRight,
  };
}

/** Vane stroke angle from the cross-rotor direction: faster settings lean further rearward. */
export const VANE_LEAN_DEG = { 'very-slow': 12, slow: 22, medium: 32, fast: 42 } as const;

export interface Box {
  x: number;
  y: number;
  w: number;
  h: number;
}

/** The outer box of a slot in the drawing (null for a setting, or a place the family lacks). */
export function slotBox(family: MachineFamily, geo: DiagramGeometry, place: Place): Box | null {
  switch (place.kind) {
    case 'element': {
      const band = geo.half[place.side];
      return { x: geo.colX(place.position) + 4, y: band.y, w: geo.colW - 8, h: band.h };
    }
    case 'cover': {
      const section = family.cageTopSections.find((s) => s.index === place.section);
      if (!section) return null;
      const band = geo.coverTop[place.side];
      const span = geo.spanX(section.positions);
      // room for the 'section n' label: below the slot on the left band, above it on the right
      return { x: span.x + 8, y: band.y + (place.side === 'left' ? 9 : 13), w: span.w - 16, h: band.h - 22 };
    }
    case 'bar': {
      const i = family.rotorBarRows.findIndex((r) => r.index === place.row);
      if (i < 0) return null;
      const row = geo.rotorRow(i + 1);
      return { x: geo.colX(place.position) + 4, y: row.y + 2, w: geo.colW - 8, h: row.h - 4 };
    }
    default:
      return null;
  }
}
