/**
 * What the rules say about the layout, most serious first. Choosing a finding highlights its
 * places in the drawing and moves focus to the first of them.
 */
import { countBySeverity } from '../../lib/domain/rules';
import type { Severity } from '../../lib/domain/schemas';
import { SeverityBadge } from '../cage/SeverityIcon';
import { SEVERITY_STYLE } from '../cage/palette';
import { placeWords } from '../cage/words';
import { useEditor, useEditorStoreApi } from './store/context';

const ORDER: Severity[] = ['blocks-fit', 'hurts-crop', 'advice'];

export function FindingsList() {
  const store = useEditorStoreApi();
  const findings = useEditor((s) => s.findings);
  const active = useEditor((s) => s.activeFinding);
  const counts = countBySeverity(findings);

  return (
    <section aria-labelledby="findings-h" className="rounded-lg [contain:layout_paint] border border-steel-200 bg-white p-3 shadow-sm" data-testid="findings">
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
          {findings.map((f, i) => {
            const st = SEVERITY_STYLE[f.severity];
            const chosen = active === i;
            return (
              <li key={`${f.code}-${i}`}>
                <button
                  type="button"
                  onClick={() => store.getState().chooseFinding(chosen ? null : i)}
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
          })}
        </ol>
      )}
    </section>
  );
}
