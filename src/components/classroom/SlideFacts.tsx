/**
 * The figures and findings beside a slide's diagram: crop and settings, the rotor speed against
 * the crop's window, open area per zone after cover plates, aggressiveness, capacity, and the
 * rules' findings with their severity told by icon shape and words as well as colour.
 * Renders on the server (share page, compare page) and in islands (presentation) alike.
 * `stage` sizes everything to be read from the back of a room.
 */
import { cropPrograms } from '~/lib/domain/crops';
import { rpmWindowWords } from '~/lib/domain/speed';
import type { Settings } from '~/lib/domain/compute';
import type { Finding, Layout, MachineFamily } from '~/lib/domain/schemas';
import { formatLength, formatSpeed, mm, type UnitSystem } from '~/lib/domain/units';
import { SeverityBadge } from '~/components/cage/SeverityIcon';
import { severityWords } from '~/lib/domain/vocabulary';

const VANE_WORDS = { 'very-slow': 'very slow', slow: 'slow', medium: 'medium', fast: 'fast' } as const;
const pct = (x: number) => `${Math.round(x * 100)} %`;

export interface SlideFactsProps {
  layout: Layout;
  family: MachineFamily;
  settings: Settings;
  findings: readonly Finding[];
  units: UnitSystem;
  stage?: boolean;
  /** At most this many findings are listed; the rest are counted. */
  maxFindings?: number;
}

export function SlideFacts({ layout, family, settings, findings, units, stage = false, maxFindings = 99 }: SlideFactsProps) {
  const drum = family.drumOptions.find((d) => d.id === layout.drum)?.label ?? layout.drum;
  const w = settings.rpmWindow;
  const facts: [string, string, boolean?][] = [
    ['Crop', cropPrograms[layout.crop].name],
    ['Rotor', `${drum} · ${layout.rotorRpm} rpm`],
    ['Crop window', rpmWindowWords(w), !settings.rpmInWindow],
    ['Tip speed', formatSpeed(settings.tipSpeedMs, units)],
    ['Concave clearance', formatLength(mm(layout.clearanceMm), units)],
    ['Vanes', `${layout.vaneControl}, ${VANE_WORDS[layout.vaneSetting]}`],
    ['Open area, threshing', pct(settings.openArea.threshing.after)],
    ['Open area, separating', pct(settings.openArea.separating.after)],
    ['Aggressiveness index', String(Math.round(settings.aggressivenessIndex))],
    ['Capacity factor', settings.capacity.value.toFixed(2)],
  ];
  // One line per kind of finding: the same finding at several places reads once, with a count
  // (each place is pinned on the diagram).
  const groups: { finding: Finding; places: number }[] = [];
  for (const f of findings) {
    const same = groups.find((g) => g.finding.code === f.code && g.finding.title === f.title);
    if (same) same.places += Math.max(1, f.places.length);
    else groups.push({ finding: f, places: Math.max(1, f.places.length) });
  }
  const shown = groups.slice(0, maxFindings);
  const text = stage ? 'text-[30px] leading-snug' : 'text-sm';
  return (
    <div className={stage ? 'space-y-6' : 'space-y-4'} data-testid="slide-facts">
      <dl className={`grid grid-cols-[auto_1fr] gap-x-5 ${stage ? 'gap-y-1.5' : 'gap-y-1'} ${text}`}>
        {facts.map(([k, v, warn]) => (
          <div key={k} className="contents">
            <dt className="text-ink-muted">{k}</dt>
            <dd className={`font-semibold ${warn ? 'text-crop' : ''}`}>
              {v}
              {k === 'Crop window' && (
                <span className="ml-2 font-normal">
                  {settings.rpmInWindow ? '· the rotor speed is inside this window' : '· ▲ the rotor speed is outside this window'}
                </span>
              )}
            </dd>
          </div>
        ))}
      </dl>
      <section aria-label="What the rules say">
        <h3 className={stage ? 'text-[32px] font-bold' : 'text-base font-semibold'}>What the rules say</h3>
        {findings.length === 0 ? (
          <p className={`mt-1 flex items-center gap-2 ${text}`} data-testid="no-findings">
            <span aria-hidden="true" className="font-bold text-ok">
              ✓
            </span>{' '}
            Fits this machine and suits the crop: no findings.
          </p>
        ) : (
          <ul className={`mt-1 ${stage ? 'space-y-2' : 'space-y-1'}`} data-testid="findings">
            {shown.map(({ finding: f, places }, i) => (
              <li key={`${f.code}-${i}`} className={`flex items-start gap-2 ${text}`}>
                <SeverityBadge severity={f.severity} size={stage ? 30 : 18} className="mt-1 shrink-0" />
                <span>
                  <span className="sr-only">{severityWords(f.severity)}: </span>
                  <span className="font-semibold">{f.title}</span>
                  {places > 1 && <span className="text-ink-muted"> · {places} places</span>}
                  {!stage && <span className="block text-ink-muted">{f.fix}</span>}
                </span>
              </li>
            ))}
            {groups.length > shown.length && <li className={`${text} text-ink-muted`}>and {groups.length - shown.length} more</li>}
          </ul>
        )}
      </section>
    </div>
  );
}

export function SeverityLegend({ stage = false }: { stage?: boolean }) {
  return (
    <p className={`flex flex-wrap items-center gap-x-4 gap-y-1 ${stage ? 'text-xl' : 'text-xs'} text-ink-muted`}>
      {(['blocks-fit', 'hurts-crop', 'advice'] as const).map((s) => (
        <span key={s} className="inline-flex items-center gap-1">
          <SeverityBadge severity={s} size={stage ? 22 : 14} /> {severityWords(s)}
        </span>
      ))}
    </p>
  );
}
