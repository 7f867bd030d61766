/**
 * Settings beside the drawing: crop, rotor drum, rotor speed (with the tip speed and the crop's
 * rpm window), concave clearance, vanes, and the unit switch. Each field is a place findings can
 * point at (id "setting-<field>"). The fields read only the settings they show, so placing a part
 * in the drawing does not re-render them.
 */
import { memo, useMemo } from 'react';
import { computeSettings, drumFor } from '~/lib/domain/compute';
import { cropIds, cropPrograms } from '~/lib/domain/crops';
import type { SettingField } from '~/lib/domain/schemas';
import { CLEARANCE_MAX_MM, CLEARANCE_MIN_MM, RPM_MAX, RPM_MIN } from '~/lib/domain/values';
import { inRpmWindow, rpmWindow, rpmWindowWhole, rpmWindowWords, startRpm, tipSpeed } from '~/lib/domain/speed';
import { VANE_CONTROL_HOW, vaneSettingsFor } from '~/lib/domain/vanes';
import { formatLength, formatMass, formatSpeed, kg, mm, MM_PER_INCH, rpm } from '~/lib/domain/units';
import { CageEndView } from '~/components/cage/EndView';
import { SeverityBadge } from '~/components/cage/SeverityIcon';
import { SEVERITY_STYLE } from '~/components/cage/palette';
import { useEditor, useEditorLazy, useEditorStoreApi } from './store/context';
import { NumberField } from './NumberField';
import type { EditorState } from './store/types';
import { CAPACITY_MODEL_WORDS } from '~/lib/domain/cage-metrics';

const VANE_SETTINGS = ['very-slow', 'slow', 'medium', 'fast'] as const;
const VANE_WORDS = { 'very-slow': 'Very slow', slow: 'Slow', medium: 'Medium', fast: 'Fast' } as const;
const CONTROL_WORDS = { fixed: 'Bolt-set', manual: 'Adjustable', powered: 'Powered' } as const;
const SEP = '\u0001';

/** The findings pinned to one setting, packed in a string (worked out once per findings list). */
function packedFindingsOf(field: SettingField) {
  let seen: EditorState['findings'] | null = null;
  let packed = '';
  return (s: EditorState) => {
    if (s.findings !== seen) {
      seen = s.findings;
      packed = s.findings
        .filter((f) => f.places.some((p) => p.kind === 'setting' && p.field === field))
        .map((f) => `${f.severity}${SEP}${f.title}`)
        .join('\n');
    }
    return packed;
  };
}

/** Findings pinned to one setting, read as a string so unrelated edits do not re-render it. */
function FieldFinding({ field }: { field: SettingField }) {
  const select = useMemo(() => packedFindingsOf(field), [field]);
  const packed = useEditor(select);
  if (!packed) return null;
  return (
    <ul className="mt-1 flex flex-col gap-0.5">
      {packed.split('\n').map((line, i) => {
        const [severity, title] = line.split(SEP) as [keyof typeof SEVERITY_STYLE, string];
        return (
          <li key={i} className="flex items-start gap-1.5 text-xs font-semibold" style={{ color: SEVERITY_STYLE[severity].colour }}>
            <SeverityBadge severity={severity} size={14} className="mt-0.5 shrink-0" />
            <span>
              {SEVERITY_STYLE[severity].words}: {title}
            </span>
          </li>
        );
      })}
    </ul>
  );
}

function UnitsSwitch() {
  const store = useEditorStoreApi();
  const units = useEditor((s) => s.units);
  return (
    <fieldset className="flex items-center gap-1 text-sm">
      <legend className="sr-only">Units</legend>
      {(['metric', 'imperial'] as const).map((u) => (
        <label
          key={u}
          className={`cursor-pointer rounded-md border px-2 py-0.5 font-semibold focus-within:outline focus-within:outline-2 focus-within:outline-offset-2 focus-within:outline-iris-500 ${units === u ? 'border-iris-700 bg-iris-700 text-white' : 'border-steel-300 bg-white text-ink-soft'}`}
        >
          <input
            type="radio"
            name="units"
            value={u}
            checked={units === u}
            onChange={() => store.getState().setUnits(u)}
            className="sr-only"
          />
          {u === 'metric' ? 'mm' : 'in'}
          <span className="sr-only">{u === 'metric' ? ' (metric)' : ' (imperial)'}</span>
        </label>
      ))}
    </fieldset>
  );
}

const EndViewBeside = memo(CageEndView);

