/**
 * The key to the cage diagram: element patterns with their names, the severity marks, and the
 * rotor-bar shapes. Plain HTML with tiny SVG swatches; renders on the server like the diagram.
 */
import { useId } from 'react';
import { STEEL } from './palette';
import { ElementSwatch } from './patterns';
import { SeverityBadge } from './SeverityIcon';
import { SEVERITY_STYLE } from './palette';
import type { Severity } from '~/lib/domain/schemas';
import { ELEMENT_TYPES, elementTypeLabel } from '~/lib/domain/vocabulary';

const SEVERITIES: Severity[] = ['blocks-fit', 'hurts-crop', 'advice'];
const OUTLINE_WORDS: Record<Severity, string> = {
  'blocks-fit': 'solid outline',
  'hurts-crop': 'dashed outline',
  advice: 'dotted outline',
};

export function CageLegend({ className }: { className?: string }) {
  const prefix = 'lg' + useId().replace(/[^A-Za-z0-9_-]/g, '');
  return (
    <div className={className} data-testid="cage-legend">
      <h3 className="text-sm font-semibold text-ink-soft">Key to the drawing</h3>
      <ul className="mt-2 flex flex-wrap gap-x-4 gap-y-2 text-sm">
        {ELEMENT_TYPES.map((t) => (
          <li key={t} className="flex items-center gap-1.5">
            <ElementSwatch type={t} prefix={`${prefix}-${t}`} width={34} height={20} />
            {elementTypeLabel(t)}
          </li>
        ))}
      </ul>
      <ul className="mt-2 flex flex-wrap gap-x-4 gap-y-2 text-sm">
        {SEVERITIES.map((s) => (
          <li key={s} className="flex items-center gap-1.5">
            <svg width={26} height={18} aria-hidden="true" focusable="false">
              <rect
                x={2}
                y={2}
                width={22}
                height={14}
                rx={3}
                fill="none"
                stroke={SEVERITY_STYLE[s].colour}
                strokeWidth={2.5}
                strokeDasharray={SEVERITY_STYLE[s].dash}
              />
            </svg>
            <SeverityBadge severity={s} />
            <span>
              <strong>{SEVERITY_STYLE[s].words}</strong> <span className="text-ink-muted">({OUTLINE_WORDS[s]})</span>
            </span>
          </li>
        ))}
        <li className="flex items-center gap-1.5">
          <svg width={26} height={18} aria-hidden="true" focusable="false">
            <rect x={4} y={2} width={4} height={6} rx={1} fill={STEEL[600]} />
            <rect x={4} y={10} width={4} height={6} rx={1} fill={STEEL[600]} />
          </svg>
          two rasp bars in line
        </li>
      </ul>
    </div>
  );
}
