/** One checklist line: its severity, what was found, bar wear, a note and photos. */
import { useId, useState, type ReactNode } from 'react';
import {
  assessWear,
  conditionsFor,
  SEVERITY_RANK,
  SEVERITY_TEXT,
  WEAR_REPLACE_MM,
  type ConditionId,
  type InspectionSeverity,
} from '~/lib/domain/inspection';
import type { UnitSystem } from '~/lib/domain/units';
import { PhotoStrip } from './PhotoStrip';
import { SeverityIcon, SeverityMark, SEVERITY_COLOUR } from './SeverityMark';
import type { LineView, PhotoView } from './types';
import { fromInput, showLength, toInput, unitLabel } from './units';

export interface LineChange {
  conditions?: ConditionId[];
  severity?: InspectionSeverity;
  measurements?: Record<string, number | null>;
  note?: string;
}

interface Props {
  inspectionId: string;
  line: LineView;
  suggested: InspectionSeverity;
  units: UnitSystem;
  editable: boolean;
  onChange: (change: LineChange, opts?: { typing?: boolean }) => void;
  onPhotos: (photos: PhotoView[]) => void;
  /** Extra content under the heading (the survey's readings). */
  children?: ReactNode;
}

const SEVERITIES: InspectionSeverity[] = ['ok', 'watch', 'replace'];