function SettingsFields() {
  const store = useEditorStoreApi();
  const family = useEditor((s) => s.family);
  const units = useEditor((s) => s.units);
  const canEdit = useEditor((s) => s.canEdit);
  const crop = useEditor((s) => s.layout.crop);
  const drum = useEditor((s) => s.layout.drum);
  const rotorRpm = useEditor((s) => s.layout.rotorRpm);
  const clearanceMm = useEditor((s) => s.layout.clearanceMm);
  const vaneControl = useEditor((s) => s.layout.vaneControl);
  const vaneSetting = useEditor((s) => s.layout.vaneSetting);
  const set = store.getState().setSetting;
  const program = cropPrograms[crop];
  const d = drumFor(family, drum);
  const w = rpmWindow(program, { id: drum, diameterMm: d.diameterMm });
  const v = tipSpeed(mm(d.diameterMm), rpm(rotorRpm));
  const inside = inRpmWindow(rotorRpm, w);
  const whole = rpmWindowWhole(w);
  const imperial = units === 'imperial';
  const canTake = vaneSettingsFor(vaneControl);

  return (
    <div className="mt-3 flex flex-col gap-4">
      <div>
        <label htmlFor="setting-crop" className="field-label">
          Crop
        </label>
        <select
          id="setting-crop"
          className="field-input py-1.5"
          value={crop}
          disabled={!canEdit}
          onChange={(e) => set('crop', e.target.value as typeof crop)}
        >
          {cropIds.map((c) => (
            <option key={c} value={c}>
              {cropPrograms[c].name}
            </option>
          ))}
        </select>
        <FieldFinding field="crop" />
      </div>

      <div>
        <label htmlFor="setting-drum" className="field-label">
          Rotor drum
        </label>
        <select
          id="setting-drum"
          className="field-input py-1.5"
          value={drum}
          disabled={!canEdit}
          onChange={(e) => set('drum', e.target.value as typeof drum)}
        >
          {family.drumOptions.map((o) => (
            <option key={o.id} value={o.id}>
              {o.label} · ⌀ {formatLength(mm(o.diameterMm), units)}
            </option>
          ))}
        </select>
        <FieldFinding field="drum" />
      </div>

      <div>
        <NumberField
          id="setting-rotorRpm"
          label="Rotor speed"
          value={rotorRpm}
          format={(n) => String(Math.round(n))}
          min={RPM_MIN}
          max={RPM_MAX}
          step={10}
          unit="rpm"
          disabled={!canEdit}
          describedBy="rpm-facts"
          onCommit={(n) => set('rotorRpm', Math.round(n))}
        />
        <div id="rpm-facts" className="mt-1.5 rounded-md bg-steel-50 px-2 py-1.5 text-sm">
          <p>
            Tip speed <strong data-testid="tip-speed">{formatSpeed(v, units)}</strong>
          </p>
          <p>
            {program.name} window on the {d.label.toLowerCase()}: <strong>{rpmWindowWords(w)}</strong>
            {w.shiftRpm ? <span className="text-ink-muted"> (+{w.shiftRpm} rpm for the slim drum)</span> : null}
          </p>
          <p className={inside ? 'font-semibold text-ok' : 'font-semibold text-crop'}>
            <span aria-hidden="true">{inside ? '✓ ' : '▲ '}</span>
            {inside
              ? 'Inside the window'
              : rotorRpm < whole.lo
                ? 'Below the window'
                : rotorRpm > whole.hi
                  ? 'Above the window'
                  : 'Between the cited ranges'}
          </p>
          <p className="text-ink-muted" data-testid="rpm-start">
            Start at {startRpm(w)} rpm, the slow end{w.start ? ' of the usual starting band' : ''}; go faster only as losses call for it.
          </p>
        </div>
        <FieldFinding field="rotorRpm" />
      </div>

      <div>
        <NumberField
          id="setting-clearanceMm"
          label="Concave clearance"
          value={imperial ? clearanceMm / MM_PER_INCH : clearanceMm}
          format={(n) => (imperial ? n.toFixed(2) : (Math.round(n * 10) / 10).toString())}
          min={imperial ? CLEARANCE_MIN_MM / MM_PER_INCH : CLEARANCE_MIN_MM}
          max={imperial ? CLEARANCE_MAX_MM / MM_PER_INCH : CLEARANCE_MAX_MM}
          step={imperial ? 0.02 : 0.5}
          unit={imperial ? 'in' : 'mm'}
          disabled={!canEdit}
          onCommit={(n) => set('clearanceMm', Math.round((imperial ? n * MM_PER_INCH : n) * 100) / 100)}
        />
        <p className="mt-1 text-sm" data-testid="clearance-window">
          {program.name} window:{' '}
          <strong>
            {formatLength(mm(program.clearanceMm.minMm), units)}–{formatLength(mm(program.clearanceMm.maxMm), units)}
          </strong>
          <span className="text-ink-muted"> · start at the wide end</span>
        </p>
        <p className="mt-1 text-xs text-ink-muted">{program.clearanceAdvice.split('(')[0]!.trim()}</p>
        <FieldFinding field="clearanceMm" />
        {/* The end view is left out on a phone (its words would be too small there). */}
        <div className="hidden md:block">
          <EndViewBeside family={family} clearanceMm={clearanceMm} drum={drum} units={units} className="mx-auto mt-2 max-w-[18rem]" />
        </div>
      </div>

      <div className="grid grid-cols-2 gap-2">
        <div>
          <label htmlFor="setting-vaneControl" className="field-label">
            Vane control
          </label>
          <select
            id="setting-vaneControl"
            className="field-input py-1.5"
            value={vaneControl}
            disabled={!canEdit}
            onChange={(e) => set('vaneControl', e.target.value as typeof vaneControl)}
          >
            {family.vaneControls.map((c) => (
              <option key={c} value={c}>
                {CONTROL_WORDS[c]}
              </option>
            ))}
          </select>
        </div>
        <div>
          <label htmlFor="setting-vaneSetting" className="field-label">
            Vane setting
          </label>
          <select
            id="setting-vaneSetting"
            className="field-input py-1.5"
            value={vaneSetting}
            disabled={!canEdit}
            onChange={(e) => set('vaneSetting', e.target.value as typeof vaneSetting)}
          >
            {VANE_SETTINGS.map((x) => (
              <option key={x} value={x} disabled={!canTake.includes(x) && x !== vaneSetting}>
                {VANE_WORDS[x]}
                {canTake.includes(x) ? '' : ' (not on these vanes)'}
              </option>
            ))}
          </select>
        </div>
      </div>
      <p className="-mt-2 text-xs text-ink-muted" data-testid="vane-how">
        {VANE_CONTROL_HOW[vaneControl][0]!.toUpperCase() + VANE_CONTROL_HOW[vaneControl].slice(1)}.
      </p>
      <FieldFinding field="vaneControl" />
      <FieldFinding field="vaneSetting" />
    </div>
  );
}

