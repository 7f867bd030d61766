/**
 * Optional hour-meter fields for the forms that read them (finishing an inspection, a loss
 * check): engine and separator hours, and a correction reason when a meter reads lower than
 * the last reading. Blank fields send no reading.
 */
import { useId } from 'react';

export interface HoursDraft {
  engine: string;
  separator: string;
  reason: string;
}

export const EMPTY_HOURS: HoursDraft = { engine: '', separator: '', reason: '' };

/** The reading to send, or undefined when both meters are left blank. */
export function hoursFromDraft(d: HoursDraft): { engineHours: number; separatorHours: number; correctionReason?: string } | undefined {
  if (!d.engine.trim() && !d.separator.trim()) return undefined;
  const num = (s: string) => (s.trim() === '' ? Number.NaN : Number(s));
  return {
    engineHours: num(d.engine),
    separatorHours: num(d.separator),
    ...(d.reason.trim() ? { correctionReason: d.reason.trim() } : {}),
  };
}

interface Props {
  value: HoursDraft;
  onChange: (next: HoursDraft) => void;
  /** The field a refusal named ('hours.engineHours', …) and its message (shown here unless empty). */
  error?: { field: string | null; message: string } | null;
  disabled?: boolean;
}

export function HoursFields({ value, onChange, error, disabled }: Props) {
  const id = useId();
  const bad = (f: string) => !!error && error.field === `hours.${f}`;
  const input = (key: keyof HoursDraft, field: string, label: string) => (
    <label className="block">
      <span className="field-label">{label}</span>
      <input
        className="field-input"
        type="number"
        inputMode="decimal"
        min={0}
        step={0.1}
        name={field}
        value={value[key]}
        disabled={disabled}
        aria-invalid={bad(field)}
        aria-describedby={bad(field) ? `${id}-err` : undefined}
        onChange={(e) => onChange({ ...value, [key]: e.target.value })}
      />
    </label>
  );
  return (
    <fieldset className="mt-3 rounded-md border border-steel-200 p-3" data-testid="hours-fields">
      <legend className="px-1 text-sm font-semibold">Hour meters (optional)</legend>
      <div className="grid gap-3 sm:grid-cols-2">
        {input('engine', 'engineHours', 'Engine hours')}
        {input('separator', 'separatorHours', 'Separator hours')}
        <label className="block sm:col-span-2">
          <span className="field-label">Correction reason (only when a meter reads lower than the last reading)</span>
          <input
            className="field-input"
            name="correctionReason"
            maxLength={500}
            value={value.reason}
            disabled={disabled}
            aria-invalid={bad('correctionReason')}
            onChange={(e) => onChange({ ...value, reason: e.target.value })}
          />
        </label>
      </div>
      {error?.field?.startsWith('hours.') && error.message && (
        <p id={`${id}-err`} role="alert" className="field-error">
          {error.message}
        </p>
      )}
    </fieldset>
  );
}
