/**
 * CageDiagram — the cage drawn as a developed view (SVG). One component for every screen: the
 * editor island, and server-rendered Astro pages without client JS (share page, print sheet,
 * classroom, planner). It reads nothing from window or document, so React's server renderer
 * draws it as it is.
 *
 * Layout of the drawing (see /docs of the product: "The cage diagram"):
 *   front (crop in) on the left, rear (discharge) on the right; one column per position under
 *   its zone band (threshing, separating); from top to bottom: cage top left (a cover-plate slot
 *   per section, vanes as slanted strokes leaning by the vane setting), left half of the element
 *   ring, right half, cage top right; below, the rotor strip with one row per rasp-bar row
 *   (in-line places marked); an end-view inset on the right (off in compact mode).
 *
 * Props
 *   family          MachineFamily — positions, zones, cage-top sections, rotor bar rows/places.
 *   layout          Layout — what sits where, plus crop, drum, vanes, clearance.
 *   catalog         CatalogPart[] or a CatalogIndex (indexCatalog) — to draw each part number.
 *   findings?       Finding[] — from checkLayout; each place it names gets an outline, an icon of
 *                   the severity's shape and its words (blocks fit / hurts the crop / advice).
 *   units           'metric' | 'imperial' — every length in the drawing follows it.
 *   selectedPlace?  Place | null — the user's selection (iris ring).
 *   highlightPlaces? readonly Place[] — places of a chosen finding (iris dashed halo).
 *   diffPlaces?     readonly Place[] — compare views: places marked "Δ changed"; setting places
 *                   for the vanes or the drum mark the cage-top bands or the rotor strip.
 *   slotProps?      (info: SlotInfo) => SVG attributes merged onto each slot's <g>
 *                   (onClick, tabIndex, role …). Keep it referentially stable (useCallback).
 *   renderSlot?     (info, attrs, drawing) => ReactNode — replace the slot's <g> wrapper, e.g.
 *                   with a droppable component; it must render a <g {...attrs}>{drawing}</g>.
 *   compact?        smaller type, no part numbers, no end view (phones, thumbnails).
 *   endView?        force the end-view inset on or off.
 *   title?          the drawing's accessible title (default: "Cage diagram, <family name>").
 *   overlay?        ReactNode drawn last inside the <svg>, in drawing units (see slotBox() in
 *                   ./geometry for where each slot sits).
 *   className?      on the <svg>, which scales to its container's width.
 *
 * Every slot's <g> carries data-place="<placeKey>" ('element:3:right', 'cover:2:left',
 * 'bar:1:4') and an aria-label naming the place, what is in it and its findings.
 */
import { memo, useId, useMemo, useRef, type ReactNode, type SVGProps } from 'react';
import { asCatalogIndex, type CatalogIndex } from '~/lib/domain/catalog';
import { allPlaces, placeKey } from '~/lib/domain/places';
import { rotorModel } from '~/lib/domain/rotor';
import type { CatalogPart, Finding, Layout, MachineFamily, Place, Side } from '~/lib/domain/schemas';
import type { UnitSystem } from '~/lib/domain/units';
import { BarSlot } from './BarSlot';
import { CoverSlot } from './CoverSlot';
import { ElementSlot } from './ElementSlot';
import { EndView } from './EndView';
import { SettingMarks } from './SettingMarks';
import { diagramGeometry, slotBox, VANE_LEAN_DEG, type DiagramGeometry } from './geometry';
import { CHANGED_COLOUR, INK, INK_MUTED, INK_SOFT, SEVERITY_STYLE, STEEL } from './palette';
import { PatternDefs } from './patterns';
import type { SlotAttrs, SlotInfo } from './slot-types';
import { partNameWithHand, placeLabel, severityWords } from '~/lib/domain/vocabulary';

export type { SlotInfo, SlotAttrs } from './slot-types';

export interface CageDiagramProps {
  family: MachineFamily;
  layout: Layout;
  catalog: readonly CatalogPart[] | CatalogIndex;
  findings?: readonly Finding[];
  units: UnitSystem;
  selectedPlace?: Place | null;
  highlightPlaces?: readonly Place[];
  diffPlaces?: readonly Place[];
  slotProps?: (info: SlotInfo) => SVGProps<SVGGElement>;
  renderSlot?: (info: SlotInfo, attrs: SlotAttrs, drawing: ReactNode) => ReactNode;
  compact?: boolean;
  endView?: boolean;
  title?: string;
  className?: string;
  /** Drawn on top of everything, in the drawing's units (the editor's drop highlights). */
  overlay?: ReactNode;
}

