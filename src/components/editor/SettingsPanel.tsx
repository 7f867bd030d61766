/**
 * Settings beside the drawing: crop, rotor drum, rotor speed (with the tip speed and the crop's
 * rpm window), concave clearance, vanes, and the unit switch. Each field is a place findings can
 * point at (id "setting-<field>").
 */
import { useMemo } from 'react';
import { computeSettings } from '../../lib/domain/compute';
import { cropIds, cropPrograms } from '../../lib/domain/crops';
import { CLEARANCE_MAX_MM, CLEARANCE_MIN_MM, RPM_MAX, RPM_MIN, type Finding, type SettingField } from '../../lib/domain/schemas';
import { formatLength, formatMass, formatSpeed, kg, mm, MM_PER_INCH } from '../../lib/domain/units';
import { SeverityBadge } from '../cage/SeverityIcon';
import { CageEndView } from '../cage/EndView';
import { SEVERITY_STYLE } from '../cage/palette';
import { useEditor, useEditorStoreApi } from './store/context';
import { NumberField } from './NumberField';

const VANE_SETTINGS = ['very-slow', 'slow', 'medium', 'fast'] as const;
const VANE_WORDS = { 'very-slow': 'Very slow', slow: 'Slow', medium: 'Medium', fast: 'Fast' } as const;
const CONTROL_WORDS = { fixed: 'Fixed', manual: 'Manually adjusted', powered: 'Powered' } as const;

function FieldFinding({ findings, field }: { findings: readonly Finding[]; field: SettingField }) {
  const here = findings.filter((f) => f.places.some((p) => p.kind === 'setting' && p.field === field));
  if (here.length === 0) return null;
  return (
    <ul className="mt-1 space-y-0.5">
      {here.map((f, i) => (
        <li key={i} className="flex items-start gap-1.5 text-xs font-semibold" style={{ color: SEVERITY_STYLE[f.severity].colour }}>
          <SeverityBadge severity={f.severity} size={14} className="mt-0.5 shrink-0" />
          <span>
            {SEVERITY_STYLE[f.severity].words}: {f.title}
          </span>
        </li>
      ))}
    </ul>
  );
}

