/**
 * What the rules say about the layout, most serious first. Choosing a finding highlights its
 * places in the drawing and moves focus to the first of them.
 */
import { memo, useMemo } from 'react';
import { placeKey } from '~/lib/domain/places';
import { countBySeverity } from '~/lib/domain/rules';
import type { Finding, Severity } from '~/lib/domain/schemas';
import { SeverityBadge } from '~/components/cage/SeverityIcon';
import { SEVERITY_STYLE } from '~/components/cage/palette';
import { placeWords } from '~/lib/domain/vocabulary';
import { findingInUnits } from '~/lib/domain/units';
import { useEditor, useEditorStoreApi } from './store/context';

const ORDER: Severity[] = ['blocks-fit', 'hurts-crop', 'advice'];

/**
 * A key that stays with a finding while the list changes around it (code and places), so an
 * edit that adds a finding at the top does not rebuild every row under it.
 */
export function findingKeys(findings: readonly Finding[]): string[] {
  const seen = new Map<string, number>();
  return findings.map((f) => {
    const base = `${f.code}@${f.places.map(placeKey).join(',')}`;
    const n = seen.get(base) ?? 0;
    seen.set(base, n + 1);
    return n ? `${base}#${n}` : base;
  });
}

/** Same words, same places: the row shows the same thing (the rules build new objects each run). */
const sameFinding = (a: Finding, b: Finding) =>
  a === b ||
  (a.code === b.code &&
    a.severity === b.severity &&
    a.title === b.title &&
    a.explanation === b.explanation &&
    a.fix === b.fix &&
    a.places.length === b.places.length &&
    a.places.every((p, i) => placeKey(p) === placeKey(b.places[i]!)));

interface RowProps {
  finding: Finding;
  index: number;
  chosen: boolean;
  onChoose: (index: number | null) => void;
}

const FindingRow = memo(
  function FindingRow({ finding: f, index, chosen, onChoose }: RowProps) {
    const st = SEVERITY_STYLE[f.severity];
    return (
      <li>
        <button
          type="button"
          onClick={() => onChoose(chosen ? null : index)}
          aria-pressed={chosen}
          data-code={f.code}
          className={`w-full rounded-md border-l-4 px-2 py-1.5 text-left text-sm hover:bg-steel-50 ${chosen ? 'bg-iris-50 ring-2 ring-iris-500' : 'bg-white'}`}
          style={{ borderLeftColor: st.colour }}
        >
          <span className="flex items-start gap-1.5">
            <SeverityBadge severity={f.severity} size={16} className="mt-0.5 shrink-0" />
            <span className="min-w-0">
              <span className="block font-semibold text-ink">
                <span className="sr-only">{st.words}: </span>
                {f.title.charAt(0).toUpperCase() + f.title.slice(1)}
              </span>
              <span className="block text-xs" style={{ color: st.colour }}>
                {st.words} · {f.places.map(placeWords).join('; ')}
              </span>
              {chosen && (
                <>
                  <span className="mt-1 block text-ink-soft">{f.explanation}</span>
                  <span className="mt-1 block text-ink">
                    <strong>Fix:</strong> {f.fix}
                  </span>
                </>
              )}
            </span>
          </span>
        </button>
      </li>
    );
  },
  (a, b) => a.index === b.index && a.chosen === b.chosen && a.onChoose === b.onChoose && sameFinding(a.finding, b.finding),
);

export function FindingsList() {
  const store = useEditorStoreApi();
  const found = useEditor((s) => s.findings);
  const units = useEditor((s) => s.units);
  // The rules write millimetres and kilograms; the list speaks the reader's units.
  const findings = useMemo(() => found.map((f) => findingInUnits(f, units)), [found, units]);
  const active = useEditor((s) => s.activeFinding);
  const choose = store.getState().chooseFinding;
  const counts = countBySeverity(findings);
  const keys = findingKeys(findings);

  return (
    <section
      aria-labelledby="findings-h"
      className="rounded-lg [contain:layout_paint] border border-steel-200 bg-white p-3 shadow-sm"
      data-testid="findings"
    >
      <h2 id="findings-h" className="text-base font-semibold">
        Findings <span className="font-normal text-ink-muted">({findings.length})</span>
      </h2>
      <p className="mt-1 flex flex-wrap gap-x-3 gap-y-1 text-xs text-ink-soft" data-testid="findings-counts">
        {ORDER.map((s) => (
          <span key={s} className="inline-flex items-center gap-1">
            <SeverityBadge severity={s} size={13} />
            {counts[s]} {SEVERITY_STYLE[s].words.toLowerCase()}
          </span>
        ))}
      </p>
      {findings.length === 0 ? (
        <p className="mt-3 flex items-center gap-2 rounded-md bg-ok-soft p-2 text-sm font-semibold text-ok">
          <span aria-hidden="true">✓</span> Everything fits, and nothing works against this crop.
        </p>
      ) : (
        <ol className="mt-2 flex flex-col gap-1.5">
          {findings.map((f, i) => (
            <FindingRow key={keys[i]} finding={f} index={i} chosen={active === i} onChoose={choose} />
          ))}
        </ol>
      )}
    </section>
  );
}