const SIDES: readonly Side[] = ['left', 'right'];
const EMPTY: readonly Finding[] = [];
const NO_PLACES: readonly Place[] = [];

/** What a drawn slot was made from; an unchanged slot keeps its element from the last render. */
interface DrawnSlot {
  partNumber: string | undefined;
  span: string;
  findings: string;
  selected: boolean;
  highlighted: boolean;
  changed: boolean;
  node: ReactNode;
}

/** The findings at a place as far as the slot shows them (its marks and accessible name). */
const findingsSignature = (fs: readonly Finding[]) =>
  fs.length === 0 ? '' : fs.map((f) => `${f.severity}\u0001${f.code}\u0001${f.title}`).join('\u0002');

function slotLabel(
  place: Place,
  part: CatalogPart | undefined,
  partNumber: string | undefined,
  seat: boolean,
  findings: readonly Finding[],
  changed: boolean,
  span?: { end: 'front' | 'rear'; front: number },
): string {
  let content: string;
  if (part)
    content = `${partNameWithHand(part)}, ${part.partNumber}${span?.end === 'front' ? ', across this mount and the one behind it' : ''}`;
  else if (partNumber) content = `unknown part ${partNumber}`;
  else if (span?.end === 'rear') content = `taken by the straight bar from position ${span.front}`;
  else if (place.kind === 'cover' && !seat) content = 'no plate seat';
  else content = 'empty';
  let s = `${placeLabel(place)}: ${content}`;
  if (changed) s += '. Changed';
  for (const f of findings) s += `. ${severityWords(f.severity)}: ${f.title}`;
  return s;
}

interface SlotWrapperProps {
  info: SlotInfo;
  drawing: ReactNode;
  slotProps?: CageDiagramProps['slotProps'];
  renderSlot?: CageDiagramProps['renderSlot'];
}

/** Memo-friendly slot wrapper: re-renders only when what it shows changes. */
const Slot = memo(function Slot({ info, drawing, slotProps, renderSlot }: SlotWrapperProps) {
  const attrs: SlotAttrs = {
    'data-place': info.key,
    role: 'img',
    'aria-label': info.label,
    ...(slotProps ? slotProps(info) : {}),
  };
  if (renderSlot) return <>{renderSlot(info, attrs, drawing)}</>;
  return <g {...attrs}>{drawing}</g>;
}, slotEqual);

function slotEqual(a: SlotWrapperProps, b: SlotWrapperProps) {
  const x = a.info;
  const y = b.info;
  return (
    a.slotProps === b.slotProps &&
    a.renderSlot === b.renderSlot &&
    x.key === y.key &&
    x.part === y.part &&
    x.partNumber === y.partNumber &&
    x.severity === y.severity &&
    x.selected === y.selected &&
    x.highlighted === y.highlighted &&
    x.changed === y.changed &&
    x.label === y.label &&
    x.box.x === y.box.x &&
    x.box.y === y.box.y &&
    x.box.w === y.box.w &&
    x.box.h === y.box.h &&
    // the drawing's own inputs beyond info (units, compact) come through its element's props
    shallowSameProps(a.drawing, b.drawing)
  );
}

function shallowSameProps(a: ReactNode, b: ReactNode): boolean {
  if (!a || !b || typeof a !== 'object' || typeof b !== 'object' || !('props' in a) || !('props' in b)) return a === b;
  const pa = a.props as Record<string, unknown>;
  const pb = b.props as Record<string, unknown>;
  for (const k of Object.keys(pa)) if (k !== 'info' && pa[k] !== pb[k]) return false;
  return a.type === b.type;
}