export function SettingsPanel() {
  const store = useEditorStoreApi();
  const family = useEditor((s) => s.family);
  const catalog = useEditor((s) => s.catalog);
  const layout = useEditor((s) => s.layout);
  const findings = useEditor((s) => s.findings);
  const units = useEditor((s) => s.units);
  const canEdit = useEditor((s) => s.canEdit);
  const set = store.getState().setSetting;
  const computed = useMemo(() => computeSettings(family, catalog, layout), [family, catalog, layout]);
  const crop = cropPrograms[layout.crop];
  const w = computed.rpmWindow;
  const drumLabel = family.drumOptions.find((d) => d.id === layout.drum)?.label ?? layout.drum;
  const imperial = units === 'imperial';
  const pct = (x: number) => `${Math.round(x * 100)} %`;

  return (
    <section aria-labelledby="settings-h" className="rounded-lg border border-steel-200 bg-white p-3 shadow-sm" data-testid="settings">
      <div className="flex items-center justify-between gap-2">
        <h2 id="settings-h" className="text-base font-semibold">
          Settings
        </h2>
        <fieldset className="flex items-center gap-1 text-sm">
          <legend className="sr-only">Units</legend>
          {(['metric', 'imperial'] as const).map((u) => (
            <label key={u} className={`cursor-pointer rounded-md border px-2 py-0.5 font-semibold has-[:focus-visible]:outline has-[:focus-visible]:outline-2 has-[:focus-visible]:outline-iris-500 ${units === u ? 'border-iris-700 bg-iris-700 text-white' : 'border-steel-300 bg-white text-ink-soft'}`}>
              <input type="radio" name="units" value={u} checked={units === u} onChange={() => store.getState().setUnits(u)} className="sr-only" />
              {u === 'metric' ? 'mm' : 'in'}
              <span className="sr-only">{u === 'metric' ? ' (metric)' : ' (imperial)'}</span>
            </label>
          ))}
        </fieldset>
      </div>

      <div className="mt-3 space-y-4">
        <div>
          <label htmlFor="setting-crop" className="field-label">
            Crop
          </label>
          <select id="setting-crop" className="field-input py-1.5" value={layout.crop} disabled={!canEdit} onChange={(e) => set('crop', e.target.value as typeof layout.crop)}>
            {cropIds.map((c) => (
              <option key={c} value={c}>
                {cropPrograms[c].name}
              </option>
            ))}
          </select>
          <FieldFinding findings={findings} field="crop" />
        </div>

        <div>
          <label htmlFor="setting-drum" className="field-label">
            Rotor drum
          </label>
          <select id="setting-drum" className="field-input py-1.5" value={layout.drum} disabled={!canEdit} onChange={(e) => set('drum', e.target.value as typeof layout.drum)}>
            {family.drumOptions.map((d) => (
              <option key={d.id} value={d.id}>
                {d.label} · ⌀ {formatLength(mm(d.diameterMm), units)}
              </option>
            ))}
          </select>
          <FieldFinding findings={findings} field="drum" />
        </div>

        <div>
          <NumberField
            id="setting-rotorRpm"
            label="Rotor speed"
            value={layout.rotorRpm}
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
              Tip speed <strong data-testid="tip-speed">{formatSpeed(computed.tipSpeedMs, units)}</strong>
            </p>
            <p>
              {crop.name} window on the {drumLabel.toLowerCase()}:{' '}
              <strong>
                {Math.ceil(w.minRpm)}–{Math.floor(w.maxRpm)} rpm
              </strong>
              {w.shiftRpm ? <span className="text-ink-muted"> (+{w.shiftRpm} rpm for the slim drum)</span> : null}
            </p>
            <p className={computed.rpmInWindow ? 'font-semibold text-ok' : 'font-semibold text-crop'}>
              <span aria-hidden="true">{computed.rpmInWindow ? '✓ ' : '▲ '}</span>
              {computed.rpmInWindow ? 'Inside the window' : layout.rotorRpm < w.minRpm ? 'Below the window' : 'Above the window'}
            </p>
          </div>
          <FieldFinding findings={findings} field="rotorRpm" />
        </div>

        <div>
          <NumberField
            id="setting-clearanceMm"
            label="Concave clearance"
            value={imperial ? layout.clearanceMm / MM_PER_INCH : layout.clearanceMm}
            format={(n) => (imperial ? n.toFixed(2) : (Math.round(n * 10) / 10).toString())}
            min={imperial ? CLEARANCE_MIN_MM / MM_PER_INCH : CLEARANCE_MIN_MM}
            max={imperial ? CLEARANCE_MAX_MM / MM_PER_INCH : CLEARANCE_MAX_MM}
            step={imperial ? 0.02 : 0.5}
            unit={imperial ? 'in' : 'mm'}
            disabled={!canEdit}
            onCommit={(n) => set('clearanceMm', Math.round((imperial ? n * MM_PER_INCH : n) * 100) / 100)}
          />
          <p className="mt-1 text-xs text-ink-muted">{crop.clearanceAdvice.split('(')[0]!.trim()}</p>
          <CageEndView family={family} clearanceMm={layout.clearanceMm} drum={layout.drum} units={units} className="mx-auto mt-2 max-w-[15rem]" />
          <FieldFinding findings={findings} field="clearanceMm" />
        </div>

        <div className="grid grid-cols-2 gap-2">
          <div>
            <label htmlFor="setting-vaneControl" className="field-label">
              Vane control
            </label>
            <select id="setting-vaneControl" className="field-input py-1.5" value={layout.vaneControl} disabled={!canEdit} onChange={(e) => set('vaneControl', e.target.value as typeof layout.vaneControl)}>
              {family.vaneControls.map((v) => (
                <option key={v} value={v}>
                  {CONTROL_WORDS[v]}
                </option>
              ))}
            </select>
          </div>
          <div>
            <label htmlFor="setting-vaneSetting" className="field-label">
              Vane setting
            </label>
            <select id="setting-vaneSetting" className="field-input py-1.5" value={layout.vaneSetting} disabled={!canEdit} onChange={(e) => set('vaneSetting', e.target.value as typeof layout.vaneSetting)}>
              {VANE_SETTINGS.map((v) => (
                <option key={v} value={v}>
                  {VANE_WORDS[v]}
                </option>
              ))}
            </select>
          </div>
        </div>
        <FieldFinding findings={findings} field="vaneControl" />
        <FieldFinding findings={findings} field="vaneSetting" />

        <dl className="grid grid-cols-2 gap-x-3 gap-y-1 border-t border-steel-100 pt-3 text-sm">
          <dt className="text-ink-muted">Open area, threshing</dt>
          <dd className="text-right font-semibold">{pct(computed.openArea.threshing.after)}</dd>
          <dt className="text-ink-muted">Open area, separating</dt>
          <dd className="text-right font-semibold">{pct(computed.openArea.separating.after)}</dd>
          <dt className="text-ink-muted">Aggressiveness index</dt>
          <dd className="text-right font-semibold" title="Cagewright's own scale for comparing layouts; fine-wire front, 25 m/s, 15 mm, medium vanes = 80">
            {Math.round(computed.aggressivenessIndex)}
          </dd>
          <dt className="text-ink-muted">Capacity factor</dt>
          <dd className="text-right font-semibold">× {computed.capacity.value.toFixed(2)}</dd>
          <dt className="text-ink-muted">Parts</dt>
          <dd className="text-right font-semibold">
            {computed.parts.count} · {formatMass(kg(computed.parts.totalMassKg), units)}
          </dd>
        </dl>
      </div>
    </section>
  );
}