export function LineCard({ inspectionId, line, suggested, units, editable, onChange, onPhotos, children }: Props) {
  const id = useId();
  const conditions = conditionsFor(line.kind);
  const takesWear = line.kind === 'element' || line.kind === 'row';
  const [wearText, setWearText] = useState(toInput(line.measurements.wearMm, units));
  const [wearError, setWearError] = useState<string | null>(null);
  const wear = line.measurements.wearMm;
  const verdict = wear !== undefined ? assessWear(wear) : null;
  const limit = showLength(WEAR_REPLACE_MM, units);

  function commitWear(text: string) {
    const mm = fromInput(text, units);
    if (mm !== null && (!Number.isFinite(mm) || mm > 50)) {
      setWearError(`Give the depth as a number of ${units === 'imperial' ? 'inches' : 'millimetres'}, up to ${showLength(50, units)}.`);
      return;
    }
    setWearError(null);
    onChange({ measurements: { wearMm: mm } }, { typing: true });
  }

  const flagged = line.severity !== 'ok';
  return (
    <section
      aria-labelledby={`${id}-h`}
      className="card scroll-mt-24 border-l-4"
      style={{ borderLeftColor: flagged ? SEVERITY_COLOUR[line.severity] : undefined }}
      data-place={line.placeKey}
      data-testid="inspection-line"
    >
      <h3 id={`${id}-h`} className="text-lg font-semibold leading-snug">
        {line.label}
      </h3>
      {line.partNumber && <p className="text-sm text-ink-muted">Part number {line.partNumber}</p>}
      {children}

      {editable ? (
        <fieldset className="mt-3">
          <legend className="field-label">Verdict</legend>
          <div className="mt-1 grid grid-cols-3 gap-2">
            {SEVERITIES.map((s) => {
              const checked = line.severity === s;
              return (
                <label
                  key={s}
                  className="flex min-h-[52px] cursor-pointer flex-col items-center justify-center gap-0.5 rounded-md border-2 px-1 py-1 text-center text-sm font-semibold focus-within:outline focus-within:outline-[3px] focus-within:outline-offset-2 focus-within:outline-iris-500"
                  style={{
                    borderColor: checked ? SEVERITY_COLOUR[s] : '#d3dae2',
                    background: checked ? `${SEVERITY_COLOUR[s]}14` : '#fff',
                  }}
                >
                  <input
                    type="radio"
                    name={`${id}-sev`}
                    value={s}
                    checked={checked}
                    onChange={() => onChange({ severity: s })}
                    className="sr-only"
                  />
                  <SeverityIcon severity={s} size={20} />
                  <span>{SEVERITY_TEXT[s].label}</span>
                </label>
              );
            })}
          </div>
          {SEVERITY_RANK[suggested] > SEVERITY_RANK[line.severity] && (
            <p className="mt-2 flex flex-wrap items-center gap-2 text-sm">
              <span>
                What you recorded suggests <SeverityMark severity={suggested} size={16} />.
              </span>
              <button type="button" className="btn min-h-[40px]" onClick={() => onChange({ severity: suggested })}>
                Mark “{SEVERITY_TEXT[suggested].label}”
              </button>
            </p>
          )}
        </fieldset>
      ) : (
        <p className="mt-2">
          <SeverityMark severity={line.severity} />
        </p>
      )}

      {conditions.length > 0 &&
        (editable ? (
          <fieldset className="mt-3">
            <legend className="field-label">What you found</legend>
            <div className="mt-1 grid gap-2 sm:grid-cols-2">
              {conditions.map((c) => {
                const on = line.conditions.includes(c.id);
                return (
                  <label
                    key={c.id}
                    className={`flex min-h-[48px] cursor-pointer items-start gap-3 rounded-md border px-3 py-2 focus-within:outline focus-within:outline-[3px] focus-within:outline-offset-2 focus-within:outline-iris-500 ${on ? 'border-iris-500 bg-iris-50' : 'border-steel-300 bg-white'}`}
                  >
                    <input
                      type="checkbox"
                      checked={on}
                      onChange={(e) =>
                        onChange({
                          conditions: e.currentTarget.checked ? [...line.conditions, c.id] : line.conditions.filter((x) => x !== c.id),
                        })
                      }
                      className="mt-1 h-5 w-5 rounded border-steel-400 text-iris-700 focus:ring-iris-500"
                    />
                    <span>
                      <span className="block font-semibold">{c.label}</span>
                      <span className="block text-sm text-ink-muted">{c.hint}</span>
                    </span>
                  </label>
                );
              })}
            </div>
          </fieldset>
        ) : line.conditions.length > 0 ? (
          <p className="mt-2 text-sm">
            <span className="font-semibold">Found: </span>
            {line.conditions.map((c) => conditions.find((x) => x.id === c)?.label ?? c).join(', ')}
          </p>
        ) : null)}

      {takesWear && (
        <div className="mt-3">
          {editable ? (
            <>
              <label htmlFor={`${id}-wear`} className="field-label">
                Bar wear under a straight edge ({unitLabel(units)})
              </label>
              <input
                id={`${id}-wear`}
                type="text"
                inputMode="decimal"
                autoComplete="off"
                className="field-input max-w-[12rem] min-h-[48px]"
                value={wearText}
                aria-describedby={`${id}-wear-hint`}
                aria-invalid={wearError ? true : undefined}
                onChange={(e) => {
                  setWearText(e.currentTarget.value);
                  commitWear(e.currentTarget.value);
                }}
              />
              {wearError && <p className="field-error">{wearError}</p>}
            </>
          ) : wear !== undefined ? (
            <p className="text-sm">
              <span className="font-semibold">Bar wear:</span> {showLength(wear, units)}
            </p>
          ) : null}
          <p id={`${id}-wear-hint`} className="mt-1 text-sm text-ink-muted">
            {verdict
              ? verdict.verdict === 'replace'
                ? `Past the replacement point of about ${limit}.`
                : `${showLength(Math.max(0, verdict.remainingMm), units)} left before the replacement point of about ${limit}.`
              : editable
                ? `Lay a straight edge across the bars and measure the deepest gap. Replace past about ${limit}.`
                : ''}
          </p>
        </div>
      )}

      <div className="mt-3">
        {editable ? (
          <>
            <label htmlFor={`${id}-note`} className="field-label">
              Note
            </label>
            <textarea
              id={`${id}-note`}
              rows={2}
              maxLength={2000}
              className="field-input"
              defaultValue={line.note}
              onChange={(e) => onChange({ note: e.currentTarget.value }, { typing: true })}
            />
          </>
        ) : (
          line.note && <p className="text-sm">{line.note}</p>
        )}
      </div>

      <PhotoStrip
        inspectionId={inspectionId}
        itemId={line.id}
        label={line.label}
        photos={line.photos}
        editable={editable}
        onChange={onPhotos}
      />
    </section>
  );
}
