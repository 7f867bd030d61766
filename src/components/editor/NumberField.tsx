/** A number input that keeps what the user types while they type and commits valid values. */
import { useState, type ReactNode } from 'react';

interface Props {
  id: string;
  label: ReactNode;
  value: number;
  /** How the value is shown when not being edited. */
  format: (n: number) => string;
  min: number;
  max: number;
  step: number;
  unit: string;
  disabled?: boolean;
  describedBy?: string;
  onCommit: (n: number) => void;
}

export function NumberField({ id, label, value, format, min, max, step, unit, disabled, describedBy, onCommit }: Props) {
  const [draft, setDraft] = useState<string | null>(null);
  const text = draft ?? format(value);
  const parsed = Number(text.replace(',', '.'));
  const invalid = draft !== null && (text.trim() === '' || !Number.isFinite(parsed) || parsed < min || parsed > max);
  return (
    <div>
      <label htmlFor={id} className="field-label">
        {label}
      </label>
      <div className="mt-1 flex items-center gap-2">
        <input
          id={id}
          type="number"
          inputMode="decimal"
          className="block w-28 rounded-md border-steel-300 py-1.5 text-base shadow-sm focus:border-iris-500 focus:ring-iris-500 aria-[invalid=true]:border-fit"
          value={text}
          min={min}
          max={max}
          step={step}
          disabled={disabled}
          aria-invalid={invalid || undefined}
          aria-describedby={[describedBy, invalid ? `${id}-error` : ''].filter(Boolean).join(' ') || undefined}
          onChange={(e) => {
            setDraft(e.target.value);
            const n = Number(e.target.value.replace(',', '.'));
            if (e.target.value.trim() !== '' && Number.isFinite(n) && n >= min && n <= max) onCommit(n);
          }}
          onBlur={() => setDraft(null)}
          onKeyDown={(e) => {
            if (e.key === 'Enter') setDraft(null);
          }}
        />
        <span className="text-sm text-ink-soft">{unit}</span>
      </div>
      {invalid && (
        <p id={`${id}-error`} className="field-error">
          Enter a number from {format(min)} to {format(max)}.
        </p>
      )}
    </div>
  );
}
