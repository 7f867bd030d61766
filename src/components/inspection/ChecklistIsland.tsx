/**
 * The inspection checklist on a phone or a desktop: every line with its verdict, findings,
 * measurements, note and photos, saved as you go; finishing sends the lines marked "replace" to
 * a draft parts request.
 */
import { formatMoney } from '~/components/parts/money';
import { formatDate } from '~/lib/domain/format';
import { useCallback, useEffect, useMemo, useRef, useState } from 'react';
import {
  countSeverities,
  suggestSeverity,
  surveyFromMeasurements,
  type ChecklistKind,
  type ReplacementLine,
} from '~/lib/domain/inspection';
import type { UnitSystem } from '~/lib/domain/units';
import { ApiError, sendJson } from '~/components/shared/api';
import { EMPTY_HOURS, HoursFields, hoursFromDraft, type HoursDraft } from '~/components/wear/HoursFields';
import { LineCard, type LineChange } from './LineCard';
import { SeverityMark } from './SeverityMark';
import { SurveyReadings } from './SurveyReadings';
import type { InspectionView, LineView, PhotoView } from './types';

interface Props {
  initial: InspectionView;
  units: UnitSystem;
  canEdit: boolean;
}

type Pending = { id: string } & LineChange;

const SECTIONS: { kind: ChecklistKind; title: string }[] = [
  { kind: 'element', title: 'Concaves, grates and elements' },
  { kind: 'cover', title: 'Cover plates' },
  { kind: 'row', title: 'Rotor bars' },
  { kind: 'survey', title: 'Clearance survey' },
];

