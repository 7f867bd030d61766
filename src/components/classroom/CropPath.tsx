/**
 * The crop-path view (a React island): the cage laid flat as in the diagram — front left, rear
 * right; going round the rotor from top to bottom: cage top left, left half of the element ring,
 * right half, cage top right — with the crop's spiral drawn across it as slanted strokes whose
 * pitch follows the vane setting (and tightens under cover plates). Heads (rings) travel the
 * spiral, are threshed into kernels (dots), and kernels drop through the element halves in
 * proportion to their open area; what is left leaves over the rotor or as unthreshed heads.
 *
 * It is an illustration on Cagewright's teaching scale (src/lib/classroom/crop-path.ts), and it
 * says so on its face. With prefers-reduced-motion it does not move by itself: the figure is
 * static and the step control walks the crop position by position; Play stays available.
 */
import { useCallback, useEffect, useId, useMemo, useRef, useState } from 'react';
import { cropPathModel, kernelFate, seeded, TURNS_PER_SECOND, type CropPathModel, type KernelFate } from '~/lib/classroom/crop-path';
import type { CatalogPart, Layout, MachineFamily, VaneSetting } from '~/lib/domain/schemas';
import { INK, INK_MUTED, INK_SOFT, STEEL } from '~/components/cage/palette';
import { PatternDefs, patternId } from '~/components/cage/patterns';
import { elementTypeLabel } from '~/lib/domain/vocabulary';

const VANE_WORDS: Record<VaneSetting, string> = { 'very-slow': 'very slow', slow: 'slow', medium: 'medium', fast: 'fast' };
const GRAIN = '#a35200';
const PATH = '#7851d6';
const pct = (x: number) => `${Math.round(x * 100)} %`;

// Drawing geometry, in SVG units.
const W = 1200;
const LABEL_W = 150;
const OUT_W = 210;
const TOP = 100;
const BAND = 70;
const CAGE_H = BAND * 4;
const PAN_Y = TOP + CAGE_H + 18;
const PAN_H = 112;
const H = PAN_Y + PAN_H + 58;
const PARTICLES = 36;
/** Where each band lies around the rotor, as a share of a turn from the cut along the top. */
const BAND_OF = { left: [0.25, 0.5], right: [0.5, 0.75] } as const;

export interface CropPathProps {
  family: MachineFamily;
  catalog: readonly CatalogPart[];
  layout: Layout;
  /** Larger type for the presentation. */
  stage?: boolean;
  /** Heading text; the view always adds that it is an illustration. */
  title?: string;
}

interface Geometry {
  colW: number;
  colX: (i: number) => number;
  cageRight: number;
  /** Turns done at the start of each position, and in all. */
  cum: number[];
  total: number;
}

function geometry(model: CropPathModel): Geometry {
  const n = model.positions.length;
  const colW = (W - LABEL_W - OUT_W) / n;
  const cum: number[] = [];
  let total = 0;
  for (const p of model.positions) {
    cum.push(total);
    total += p.turns;
  }
  return { colW, colX: (i) => LABEL_W + i * colW, cageRight: LABEL_W + n * colW, cum, total };
}

/** x along the cage after `tau` turns. */
function xAt(g: Geometry, model: CropPathModel, tau: number): number {
  if (tau >= g.total) return g.cageRight;
  let i = 0;
  while (i < g.cum.length - 1 && tau >= g.cum[i + 1]!) i++;
  return g.colX(i) + ((tau - g.cum[i]!) / model.positions[i]!.turns) * g.colW;
}

/** The spiral as line segments, broken where the path wraps from the bottom edge to the top. */
function spiralSegments(g: Geometry, model: CropPathModel, phase: number): string[] {
  const segments: string[] = [];
  const step = 0.02;
  let current: string[] = [];
  let prevAngle = phase % 1;
  for (let tau = 0; tau <= g.total + 1e-9; tau += step) {
    const angle = (phase + tau) % 1;
    if (angle < prevAngle && current.length) {
      segments.push(current.join(' '));
      current = [];
    }
    current.push(`${xAt(g, model, tau).toFixed(1)},${(TOP + angle * CAGE_H).toFixed(1)}`);
    prevAngle = angle;
  }
  if (current.length > 1) segments.push(current.join(' '));
  return segments;
}

