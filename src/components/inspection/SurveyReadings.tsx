/**
 * The clearance survey: rotor-to-element clearance front and rear of each position on both
 * sides, the set clearance and tolerance, and what the comparison finds.
 */
import { useState } from 'react';
import { clearanceReadingKey, surveyFromMeasurements, type ClearanceEnd } from '~/lib/domain/inspection';
import type { MachineFamily, Side } from '~/lib/domain/schemas';
import type { UnitSystem } from '~/lib/domain/units';
import { describeSurveyFinding, fromInput, showLength, toInput, unitLabel } from './units';

interface Props {
  family: MachineFamily;
  measurements: Record<string, number>;
  units: UnitSystem;
  editable: boolean;
  onChange: (measurements: Record<string, number | null>) => void;
}

function LengthInput({
  id,
  label,
  mm,
  units,
  max,
  onCommit,
  compact,
}: {
  id: string;
  label: string;
  mm: number | undefined;
  units: UnitSystem;
  max: number;
  onCommit: (mm: number | null) => void;
  compact?: boolean;
}) {
  const [text, setText] = useState(toInput(mm, units));
  const [bad, setBad] = useState(false);
  return (
    <div>
      <label htmlFor={id} className={compact ? 'block text-xs font-semibold text-ink-soft' : 'field-label'}>
        {label}
      </label>
      <input
        id={id}
        type="text"
        inputMode="decimal"
        autoComplete="off"
        value={text}
        aria-invalid={bad || undefined}
        className="field-input min-h-[48px] w-full"
        onChange={(e) => {
          const t = e.currentTarget.value;
          setText(t);
          const v = fromInput(t, units);
          const ok = v === null || (Number.isFinite(v) && v <= max);
          setBad(!ok);
          if (ok) onCommit(v);
        }}
      />
      {bad && <p className="field-error">A number up to {showLength(max, units)}.</p>}
    </div>
  );
}

export function SurveyReadings({ family, measurements, units, editable, onChange }: Props) {
  const survey = surveyFromMeasurements(family, measurements);
  const u = unitLabel(units);
  const cell = (p: number, side: Side, end: ClearanceEnd) => {
    const key = clearanceReadingKey(p, side, end);
    const mm = measurements[key];
    const label = `${side === 'left' ? 'Left' : 'Right'} ${end}`;
    if (!editable)
      return (
        <div className="text-sm">
          <span className="text-xs text-ink-muted">{label}</span>
          <br />
          {mm === undefined ? '—' : showLength(mm, units)}
        </div>
      );
    return (
      <LengthInput
        compact
        id={`survey-${p}-${side}-${end}`}
        label={`${label} (${u})`}
        mm={mm}
        units={units}
        max={100}
        onCommit={(v) => onChange({ [key]: v })}
      />
    );
  };
  return (
    <div className="mt-3">
      <p className="text-sm text-ink-muted">
        Measure the gap between the rotor and each element at the front and the rear of every position, on both sides. Readings further
        apart than the tolerance are flagged: a few millimetres lets small-grain heads through unthreshed, while a wide corn setting hardly
        notices.
      </p>
      <div className="mt-3 grid grid-cols-2 gap-3 sm:max-w-md">
        {editable ? (
          <>
            <LengthInput
              id="survey-set"
              label={`Set clearance (${u})`}
              mm={measurements.setClearanceMm}
              units={units}
              max={100}
              onCommit={(v) => onChange({ setClearanceMm: v })}
            />
            <LengthInput
              id="survey-tolerance"
              label={`Tolerance (${u})`}
              mm={measurements.toleranceMm}
              units={units}
              max={20}
              onCommit={(v) => onChange({ toleranceMm: v === 0 ? null : v })}
            />
          </>
        ) : (
          <p className="col-span-2 text-sm">
            Set clearance {measurements.setClearanceMm === undefined ? '—' : showLength(measurements.setClearanceMm, units)} · tolerance{' '}
            {showLength(survey.toleranceMm, units)}
          </p>
        )}
      </div>
      <div className="mt-3 grid gap-3 sm:grid-cols-2 lg:grid-cols-3">
        {family.positions.map((p) => {
          const ps = survey.positions.find((x) => x.position === p.index);
          return (
            <fieldset key={p.index} className={`rounded-md border p-3 ${ps?.uneven ? 'border-crop bg-crop-soft' : 'border-steel-200'}`}>
              <legend className="px-1 text-sm font-semibold">
                Position {p.index}{' '}
                <span className="font-normal text-ink-muted">({p.zone === 'threshing' ? 'threshing' : 'separating'})</span>
                {ps?.uneven && <span className="ml-1 text-crop">· uneven</span>}
              </legend>
              <div className="grid grid-cols-2 gap-2">
                {cell(p.index, 'left', 'front')}
                {cell(p.index, 'right', 'front')}
                {cell(p.index, 'left', 'rear')}
                {cell(p.index, 'right', 'rear')}
              </div>
              {ps?.spreadMm !== null && ps?.spreadMm !== undefined && (
                <p className="mt-1 text-xs text-ink-muted">Spread {showLength(ps.spreadMm, units)}</p>
              )}
            </fieldset>
          );
        })}
      </div>
      <div className="mt-3" aria-live="polite">
        {survey.readingCount === 0 ? (
          <p className="text-sm text-ink-muted">No readings yet.</p>
        ) : survey.findings.length === 0 ? (
          <p className="text-sm font-semibold text-ok">
            Even within {showLength(survey.toleranceMm, units)} across {survey.readingCount} readings.
          </p>
        ) : (
          <>
            <p className="text-sm font-semibold text-crop">Uneven beyond {showLength(survey.toleranceMm, units)}:</p>
            <ul className="mt-1 list-disc pl-5 text-sm" data-testid="survey-findings">
              {survey.findings.map((f, i) => (
                <li key={i}>{describeSurveyFinding(f, units)}</li>
              ))}
            </ul>
          </>
        )}
      </div>
    </div>
  );
}