export default function ChecklistIsland({ initial, units, canEdit }: Props) {
  const [insp, setInsp] = useState(initial);
  const money = (cents: number) => formatMoney(cents, insp.currency);
  const [saveState, setSaveState] = useState<'idle' | 'saving' | 'saved' | 'error'>('idle');
  const [saveError, setSaveError] = useState<string | null>(null);
  const [confirming, setConfirming] = useState(false);
  const [finishError, setFinishError] = useState<string | null>(null);
  const [finishField, setFinishField] = useState<string | null>(null);
  const [hours, setHours] = useState<HoursDraft>(EMPTY_HOURS);
  const [finishing, setFinishing] = useState(false);
  /** The survey is uneven but marked serviceable: finishing asks for a conscious choice. */
  const [acceptUneven, setAcceptUneven] = useState(false);
  const [serverSaysUneven, setServerSaysUneven] = useState(false);
  const pending = useRef(new Map<string, Pending>());
  const timer = useRef<ReturnType<typeof setTimeout> | null>(null);
  const chain = useRef<Promise<void>>(Promise.resolve());
  const editable = canEdit && insp.status === 'open';
  const justFinished = useRef(false);

  // Once finished, take the person to the outcome at the top (the finish button is gone).
  useEffect(() => {
    if (insp.status === 'finished' && justFinished.current) {
      justFinished.current = false;
      const h = document.getElementById('finished-h');
      h?.focus();
      h?.scrollIntoView({ block: 'center' });
    }
  }, [insp.status]);

  const flush = useCallback(() => {
    if (timer.current) clearTimeout(timer.current);
    timer.current = null;
    if (pending.current.size === 0) return chain.current;
    const items = [...pending.current.values()];
    pending.current.clear();
    setSaveState('saving');
    chain.current = chain.current.then(async () => {
      try {
        await sendJson('PATCH', `/api/inspections/${insp.id}`, { items });
        setSaveError(null);
        setSaveState(pending.current.size ? 'saving' : 'saved');
      } catch (err) {
        setSaveState('error');
        setSaveError(
          err instanceof ApiError
            ? err.message
            : 'Not saved: the connection dropped. Your entries stay on this page; change anything to try again.',
        );
        // Keep what failed so the next change sends it again.
        for (const it of items) if (!pending.current.has(it.id)) pending.current.set(it.id, it);
      }
    });
    return chain.current;
  }, [insp.id]);

  // Send what is waiting before the page goes away.
  useEffect(() => {
    const away = () => {
      if (pending.current.size) void flush();
    };
    window.addEventListener('pagehide', away);
    return () => window.removeEventListener('pagehide', away);
  }, [flush]);

  function change(line: LineView, c: LineChange, opts: { typing?: boolean } = {}) {
    setInsp((cur) => ({
      ...cur,
      items: cur.items.map((l) => {
        if (l.id !== line.id) return l;
        const measurements = { ...l.measurements };
        for (const [k, v] of Object.entries(c.measurements ?? {})) {
          if (v === null) delete measurements[k];
          else measurements[k] = v;
        }
        return {
          ...l,
          ...(c.conditions ? { conditions: c.conditions } : {}),
          ...(c.severity ? { severity: c.severity } : {}),
          ...(c.note !== undefined ? { note: c.note } : {}),
          measurements,
        };
      }),
    }));
    const prev = pending.current.get(line.id) ?? { id: line.id };
    pending.current.set(line.id, {
      ...prev,
      ...c,
      measurements: c.measurements || prev.measurements ? { ...prev.measurements, ...c.measurements } : undefined,
    });
    if (timer.current) clearTimeout(timer.current);
    timer.current = setTimeout(() => void flush(), opts.typing ? 700 : 0);
  }

  function photos(line: LineView, list: PhotoView[]) {
    setInsp((cur) => ({ ...cur, items: cur.items.map((l) => (l.id === line.id ? { ...l, photos: list } : l)) }));
  }

  const counts = useMemo(() => countSeverities(insp.items.filter((l) => l.kind !== 'survey')), [insp.items]);
  const photoCount = insp.items.reduce((n, l) => n + l.photos.length, 0);
  const toReplace = insp.items.filter((l) => l.severity === 'replace' && l.kind !== 'survey');
  const surveyLine = insp.items.find((l) => l.kind === 'survey');
  const surveyDisagrees =
    serverSaysUneven ||
    (!!surveyLine && surveyLine.severity === 'ok' && surveyFromMeasurements(insp.family, surveyLine.measurements).uneven);

  async function finish() {
    setFinishing(true);
    setFinishError(null);
    setFinishField(null);
    try {
      await flush();
      if (pending.current.size) throw new ApiError(saveError ?? 'Some entries are not saved yet.', 0);
      const done = await sendJson<InspectionView & { added: ReplacementLine[] }>('POST', `/api/inspections/${insp.id}`, {
        action: 'finish',
        ...(surveyDisagrees && acceptUneven ? { acceptUnevenSurvey: true } : {}),
        ...(hoursFromDraft(hours) ? { hours: hoursFromDraft(hours) } : {}),
      });
      setInsp((cur) => ({ ...cur, status: 'finished', finishedAt: String(done.finishedAt), partsRequest: done.partsRequest }));
      setConfirming(false);
      justFinished.current = true;
    } catch (err) {
      if (err instanceof ApiError && err.field === 'acceptUnevenSurvey') setServerSaysUneven(true);
      setFinishField(err instanceof ApiError ? (err.field ?? null) : null);
      setFinishError(err instanceof ApiError ? err.message : 'The inspection could not be finished. Check the connection and try again.');
    } finally {
      setFinishing(false);
    }
  }

  return (
    <div>
      <div className="sticky top-0 z-10 -mx-4 mb-4 border-b border-steel-200 bg-steel-50/95 px-4 py-2 backdrop-blur">
        <div className="flex flex-wrap items-center gap-x-4 gap-y-1 text-sm">
          <span data-testid="counts" className="inline-flex flex-wrap items-center gap-x-2">
            <span>{counts.total} lines</span>
            <SeverityMark severity="replace" size={15} count={counts.replace} />
            <SeverityMark severity="watch" size={15} count={counts.watch} />
            <span>
              {photoCount} {photoCount === 1 ? 'photo' : 'photos'}
            </span>
          </span>
          <span aria-live="polite" className="ml-auto text-ink-muted" data-testid="save-state">
            {saveState === 'saving' ? 'Saving…' : saveState === 'saved' ? 'All changes saved' : saveState === 'error' ? 'Not saved' : ''}
          </span>
        </div>
        {saveError && (
          <p role="alert" className="field-error">
            {saveError}
          </p>
        )}
      </div>

      {insp.status === 'finished' && (
        <section aria-labelledby="finished-h" className="card mb-6 border-ok">
          <h2 id="finished-h" tabIndex={-1} className="text-lg font-semibold">
            Inspection finished{insp.finishedAt ? ` ${formatDate(insp.finishedAt)}` : ''}
          </h2>
          {insp.partsRequest ? (
            <>
              <p className="mt-1">
                The replacements went on a <a href={`/parts-requests/${insp.partsRequest.id}`}>draft parts request</a> (
                {insp.partsRequest.status}):
              </p>
              <ul className="mt-2 space-y-1" data-testid="replacements">
                {insp.partsRequest.added.map((l) => (
                  <li key={l.partNumber} className="text-sm">
                    <span className="font-semibold">
                      {l.quantity} × {l.partNumber}
                    </span>{' '}
                    — {l.description} · {money(l.unitPriceCents * l.quantity)}
                  </li>
                ))}
              </ul>
            </>
          ) : (
            <p className="mt-1">Nothing was marked for replacement, so no parts were requested.</p>
          )}
          <p className="mt-3">
            <a className="btn-primary min-h-[48px] px-4 text-base no-underline" href={`/inspections/${insp.id}/report`}>
              Open the printable report
            </a>
          </p>
        </section>
      )}

      {SECTIONS.map(({ kind, title }) => {
        const lines = insp.items.filter((l) => l.kind === kind);
        if (lines.length === 0) return null;
        return (
          <section key={kind} aria-labelledby={`sec-${kind}`} className="mb-8">
            <h2 id={`sec-${kind}`} className="mb-3">
              {title} <span className="text-base font-normal text-ink-muted">({lines.length})</span>
            </h2>
            <div className="space-y-4">
              {lines.map((line) => (
                <LineCard
                  key={line.id}
                  inspectionId={insp.id}
                  line={line}
                  suggested={suggestSeverity(line.kind, line.conditions, line.measurements, insp.family)}
                  units={units}
                  editable={editable}
                  onChange={(c, o) => change(line, c, o)}
                  onPhotos={(list) => photos(line, list)}
                >
                  {kind === 'survey' && (
                    <SurveyReadings
                      family={insp.family}
                      measurements={line.measurements}
                      units={units}
                      editable={editable}
                      onChange={(m) => change(line, { measurements: m }, { typing: true })}
                    />
                  )}
                </LineCard>
              ))}
            </div>
          </section>
        );
      })}

      {editable && (
        <section aria-labelledby="finish-h" className="card mb-10">
          <h2 id="finish-h" className="text-lg font-semibold">
            Finish the inspection
          </h2>
          {!confirming ? (
            <>
              <p className="mt-1 text-sm text-ink-muted">
                {toReplace.length === 0
                  ? 'Nothing is marked for replacement yet.'
                  : `${toReplace.length} ${toReplace.length === 1 ? 'line is' : 'lines are'} marked for replacement; finishing puts their parts on a draft parts request.`}
              </p>
              <button type="button" className="btn-primary mt-3 min-h-[52px] px-5 text-base" onClick={() => setConfirming(true)}>
                Finish inspection…
              </button>
            </>
          ) : (
            <div className="mt-2" role="group" aria-labelledby="finish-h">
              {toReplace.length > 0 ? (
                <>
                  <p>These parts go on a draft parts request for {insp.machine.nickname}:</p>
                  <ul className="mt-1 list-disc pl-5 text-sm">
                    {toReplace.map((l) => (
                      <li key={l.id}>
                        {l.label}
                        {l.partNumber ? ` — ${l.partNumber}` : ''}
                      </li>
                    ))}
                  </ul>
                </>
              ) : (
                <p>No parts will be requested.</p>
              )}
              {surveyDisagrees && (
                <div className="caution mt-3" data-testid="survey-disagrees">
                  <p className="font-semibold">The clearance survey finds an uneven clearance, but its verdict is “serviceable”.</p>
                  <p className="mt-1">
                    Mark the survey to watch or replace, or confirm that the machine goes out with the clearance as measured. The report
                    shows both the readings and your verdict.
                  </p>
                  <label className="mt-2 flex items-start gap-2">
                    <input
                      type="checkbox"
                      className="mt-1 h-5 w-5"
                      checked={acceptUneven}
                      onChange={(e) => setAcceptUneven(e.target.checked)}
                    />
                    <span>Finish with the survey marked serviceable although the clearance is uneven</span>
                  </label>
                </div>
              )}
              <HoursFields
                value={hours}
                onChange={setHours}
                disabled={finishing}
                error={finishError ? { field: finishField, message: finishError } : null}
              />
              <p className="mt-2 text-sm">After finishing, the checklist and its photos can no longer be changed.</p>
              <div className="mt-3 flex flex-wrap gap-3">
                <button
                  type="button"
                  className="btn-primary min-h-[52px] px-5 text-base"
                  onClick={() => void finish()}
                  disabled={finishing || (surveyDisagrees && !acceptUneven)}
                >
                  {finishing ? 'Finishing…' : toReplace.length ? 'Finish and request the parts' : 'Finish'}
                </button>
                <button type="button" className="btn min-h-[52px] px-5 text-base" onClick={() => setConfirming(false)} disabled={finishing}>
                  Keep working
                </button>
              </div>
            </div>
          )}
          {finishError && (
            <p role="alert" className="field-error">
              {finishError}
            </p>
          )}
        </section>
      )}
    </div>
  );
}