interface Particle {
  fate: KernelFate;
  phase: number;
  /** Seconds since the start at which this kernel entered. */
  enteredAt: number;
  /** Turns after entry at which it is threshed, falls, and leaves the cage. */
  threshTau: number;
  fallTau: number;
}

function fallTurn(g: Geometry, model: CropPathModel, fate: Extract<KernelFate, { kind: 'falls' }>, phase: number): number {
  const start = g.cum[fate.position]! + fate.fallFrac * model.positions[fate.position]!.turns;
  const [lo, hi] = BAND_OF[fate.side];
  const angle = (phase + start) % 1;
  if (angle >= lo && angle < hi) return start;
  const to = (lo + 0.1 - angle + 1) % 1;
  return start + to;
}

function newParticle(g: Geometry, model: CropPathModel, random: () => number, at: number): Particle {
  const fate = kernelFate(model, random);
  const phase = random();
  const threshTau =
    fate.kind === 'unthreshed' ? Infinity : g.cum[fate.threshedAt]! + fate.threshFrac * model.positions[fate.threshedAt]!.turns;
  const fallTau = fate.kind === 'falls' ? fallTurn(g, model, fate, phase) : Infinity;
  return { fate, phase, enteredAt: at, threshTau, fallTau };
}

const FALL_SECONDS = 0.7;
const EXIT_SECONDS = 0.6;

/** Seconds from a kernel's entry to the end of its fall or its exit. */
function lifetime(g: Geometry, p: Particle): number {
  return p.fallTau < Infinity ? p.fallTau / TURNS_PER_SECOND + FALL_SECONDS : g.total / TURNS_PER_SECOND + EXIT_SECONDS;
}

/** Where a particle is drawn at time `t` (seconds), or null once its journey is over. */
function particleAt(g: Geometry, model: CropPathModel, p: Particle, t: number) {
  const tau = (t - p.enteredAt) * TURNS_PER_SECOND;
  if (tau < 0) return null;
  const kernel = tau >= p.threshTau;
  if (tau >= p.fallTau) {
    const s = (tau - p.fallTau) / TURNS_PER_SECOND;
    if (s > FALL_SECONDS) return null;
    const x = xAt(g, model, p.fallTau);
    const y0 = TOP + ((p.phase + p.fallTau) % 1) * CAGE_H;
    const k = s / FALL_SECONDS;
    return { x, y: y0 + (PAN_Y + 20 - y0) * k * k, kernel: true, opacity: 1 - k * 0.5 };
  }
  if (tau >= g.total) {
    const s = (tau - g.total) / TURNS_PER_SECOND;
    if (s > EXIT_SECONDS) return null;
    const k = s / EXIT_SECONDS;
    const y0 = TOP + ((p.phase + g.total) % 1) * CAGE_H;
    const yTarget = kernel ? TOP + 70 : TOP + 170;
    return { x: g.cageRight + k * 60, y: y0 + (yTarget - y0) * k, kernel, opacity: 1 - k };
  }
  return { x: xAt(g, model, tau), y: TOP + ((p.phase + tau) % 1) * CAGE_H, kernel, opacity: 1 };
}

function usePrefersReducedMotion(): boolean {
  const [reduced, setReduced] = useState(false);
  useEffect(() => {
    const mq = window.matchMedia('(prefers-reduced-motion: reduce)');
    setReduced(mq.matches);
    const on = () => setReduced(mq.matches);
    mq.addEventListener('change', on);
    return () => mq.removeEventListener('change', on);
  }, []);
  return reduced;
}