/**
 * Figures computed from the whole layout: open area, aggressiveness, capacity, parts. They follow
 * an edit one painted frame after the drawing and the findings (`useEditorLazy`), never before
 * them: the frame that shows the edit neither waits for them nor renders this component.
 */
function ComputedFacts() {
  const family = useEditor((s) => s.family);
  const catalog = useEditor((s) => s.catalog);
  const layout = useEditorLazy((s) => s.layout);
  const units = useEditor((s) => s.units);
  const c = useMemo(() => computeSettings(family, catalog, layout), [family, catalog, layout]);
  const pct = (x: number) => `${Math.round(x * 100)} %`;
  return (
    <dl className="mt-4 grid grid-cols-2 gap-x-3 gap-y-1 border-t border-steel-100 pt-3 text-sm">
      <dt className="text-ink-muted">Open area, threshing</dt>
      <dd className="text-right font-semibold">{pct(c.openArea.threshing.after)}</dd>
      <dt className="text-ink-muted">Open area, separating</dt>
      <dd className="text-right font-semibold">{pct(c.openArea.separating.after)}</dd>
      <dt className="text-ink-muted">Aggressiveness index</dt>
      <dd
        className="text-right font-semibold"
        title="Cagewright's own scale for comparing layouts; fine-wire front, 25 m/s, 15 mm, medium vanes = 80"
      >
        {Math.round(c.aggressivenessIndex)}
      </dd>
      <dt className="text-ink-muted">Capacity factor</dt>
      <dd className="text-right font-semibold">× {c.capacity.value.toFixed(2)}</dd>
      <dd className="col-span-2 text-xs text-ink-muted" data-testid="capacity-model">
        {CAPACITY_MODEL_WORDS}
      </dd>
      <dt className="text-ink-muted">Parts</dt>
      <dd className="text-right font-semibold">
        {c.parts.count} · {formatMass(kg(c.parts.totalMassKg), units)}
      </dd>
    </dl>
  );
}

export function SettingsPanel() {
  return (
    <section
      aria-labelledby="settings-h"
      className="rounded-lg [contain:layout_paint] border border-steel-200 bg-white p-3 shadow-sm"
      data-testid="settings"
    >
      <div className="flex items-center justify-between gap-2">
        <h2 id="settings-h" className="text-base font-semibold">
          Settings
        </h2>
        <UnitsSwitch />
      </div>
      <SettingsFields />
      <ComputedFacts />
    </section>
  );
}