export function CageDiagram(props: CageDiagramProps) {
  const {
    family,
    layout,
    catalog,
    findings = EMPTY,
    units,
    selectedPlace = null,
    highlightPlaces = NO_PLACES,
    diffPlaces = NO_PLACES,
    slotProps,
    renderSlot,
    compact = false,
    endView,
    title,
    className,
    overlay,
  } = props;
  // useId is stable between the server render and hydration; strip characters url(#…) dislikes.
  const prefix = 'cg' + useId().replace(/[^A-Za-z0-9_-]/g, '');
  const cat = useMemo(() => asCatalogIndex(catalog), [catalog]);
  const geo = useMemo(() => diagramGeometry(family, { compact, endView }), [family, compact, endView]);
  const places = useMemo(() => allPlaces(family), [family]);

  const byPlace = useMemo(() => {
    const m = new Map<string, Finding[]>();
    for (const f of findings)
      for (const p of f.places) {
        const k = placeKey(p);
        const list = m.get(k);
        if (list) list.push(f);
        else m.set(k, [f]);
      }
    return m;
  }, [findings]);

  const occupant = useMemo(() => {
    const m = new Map<string, string>();
    for (const e of layout.elements) m.set(`element:${e.position}:${e.side}`, e.partNumber);
    for (const c of layout.coverPlates) m.set(`cover:${c.section}:${c.side}`, c.partNumber);
    for (const b of layout.rotorBars) m.set(`bar:${b.row}:${b.position}`, b.partNumber);
    return m;
  }, [layout.elements, layout.coverPlates, layout.rotorBars]);

  // A straight bar is one part across a pair of in-line mounts, listed at the front one: the
  // front slot draws it running on, the rear slot draws its continuation (when nothing else is
  // listed there).
  const spanOf = useMemo(() => {
    const m = new Map<string, { end: 'front' | 'rear'; front: number }>();
    for (const s of rotorModel(family).spans) {
      const pn = occupant.get(`bar:${s.row}:${s.front}`);
      const part = pn ? cat.byPartNumber.get(pn) : undefined;
      if (part?.kind !== 'rotor-bar' || part.barKind !== 'straight') continue;
      m.set(`bar:${s.row}:${s.front}`, { end: 'front', front: s.front });
      if (!occupant.has(`bar:${s.row}:${s.rear}`)) m.set(`bar:${s.row}:${s.rear}`, { end: 'rear', front: s.front });
    }
    return m;
  }, [family, occupant, cat]);

  const selectedKey = selectedPlace ? placeKey(selectedPlace) : null;
  const highlightKeys = useMemo(() => new Set(highlightPlaces.map(placeKey)), [highlightPlaces]);
  const diffKeys = useMemo(() => new Set(diffPlaces.map(placeKey)), [diffPlaces]);
  const changedSettings = useMemo(() => new Set(diffPlaces.flatMap((p) => (p.kind === 'setting' ? [p.field] : []))), [diffPlaces]);

  const inLine = useMemo(() => new Set(family.rotorBarPlaces.filter((b) => b.inLine).map((b) => `bar:${b.row}:${b.position}`)), [family]);

  const infoFor = (place: Place, box: SlotInfo['box'], seat: boolean, span?: { end: 'front' | 'rear'; front: number }): SlotInfo => {
    const key = placeKey(place);
    const partNumber = occupant.get(key);
    const part = partNumber ? cat.byPartNumber.get(partNumber) : undefined;
    const fs = byPlace.get(key) ?? EMPTY;
    const severity = fs.reduce<Finding['severity'] | undefined>(
      (worst, f) => (!worst || SEVERITY_STYLE[f.severity].rank < SEVERITY_STYLE[worst].rank ? f.severity : worst),
      undefined,
    );
    const changed = diffKeys.has(key);
    return {
      place,
      key,
      part,
      partNumber,
      findings: fs,
      severity,
      seat,
      selected: key === selectedKey,
      highlighted: highlightKeys.has(key),
      changed,
      label: slotLabel(place, part, partNumber, seat, fs, changed, span),
      box,
    };
  };

  // Between renders, a slot whose part, findings, selection, highlight and change mark are the
  // same keeps its element, and React skips it without comparing props: an edit redraws the
  // slots it touched, not every slot of the cage.
  const drawn = useRef<{ inputs: readonly unknown[]; slots: Map<string, DrawnSlot> } | null>(null);
  const inputs = [family, geo, cat, units, compact, prefix, slotProps, renderSlot, inLine];
  if (!drawn.current || drawn.current.inputs.some((v, i) => v !== inputs[i])) drawn.current = { inputs, slots: new Map() };
  const cache = drawn.current.slots;

  const slots: ReactNode[] = [];
  for (const place of places) {
    const key = placeKey(place);
    const partNumber = occupant.get(key);
    const fsig = findingsSignature(byPlace.get(key) ?? EMPTY);
    const selected = key === selectedKey;
    const highlighted = highlightKeys.has(key);
    const changed = diffKeys.has(key);
    const spanHere = spanOf.get(key);
    const span = spanHere ? `${spanHere.end}:${spanHere.front}` : '';
    const before = cache.get(key);
    if (
      before &&
      before.partNumber === partNumber &&
      before.span === span &&
      before.findings === fsig &&
      before.selected === selected &&
      before.highlighted === highlighted &&
      before.changed === changed
    ) {
      slots.push(before.node);
      continue;
    }
    const box = slotBox(family, geo, place);
    if (!box) continue;
    let node: ReactNode = null;
    if (place.kind === 'element') {
      const info = infoFor(place, box, true);
      node = (
        <Slot
          key={info.key}
          info={info}
          slotProps={slotProps}
          renderSlot={renderSlot}
          drawing={<ElementSlot info={info} side={place.side} prefix={prefix} units={units} compact={compact} />}
        />
      );
    } else if (place.kind === 'cover') {
      const section = family.cageTopSections.find((s) => s.index === place.section)!;
      const info = infoFor(place, box, section.coverPlateSides.includes(place.side));
      node = (
        <Slot
          key={info.key}
          info={info}
          slotProps={slotProps}
          renderSlot={renderSlot}
          drawing={<CoverSlot info={info} prefix={prefix} compact={compact} />}
        />
      );
    } else if (place.kind === 'bar') {
      const info = infoFor(place, box, true, spanHere);
      node = (
        <Slot
          key={info.key}
          info={info}
          slotProps={slotProps}
          renderSlot={renderSlot}
          drawing={<BarSlot info={info} inLine={inLine.has(info.key)} compact={compact} span={spanHere} />}
        />
      );
    }
    if (!node) continue;
    cache.set(key, { partNumber, span, findings: fsig, selected, highlighted, changed, node });
    slots.push(node);
  }

  const drum = family.drumOptions.find((d) => d.id === layout.drum) ?? family.drumOptions[0]!;
  const name = title ?? `Cage diagram, ${family.name}`;

  return (
    <svg
      viewBox={`0 0 ${geo.width} ${geo.height}`}
      className={className}
      width="100%"
      role="group"
      aria-label={name}
      fontFamily='"Source Sans 3", system-ui, sans-serif'
      data-testid="cage-diagram"
      style={{ display: 'block', maxWidth: '100%', height: 'auto' }}
    >
      <PatternDefs prefix={prefix} />
      <Frame
        family={family}
        vaneSetting={layout.vaneSetting}
        vaneControl={layout.vaneControl}
        geo={geo}
        compact={compact}
        drum={drum}
        changed={changedSettings}
      />
      {slots}
      <SettingMarks geo={geo} changed={changedSettings} />
      {geo.endView && (
        <EndView family={family} {...geo.endView} clearanceMm={layout.clearanceMm} diameterMm={drum.diameterMm} units={units} />
      )}
      {overlay}
    </svg>
  );
}