export function CropPath({ family, catalog, layout, stage = false, title }: CropPathProps) {
  const prefix = 'cp' + useId().replace(/[^A-Za-z0-9_-]/g, '');
  const reduced = usePrefersReducedMotion();
  const [vane, setVane] = useState<VaneSetting>(layout.vaneSetting);
  useEffect(() => setVane(layout.vaneSetting), [layout.vaneSetting]);
  const model = useMemo(() => cropPathModel(family, catalog, layout, { vaneSetting: vane }), [family, catalog, layout, vane]);
  const g = useMemo(() => geometry(model), [model]);
  const [playing, setPlaying] = useState(false);
  const [userChose, setUserChose] = useState(false);
  const [step, setStep] = useState(0);
  const dots = useRef<(SVGGElement | null)[]>([]);

  // Autoplay unless the viewer asked for reduced motion (or paused it themselves).
  useEffect(() => {
    if (!userChose) setPlaying(!reduced);
  }, [reduced, userChose]);

  useEffect(() => {
    const random = seeded(20260);
    const particles: Particle[] = [];
    // The still figure (and the start of the motion) is the moment `still`, with every kernel
    // somewhere along its own journey, as in a steady flow; a kernel whose journey ends enters
    // again at the front a moment later.
    const still = model.transitSeconds;
    for (let i = 0; i < PARTICLES; i++) {
      const p = newParticle(g, model, random, 0);
      p.enteredAt = still - random() * lifetime(g, p);
      particles.push(p);
    }
    const draw = (t: number) => {
      particles.forEach((p, i) => {
        let at = particleAt(g, model, p, t);
        if (!at && t - p.enteredAt > lifetime(g, p)) {
          particles[i] = newParticle(g, model, random, t + random() * 0.6);
          at = particleAt(g, model, particles[i]!, t);
        }
        const el = dots.current[i];
        if (!el) return;
        if (!at) {
          el.setAttribute('opacity', '0');
          return;
        }
        el.setAttribute('transform', `translate(${at.x.toFixed(1)},${at.y.toFixed(1)})`);
        el.setAttribute('opacity', at.opacity.toFixed(2));
        el.setAttribute('data-kind', at.kernel ? 'kernel' : 'head');
        (el.children[0] as SVGElement).setAttribute('display', at.kernel ? 'none' : 'inline');
        (el.children[1] as SVGElement).setAttribute('display', at.kernel ? 'inline' : 'none');
      });
    };
    if (!playing) {
      draw(still);
      return;
    }
    let frame = 0;
    let origin: number | null = null;
    const tick = (now: number) => {
      if (origin === null) origin = now - still * 1000;
      draw((now - origin) / 1000);
      frame = requestAnimationFrame(tick);
    };
    frame = requestAnimationFrame(tick);
    return () => cancelAnimationFrame(frame);
  }, [g, model, playing]);

  const toggle = useCallback(() => {
    setUserChose(true);
    setPlaying((p) => !p);
  }, []);

  const spiral = useMemo(() => spiralSegments(g, model, 0), [g, model]);
  const here = model.positions[step]!;
  const fs = 19;
  const small = 16;
  const maxShare = Math.max(0.15, ...model.positions.flatMap((p) => [p.halves.left.fallShare, p.halves.right.fallShare]));
  const headingId = `${prefix}-h`;
  const descId = `${prefix}-d`;
  const zoneRuns: { zone: string; from: number; to: number }[] = [];
  model.positions.forEach((p, i) => {
    const last = zoneRuns[zoneRuns.length - 1];
    if (last && last.zone === p.zone) last.to = i;
    else zoneRuns.push({ zone: p.zone, from: i, to: i });
  });
  const plates = layout.coverPlates
    .map((c) => ({ c, section: family.cageTopSections.find((s) => s.index === c.section) }))
    .filter((x) => x.section && x.section.coverPlateSides.includes(x.c.side));

  return (
    <figure className="crop-path" aria-labelledby={headingId} data-testid="crop-path" data-playing={playing ? 'yes' : 'no'}>
      <div className="flex flex-wrap items-center justify-between gap-3">
        <h3 id={headingId} className={stage ? 'text-[30px] font-bold' : 'text-lg font-semibold'}>
          {title ?? `The crop’s path: ${model.crop.toLowerCase()}`}
        </h3>
        <p
          className={`rounded-md border-2 border-advice bg-advice-soft px-3 py-1 font-bold text-advice ${stage ? 'text-[22px]' : 'text-sm'}`}
          data-testid="illustration-label"
        >
          An illustration, not a simulation
        </p>
      </div>
      <p id={descId} className={stage ? 'sr-only' : 'mt-1 text-sm text-ink-muted'}>
        The crop spirals rearward round the rotor; slower vanes mean more turns over each position. Rings are unthreshed heads, dots are
        loose kernels; kernels drop through each element in proportion to its open area, and a cover plate holds the crop back under its
        section.
      </p>

      <div className={`mt-2 flex flex-wrap items-center gap-3 ${stage ? 'text-[20px]' : 'text-sm'}`}>
        <button type="button" className="btn" onClick={toggle} aria-pressed={playing} data-testid="crop-path-play">
          {playing ? 'Pause' : reduced ? 'Play (motion)' : 'Play'}
        </button>
        <label className="inline-flex items-center gap-2">
          <span className="font-semibold">Vanes</span>
          <select
            className="rounded-md border-steel-300 py-1 text-base"
            value={vane}
            onChange={(e) => setVane(e.target.value as VaneSetting)}
          >
            {(Object.keys(VANE_WORDS) as VaneSetting[]).map((v) => (
              <option key={v} value={v}>
                {VANE_WORDS[v]}
                {v === layout.vaneSetting ? ' (this layout)' : ''}
              </option>
            ))}
          </select>
        </label>
        <span className="text-ink-muted">Front to rear in about {model.transitSeconds.toFixed(0)} s at the illustration’s pace</span>
      </div>

      <svg
        viewBox={`0 0 ${W} ${H}`}
        width="100%"
        role="img"
        aria-labelledby={`${headingId} ${descId}`}
        className="mt-2 block h-auto max-w-full"
        style={stage ? { maxHeight: 'calc(100vh - 330px)' } : undefined}
        fontFamily='"Source Sans 3", system-ui, sans-serif'
      >
        <PatternDefs prefix={prefix} />
        <defs>
          <marker id={`${prefix}-arrow`} viewBox="0 0 10 10" refX="5" refY="5" markerWidth="5" markerHeight="5" orient="auto-start-reverse">
            <path d="M0,0L10,5L0,10z" fill={PATH} />
          </marker>
        </defs>
        {/* zones and positions */}
        {zoneRuns.map((z) => (
          <g key={z.from}>
            <rect
              x={g.colX(z.from) + 2}
              y={8}
              width={(z.to - z.from + 1) * g.colW - 4}
              height={30}
              rx={4}
              fill={z.zone === 'threshing' ? STEEL[700] : STEEL[200]}
            />
            <text
              x={g.colX(z.from) + ((z.to - z.from + 1) * g.colW) / 2}
              y={29}
              textAnchor="middle"
              fontSize={fs}
              fontWeight={700}
              fill={z.zone === 'threshing' ? '#fff' : INK}
            >
              {z.zone === 'threshing' ? 'Threshing zone' : 'Separating zone'}
            </text>
          </g>
        ))}
        {model.positions.map((p, i) => (
          <text key={p.index} x={g.colX(i) + g.colW / 2} y={66} textAnchor="middle" fontSize={fs} fontWeight={700} fill={INK}>
            Position {p.index}
            <tspan x={g.colX(i) + g.colW / 2} dy={fs + 2} fontSize={small} fontWeight={400} fill={INK_MUTED}>
              {p.turns.toFixed(1)} turns{p.plates ? (g.colW >= 180 ? ' · held by plate' : ' · plate') : ''}
            </tspan>
          </text>
        ))}
        {/* band labels */}
        {(['Cage top, left', 'Left half', 'Right half', 'Cage top, right'] as const).map((l, i) => (
          <text
            key={l}
            x={LABEL_W - 10}
            y={TOP + i * BAND + BAND / 2 + 6}
            textAnchor="end"
            fontSize={small}
            fontWeight={700}
            fill={INK_SOFT}
          >
            {l}
          </text>
        ))}
        {/* cage top bands and cover plates */}
        <rect x={LABEL_W} y={TOP} width={g.cageRight - LABEL_W} height={BAND} fill={STEEL[100]} stroke={STEEL[300]} />
        <rect x={LABEL_W} y={TOP + 3 * BAND} width={g.cageRight - LABEL_W} height={BAND} fill={STEEL[100]} stroke={STEEL[300]} />
        {plates.map(({ c, section }) => {
          const first = model.positions.findIndex((p) => p.index === Math.min(...section!.positions));
          const span = section!.positions.length * g.colW;
          const y = c.side === 'left' ? TOP : TOP + 3 * BAND;
          return (
            <g key={`${c.section}${c.side}`}>
              <rect x={g.colX(first) + 6} y={y + 6} width={span - 12} height={BAND - 12} rx={4} fill={STEEL[600]} />
              <text x={g.colX(first) + span / 2} y={y + BAND / 2 + 6} textAnchor="middle" fontSize={small} fontWeight={700} fill="#fff">
                Cover plate, {c.side}
              </text>
            </g>
          );
        })}
        {/* element halves */}
        {model.positions.map((p, i) =>
          (['left', 'right'] as const).map((side, j) => {
            const h = p.halves[side];
            const x = g.colX(i) + 4;
            const y = TOP + BAND * (1 + j) + 3;
            const w = g.colW - 8;
            return (
              <g key={`${p.index}${side}`}>
                <rect
                  x={x}
                  y={y}
                  width={w}
                  height={BAND - 6}
                  rx={4}
                  fill={h.elementType ? `url(#${patternId(prefix, h.elementType)})` : STEEL[50]}
                  stroke={STEEL[500]}
                  opacity={0.55}
                />
                <rect x={x + 4} y={y + 4} width={Math.min(w - 8, 132)} height={46} rx={3} fill="#fff" opacity={0.92} />
                <text x={x + 9} y={y + 23} fontSize={small} fontWeight={700} fill={INK}>
                  {h.elementType ? elementTypeLabel(h.elementType) : 'empty'}
                </text>
                <text x={x + 9} y={y + 43} fontSize={small * 0.9} fill={INK_SOFT}>
                  {h.elementType === null
                    ? ''
                    : h.kernelPasses === false
                      ? 'kernel cannot pass'
                      : h.kernelPasses === null
                        ? 'no opening'
                        : `open ${pct(h.openArea)}${h.covered ? ' (plate)' : ''}`}
                </text>
              </g>
            );
          }),
        )}
        {/* the step's position */}
        <rect
          x={g.colX(step) + 1}
          y={TOP - 4}
          width={g.colW - 2}
          height={CAGE_H + 8 + 18 + PAN_H}
          rx={6}
          fill="none"
          stroke={PATH}
          strokeWidth={3}
          strokeDasharray="8 5"
        />
        {/* the spiral */}
        {spiral.map((pts, i) => (
          <polyline
            key={i}
            points={pts}
            fill="none"
            stroke={PATH}
            strokeWidth={2.5}
            strokeOpacity={0.55}
            markerEnd={`url(#${prefix}-arrow)`}
          />
        ))}
        {/* kernels and heads */}
        <g aria-hidden="true">
          {Array.from({ length: PARTICLES }, (_, i) => (
            <g
              key={i}
              ref={(el) => {
                dots.current[i] = el;
              }}
              opacity={0}
            >
              <circle r={8} fill="none" stroke={GRAIN} strokeWidth={3} />
              <circle r={5} fill={GRAIN} display="none" />
            </g>
          ))}
        </g>
        {/* what falls through, by position */}
        <text x={LABEL_W - 10} y={PAN_Y + 34} textAnchor="end" fontSize={small} fontWeight={700} fill={INK_SOFT}>
          Falls through
        </text>
        <text x={LABEL_W - 10} y={PAN_Y + 34 + small + 2} textAnchor="end" fontSize={small} fill={INK_MUTED}>
          (share of grain)
        </text>
        <line x1={LABEL_W} x2={g.cageRight} y1={PAN_Y + PAN_H - 24} y2={PAN_Y + PAN_H - 24} stroke={STEEL[500]} strokeWidth={1.5} />
        {model.positions.map((p, i) =>
          (['left', 'right'] as const).map((side, j) => {
            const share = p.halves[side].fallShare;
            const bh = (share / maxShare) * (PAN_H - 44);
            const bw = Math.min(44, g.colW / 2 - 22);
            const x = g.colX(i) + g.colW / 2 + (j === 0 ? -bw - 6 : 6);
            const base = PAN_Y + PAN_H - 24;
            return (
              <g key={`${p.index}${side}`}>
                <rect x={x} y={base - bh} width={bw} height={bh} fill={side === 'left' ? STEEL[600] : STEEL[400]} />
                <text x={x + bw / 2} y={base - bh - 5} textAnchor="middle" fontSize={small * 0.95} fontWeight={700} fill={INK}>
                  {pct(share)}
                </text>
                <text x={x + bw / 2} y={base + small + 2} textAnchor="middle" fontSize={small * 0.85} fill={INK_MUTED}>
                  {side === 'left' ? 'L' : 'R'}
                </text>
              </g>
            );
          }),
        )}
        {/* out the back */}
        <g>
          <rect x={g.cageRight + 24} y={TOP} width={W - g.cageRight - 30} height={CAGE_H} rx={6} fill={STEEL[50]} stroke={STEEL[300]} />
          <text x={g.cageRight + 36} y={TOP + 28} fontSize={fs} fontWeight={700} fill={INK}>
            Out the back
          </text>
          <circle cx={g.cageRight + 46} cy={TOP + 64} r={6} fill={GRAIN} />
          <text x={g.cageRight + 62} y={TOP + 71} fontSize={fs + 3} fontWeight={700} fill={INK}>
            {pct(model.overRotor)}
          </text>
          <text x={g.cageRight + 36} y={TOP + 96} fontSize={small} fill={INK_SOFT}>
            over the rotor
          </text>
          <circle cx={g.cageRight + 46} cy={TOP + 150} r={8} fill="none" stroke={GRAIN} strokeWidth={3} />
          <text x={g.cageRight + 62} y={TOP + 157} fontSize={fs + 3} fontWeight={700} fill={INK}>
            {pct(model.unthreshed)}
          </text>
          <text x={g.cageRight + 36} y={TOP + 182} fontSize={small} fill={INK_SOFT}>
            in whole heads
          </text>
          <text x={g.cageRight + 36} y={TOP + CAGE_H - 16} fontSize={small} fill={INK_MUTED}>
            {pct(model.fallen)} through the cage
          </text>
        </g>
        {/* legend */}
        <g transform={`translate(${LABEL_W}, ${H - 18})`} fontSize={small} fill={INK_SOFT}>
          <circle cx={8} cy={-5} r={7} fill="none" stroke={GRAIN} strokeWidth={3} />
          <text x={22} y={0}>
            unthreshed head
          </text>
          <circle cx={190} cy={-5} r={5} fill={GRAIN} />
          <text x={202} y={0}>
            loose kernel
          </text>
          <line x1={330} x2={370} y1={-5} y2={-12} stroke={PATH} strokeWidth={2.5} />
          <text x={378} y={0}>
            the crop’s spiral (vanes {VANE_WORDS[vane]})
          </text>
        </g>
      </svg>

      <div className={`mt-2 flex flex-wrap items-center gap-3 ${stage ? 'text-[20px]' : 'text-sm'}`}>
        <button
          type="button"
          className="btn"
          onClick={() => setStep((s) => Math.max(0, s - 1))}
          disabled={step === 0}
          aria-label="Previous position"
        >
          ◀
        </button>
        <label className="inline-flex items-center gap-2">
          <span className="font-semibold">Follow the crop</span>
          <input
            type="range"
            min={0}
            max={model.positions.length - 1}
            value={step}
            onChange={(e) => setStep(Number(e.target.value))}
            aria-valuetext={`Position ${here.index}`}
            data-testid="crop-path-step"
          />
        </label>
        <button
          type="button"
          className="btn"
          onClick={() => setStep((s) => Math.min(model.positions.length - 1, s + 1))}
          disabled={step === model.positions.length - 1}
          aria-label="Next position"
        >
          ▶
        </button>
        <p aria-live="polite" className="min-w-0 flex-1" data-testid="crop-path-caption">
          <strong>Position {here.index}</strong> ({here.zone} zone, {here.turns.toFixed(1)} turns
          {here.plates ? ', held back by a cover plate' : ''}): whole heads {pct(here.headsIn)} → {pct(here.headsOut)}; through the left
          half {pct(here.halves.left.fallShare)}, the right half {pct(here.halves.right.fallShare)}; {pct(here.fallenSoFar)} through the
          cage so far.
        </p>
      </div>
    </figure>
  );
}

export default CropPath;
