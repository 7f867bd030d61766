/**
 * Marks for an inspection line's severity, told apart by shape and words as well as colour:
 * a circle with a tick (serviceable), an eye (keep an eye on), a square with two arrows turning
 * round each other (replace). Shapes differ from the layout findings' marks on purpose.
 */
import { SEVERITY_TEXT, type InspectionSeverity } from '~/lib/domain/inspection';

export const SEVERITY_COLOUR: Record<InspectionSeverity, string> = {
  ok: '#2f6f4f',
  watch: '#a35200',
  replace: '#b3261e',
};

export function SeverityIcon({ severity, size = 18 }: { severity: InspectionSeverity; size?: number }) {
  const c = SEVERITY_COLOUR[severity];
  return (
    <svg width={size} height={size} viewBox="0 0 20 20" aria-hidden="true" focusable="false" className="inline-block shrink-0 align-[-3px]">
      {severity === 'ok' && (
        <>
          <circle cx="10" cy="10" r="9" fill={c} />
          <path d="M5.5 10.5l3 3 6-7" stroke="#fff" strokeWidth="2.2" fill="none" strokeLinecap="round" strokeLinejoin="round" />
        </>
      )}
      {severity === 'watch' && (
        <>
          <path d="M1 10C4 4.5 16 4.5 19 10 16 15.5 4 15.5 1 10z" fill={c} />
          <circle cx="10" cy="10" r="3.4" fill="#fff" />
          <circle cx="10" cy="10" r="1.6" fill={c} />
        </>
      )}
      {severity === 'replace' && (
        <>
          <rect x="1" y="1" width="18" height="18" rx="3" fill={c} />
          <path
            d="M5 8h9l-2.5-2.5M15 12H6l2.5 2.5"
            stroke="#fff"
            strokeWidth="2"
            fill="none"
            strokeLinecap="round"
            strokeLinejoin="round"
          />
        </>
      )}
    </svg>
  );
}

/** Icon and words together: what a list or a report shows for a line. */
export function SeverityMark({ severity, size = 18, count }: { severity: InspectionSeverity; size?: number; count?: number }) {
  return (
    <span className="inline-flex items-center gap-1 font-semibold" style={{ color: SEVERITY_COLOUR[severity] }}>
      <SeverityIcon severity={severity} size={size} />
      <span>
        {SEVERITY_TEXT[severity].label}
        {count !== undefined && <span className="text-ink">: {count}</span>}
      </span>
    </span>
  );
}