/** Everything that is not a slot: axis, zone bands, headers, band labels, vanes, rotor rows. */
const Frame = memo(function Frame({
  family,
  vaneSetting,
  vaneControl,
  geo,
  compact,
  drum,
  changed,
}: {
  family: MachineFamily;
  vaneSetting: Layout['vaneSetting'];
  vaneControl: Layout['vaneControl'];
  geo: DiagramGeometry;
  compact: boolean;
  drum: MachineFamily['drumOptions'][number];
  /** Settings that differ in a compare view: their words are marked in the drawing. */
  changed: ReadonlySet<string>;
}) {
  const { labelW, colW, drawingRight } = geo;
  const fs = compact ? 10.5 : 12;
  const zonesInOrder: { zone: 'threshing' | 'separating'; positions: number[] }[] = [];
  for (const p of family.positions) {
    const last = zonesInOrder[zonesInOrder.length - 1];
    if (last && last.zone === p.zone) last.positions.push(p.index);
    else zonesInOrder.push({ zone: p.zone, positions: [p.index] });
  }
  const cageTop = geo.coverTop.left.y;
  const cageBottom = geo.coverTop.right.y + geo.coverTop.right.h;
  const lean = VANE_LEAN_DEG[vaneSetting];
  const adjustable = vaneControl !== 'fixed';
  const vanesChanged = changed.has('vaneSetting') || changed.has('vaneControl');
  const vaneWords = `${vanesChanged ? 'Δ ' : ''}vanes ${vaneSetting.replace('-', ' ')}`;
  const drumChanged = changed.has('drum');
  const rowLabel = (lines: string[], y: number, h: number) => (
    <text x={labelW - 10} y={y + h / 2 - (lines.length - 1) * (fs * 0.6) + fs * 0.35} textAnchor="end" fontSize={fs} fill={INK_SOFT}>
      {lines.map((l, i) => (
        <tspan
          key={i}
          x={labelW - 10}
          dy={i === 0 ? 0 : fs * 1.2}
          fontWeight={i === 0 || l.startsWith('Δ') ? 700 : 400}
          fill={l.startsWith('Δ') ? CHANGED_COLOUR : i === 0 ? INK : INK_MUTED}
        >
          {l}
        </tspan>
      ))}
    </text>
  );

  return (
    <g aria-hidden="true">
      {/* axis: front to rear */}
      <text x={labelW} y={geo.title.y + 15} fontSize={fs} fontWeight={700} fill={INK}>
        Front · crop in
      </text>
      <line
        x1={labelW + (compact ? 92 : 104)}
        x2={drawingRight - (compact ? 118 : 134)}
        y1={geo.title.y + 11}
        y2={geo.title.y + 11}
        stroke={STEEL[500]}
        strokeWidth={1.5}
      />
      <path d={`M${drawingRight - (compact ? 124 : 140)},${geo.title.y + 6}l7,5l-7,5`} fill="none" stroke={STEEL[500]} strokeWidth={1.5} />
      <text x={drawingRight} y={geo.title.y + 15} textAnchor="end" fontSize={fs} fontWeight={700} fill={INK}>
        Rear · discharge
      </text>

      {/* zone bands */}
      {zonesInOrder.map((z, i) => {
        const span = geo.spanX(z.positions);
        return (
          <g key={z.zone + i}>
            <rect
              x={span.x + 2}
              y={geo.zones.y}
              width={span.w - 4}
              height={geo.zones.h}
              rx={4}
              fill={z.zone === 'threshing' ? STEEL[700] : STEEL[200]}
            />
            <text
              x={span.x + span.w / 2}
              y={geo.zones.y + geo.zones.h / 2 + 4.5}
              textAnchor="middle"
              fontSize={fs + 0.5}
              fontWeight={700}
              letterSpacing={0.6}
              fill={z.zone === 'threshing' ? '#fff' : INK}
            >
              {z.zone === 'threshing' ? 'THRESHING ZONE' : 'SEPARATING ZONE'}
            </text>
          </g>
        );
      })}
      {/* position headers and column guides */}
      {family.positions.map((p) => {
        const x = geo.colX(p.index);
        const role = family.cageKind === 'split' ? (p.zone === 'threshing' ? '\u00a0· concave' : '\u00a0· grate') : '';
        return (
          <g key={p.index}>
            <text x={x + colW / 2} y={geo.headers.y + 14} textAnchor="middle" fontSize={fs} fontWeight={700} fill={INK}>
              {compact ? `P${p.index}` : `Position ${p.index}`}
              <tspan fontWeight={400} fill={INK_MUTED}>
                {role}
              </tspan>
            </text>
          </g>
        );
      })}
      {/* zone boundary through the cage and the rotor */}
      {zonesInOrder.slice(1).map((z) => {
        const x = geo.colX(z.positions[0]!);
        const firstRow = geo.rotorRow(1);
        const lastRow = geo.rotorRow(geo.rotorRows);
        return (
          <g key={x} stroke={STEEL[500]} strokeWidth={1.5} strokeDasharray="6 4">
            <line x1={x} x2={x} y1={geo.zones.y} y2={cageBottom + 3} />
            {geo.rotorRows > 0 && <line x1={x} x2={x} y1={firstRow.y} y2={lastRow.y + lastRow.h} />}
          </g>
        );
      })}

      {/* cage top bands with sections and vanes */}
      {SIDES.map((side) => {
        const band = geo.coverTop[side];
        return (
          <g key={side}>
            <rect x={labelW} y={band.y} width={drawingRight - labelW} height={band.h} rx={4} fill={STEEL[100]} stroke={STEEL[300]} />
            {family.cageTopSections.map((s) => {
              const span = geo.spanX(s.positions);
              const lines: ReactNode[] = [];
              const dx = Math.tan((lean * Math.PI) / 180) * band.h;
              for (let vx = span.x + 18; vx < span.x + span.w - 10; vx += compact ? 22 : 26) {
                // leaning rearward (right) as it goes around the rotor: the left side runs toward
                // the element ring (down), the right side away from it (up)
                const top = side === 'left' ? vx - dx / 2 : vx + dx / 2;
                const bottom = side === 'left' ? vx + dx / 2 : vx - dx / 2;
                lines.push(
                  <line
                    key={vx}
                    x1={top}
                    y1={band.y + 3}
                    x2={bottom}
                    y2={band.y + band.h - 3}
                    stroke={STEEL[500]}
                    strokeWidth={2.2}
                    strokeLinecap="round"
                  />,
                );
              }
              return (
                <g key={s.index}>
                  {s.index > 1 && <line x1={span.x} x2={span.x} y1={band.y} y2={band.y + band.h} stroke={STEEL[400]} strokeWidth={1.5} />}
                  {lines}
                  {!compact && (
                    <text x={span.x + 6} y={side === 'left' ? band.y + band.h - 3 : band.y + 10} fontSize={9} fill={INK_MUTED}>
                      section {s.index}
                    </text>
                  )}
                </g>
              );
            })}
            {side === 'left' && adjustable && (
              // the vane linkage runs over the left side of the cage top
              <g>
                <line x1={labelW + 8} x2={drawingRight - 8} y1={band.y + 5} y2={band.y + 5} stroke={STEEL[800]} strokeWidth={3} />
                {family.positions.map((p) => (
                  <circle
                    key={p.index}
                    cx={geo.colX(p.index) + colW / 2}
                    cy={band.y + 5}
                    r={3.5}
                    fill="#fff"
                    stroke={STEEL[800]}
                    strokeWidth={1.5}
                  />
                ))}
              </g>
            )}
            {rowLabel(
              compact
                ? ['Top ' + (side === 'left' ? 'L' : 'R'), ...(vanesChanged && side === 'left' ? ['Δ vanes'] : [])]
                : side === 'left'
                  ? ['Cage top, left', vaneWords, adjustable ? `${vaneControl} linkage` : 'fixed vanes']
                  : ['Cage top, right', vaneWords],
              band.y,
              band.h,
            )}
          </g>
        );
      })}
      {/* element ring */}
      {SIDES.map((side) => {
        const band = geo.half[side];
        return (
          <g key={side}>
            <rect x={labelW} y={band.y - 2} width={drawingRight - labelW} height={band.h + 4} rx={4} fill={STEEL[50]} />
            {rowLabel(
              compact ? [side === 'left' ? 'Left' : 'Right'] : [side === 'left' ? 'Left half' : 'Right half', 'element ring'],
              band.y,
              band.h,
            )}
          </g>
        );
      })}
      <line x1={labelW} x2={drawingRight} y1={cageTop - 3} y2={cageTop - 3} stroke={STEEL[300]} />
      <line x1={labelW} x2={drawingRight} y1={cageBottom + 3} y2={cageBottom + 3} stroke={STEEL[300]} />

      {/* rotor strip */}
      <text x={labelW} y={geo.rotorTitle.y + 14} fontSize={fs} fontWeight={700} fill={INK}>
        Rotor, developed
        {drumChanged ? (
          <tspan fontWeight={700} fill={CHANGED_COLOUR} data-mark="drum-words">{`\u00a0· Δ ${drum.label.toLowerCase()}`}</tspan>
        ) : (
          <tspan fontWeight={400} fill={INK_MUTED}>
            {compact ? '' : '\u00a0— rasp-bar rows; two short bars mark places where two rasp bars stand in line'}
          </tspan>
        )}
      </text>
      {family.rotorBarRows.map((r, i) => {
        const band = geo.rotorRow(i + 1);
        return (
          <g key={r.index}>
            <rect x={labelW} y={band.y} width={drawingRight - labelW} height={band.h} fill={i % 2 ? STEEL[100] : STEEL[50]} />
            <line
              x1={labelW}
              x2={drawingRight}
              y1={band.y + (compact ? 11 : 12) + 2}
              y2={band.y + (compact ? 11 : 12) + 2}
              stroke={STEEL[300]}
            />
            {rowLabel([compact ? `Row ${r.index}` : `Row ${r.index} · ${r.angleDeg}°`], band.y, band.h)}
          </g>
        );
      })}
    </g>
  );
});
