/**
 * The presentation island. `audience`: the slide on the whole screen (Fullscreen API), moved by
 * keyboard or clicker, with a slide overview, the crop-path illustration and a blank screen.
 * `presenter`: the same deck in a second window with the talking points, the next slide and a
 * timer. The two windows stay on the same slide through a BroadcastChannel (deck-sync.ts).
 */
import { useCallback, useEffect, useMemo, useRef, useState } from 'react';
import { CageDiagram } from '~/components/cage/CageDiagram';
import { joinDeck, type DeckSync, type StageState } from './deck-sync';
import { commandForKey, KEY_HELP, keyBelongsToControl, type StageCommand } from './keys';
import { StageSlide } from './StageSlide';
import type { ShowProps } from './types';

interface Props extends ShowProps {
  mode: 'audience' | 'presenter';
  /** Where "Leave" goes (the deck's edit page, or the shared view). */
  exitHref: string;
  /** URL of the presenter's view, when this is the audience window. */
  presenterHref?: string;
}

function startIndex(count: number): number {
  const n = Number(globalThis.location?.hash.replace('#', ''));
  return Number.isInteger(n) && n >= 1 && n <= count ? n - 1 : 0;
}

export function Presenter(props: Props) {
  const { deckId, deckTitle, slides, families, catalogs, units, mode, exitHref, presenterHref } = props;
  const [state, setState] = useState<StageState>({ index: 0, cropPath: false, blank: false });
  const [overview, setOverview] = useState(false);
  const [help, setHelp] = useState(false);
  const [fullscreen, setFullscreen] = useState(false);
  const stage = useRef<HTMLDivElement>(null);
  const sync = useRef<DeckSync | null>(null);
  const latest = useRef(state);
  const count = slides.length;

  // Start on the slide named in the address (#3), then join the other window.
  useEffect(() => {
    const first = { ...latest.current, index: startIndex(count) };
    latest.current = first;
    setState(first);
    sync.current = joinDeck(
      deckId,
      (remote) => {
        const n = { ...remote, index: Math.min(Math.max(0, remote.index), count - 1) };
        latest.current = n;
        setState(n);
      },
      () => latest.current,
    );
    return () => sync.current?.close();
  }, [deckId, count]);

  /** A change made here: applied, written into the address, and told to the other window. */
  const change = useCallback((next: (s: StageState) => StageState) => {
    const s = latest.current;
    const n = next(s);
    if (n === s) return;
    latest.current = n;
    setState(n);
    sync.current?.post(n);
  }, []);

  useEffect(() => {
    if (count > 0) history.replaceState(null, '', `#${state.index + 1}`);
  }, [state.index, count]);

  useEffect(() => {
    const on = () => setFullscreen(!!document.fullscreenElement);
    document.addEventListener('fullscreenchange', on);
    return () => document.removeEventListener('fullscreenchange', on);
  }, []);

  const toggleFullscreen = useCallback(() => {
    if (document.fullscreenElement) void document.exitFullscreen();
    else void stage.current?.requestFullscreen?.().catch(() => {});
  }, []);

  const openPresenter = useCallback(() => {
    if (presenterHref)
      window.open(`${presenterHref}#${latest.current.index + 1}`, `cagewright-presenter-${deckId}`, 'popup,width=1280,height=800');
  }, [presenterHref, deckId]);

  const run = useCallback(
    (cmd: StageCommand) => {
      const go = (i: number) => change((s) => (i === s.index || i < 0 || i >= count ? s : { ...s, index: i, blank: false }));
      switch (cmd) {
        case 'next':
          return go(latest.current.index + 1);
        case 'prev':
          return go(latest.current.index - 1);
        case 'first':
          return go(0);
        case 'last':
          return go(count - 1);
        case 'overview':
          return setOverview((o) => !o);
        case 'close':
          setHelp(false);
          return setOverview(false);
        case 'crop-path':
          return change((s) => ({ ...s, cropPath: !s.cropPath, blank: false }));
        case 'blank':
          return change((s) => ({ ...s, blank: !s.blank }));
        case 'fullscreen':
          return mode === 'audience' ? toggleFullscreen() : undefined;
        case 'presenter':
          return mode === 'audience' ? openPresenter() : undefined;
      }
    },
    [change, count, mode, toggleFullscreen, openPresenter],
  );

  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      if (e.key === '?') {
        setHelp((h) => !h);
        return;
      }
      if (keyBelongsToControl(e.target, e.key)) return;
      const cmd = commandForKey(e);
      if (!cmd) return;
      // Escape leaves full screen by itself; let the browser have it then.
      if (cmd === 'close' && e.key === 'Escape' && document.fullscreenElement) return;
      e.preventDefault();
      run(cmd);
    };
    window.addEventListener('keydown', onKey);
    // Says the keys work now (hydration can finish before this effect runs); tests wait on it.
    document.documentElement.dataset.stageKeys = 'ready';
    return () => {
      window.removeEventListener('keydown', onKey);
      delete document.documentElement.dataset.stageKeys;
    };
  }, [run]);

  /** Buttons hand the keyboard back to the stage, so Space goes on moving slides. */
  const press = (cmd: StageCommand) => () => {
    run(cmd);
    stage.current?.focus();
  };

  const slide = slides[state.index];
  const next = slides[state.index + 1];

  if (count === 0) {
    return (
      <div className="p-10 text-[28px]">
        This deck has no slides yet. <a href={exitHref}>Back to the deck</a>
      </div>
    );
  }

  const bar = (
    <div className="flex shrink-0 flex-wrap items-center gap-2 border-b border-steel-200 bg-white px-6 py-2 text-lg">
      <span className="mr-auto font-semibold text-ink-soft">
        {deckTitle}
        {mode === 'presenter' && <span className="ml-2 rounded bg-iris-100 px-2 py-0.5 text-base text-iris-800">Presenter’s view</span>}
      </span>
      <span className="font-semibold tabular-nums" data-testid="slide-counter" aria-live="polite">
        Slide {state.index + 1} of {count}
      </span>
      <button type="button" className="btn text-base" onClick={press('prev')} disabled={state.index === 0} aria-label="Previous slide">
        ◀ Back
      </button>
      <button type="button" className="btn text-base" onClick={press('next')} disabled={state.index === count - 1} aria-label="Next slide">
        Next ▶
      </button>
      <button type="button" className="btn text-base" onClick={press('overview')} aria-pressed={overview}>
        Overview <kbd className="text-xs text-ink-muted">O</kbd>
      </button>
      <button type="button" className="btn text-base" onClick={press('crop-path')} aria-pressed={state.cropPath}>
        Crop path <kbd className="text-xs text-ink-muted">C</kbd>
      </button>
      {mode === 'audience' && (
        <>
          <button type="button" className="btn text-base" onClick={press('presenter')}>
            Presenter’s view <kbd className="text-xs text-ink-muted">P</kbd>
          </button>
          <button type="button" className="btn-primary text-base" onClick={press('fullscreen')} data-testid="fullscreen">
            {fullscreen ? 'Leave full screen' : 'Full screen'} <kbd className="text-xs opacity-80">F</kbd>
          </button>
        </>
      )}
      <button type="button" className="btn text-base" onClick={() => setHelp((h) => !h)} aria-expanded={help}>
        Keys <kbd className="text-xs text-ink-muted">?</kbd>
      </button>
      <a href={exitHref} className="btn text-base no-underline">
        Leave
      </a>
    </div>
  );

  return (
    <div
      ref={stage}
      tabIndex={-1}
      className="flex h-screen flex-col bg-steel-50 outline-none"
      data-testid={`stage-${mode}`}
      data-index={state.index}
    >
      {bar}
      <div className="relative min-h-0 flex-1">
        {/* Over the slide's corner, so opening it never pushes the drawing down. */}
        {help && <KeyHelp />}
        {mode === 'audience' ? (
          <main className="h-full px-10 py-6" id="main">
            <StageSlide slide={slide!} families={families} catalogs={catalogs} units={units} cropPath={state.cropPath} />
          </main>
        ) : (
          <PresenterPanel {...props} index={state.index} cropPath={state.cropPath} next={next} />
        )}
        {overview && (
          <Overview
            {...props}
            index={state.index}
            onPick={(i) => {
              change((s) => ({ ...s, index: i, blank: false }));
              setOverview(false);
              stage.current?.focus();
            }}
          />
        )}
        {state.blank && mode === 'audience' && (
          <div className="absolute inset-0 z-20 bg-black" data-testid="blank">
            <span className="sr-only">The screen is blank. Press B to show the slide again.</span>
          </div>
        )}
      </div>
      <div className="h-2 shrink-0 bg-steel-200" aria-hidden="true">
        <div className="h-full bg-iris-600 transition-[width]" style={{ width: `${((state.index + 1) / count) * 100}%` }} />
      </div>
    </div>
  );
}

function KeyHelp() {
  return (
    <div
      className="absolute right-4 top-4 z-30 max-w-2xl rounded-lg border border-steel-300 bg-white px-6 py-3 text-lg shadow-xl"
      role="note"
      aria-label="Keys"
      data-testid="key-help"
    >
      <ul className="grid grid-cols-1 gap-x-10 gap-y-1 sm:grid-cols-2">
        {KEY_HELP.map(([k, what]) => (
          <li key={k}>
            <kbd className="font-semibold">{k}</kbd> <span className="text-ink-muted">{what}</span>
          </li>
        ))}
      </ul>
    </div>
  );
}

function Overview({ slides, families, catalogs, units, index, onPick }: Props & { index: number; onPick: (i: number) => void }) {
  const current = useRef<HTMLButtonElement>(null);
  useEffect(() => current.current?.focus(), []);
  return (
    <section
      className="absolute inset-0 z-10 overflow-auto bg-steel-50 p-8"
      aria-label="Slide overview"
      data-testid="overview"
      tabIndex={0}
    >
      <h2 className="text-[36px] font-bold">All slides</h2>
      <ol className="mt-4 grid grid-cols-2 gap-6 lg:grid-cols-3 wall:grid-cols-4">
        {slides.map((s, i) => {
          const family = s.familyId ? families[s.familyId] : undefined;
          const catalog = s.familyId ? catalogs[s.familyId] : undefined;
          return (
            <li key={s.id}>
              <button
                ref={i === index ? current : undefined}
                type="button"
                onClick={() => onPick(i)}
                aria-current={i === index ? 'step' : undefined}
                className={`card block w-full text-left hover:border-iris-400 ${i === index ? 'border-iris-600 ring-4 ring-iris-300' : ''}`}
              >
                <span className="text-[22px] font-bold">
                  {i + 1}. {s.title}
                </span>
                {family && catalog && s.layout && (
                  <span className="mt-2 block" aria-hidden="true">
                    <CageDiagram family={family} layout={s.layout} catalog={catalog} findings={s.findings} units={units} compact />
                  </span>
                )}
              </button>
            </li>
          );
        })}
      </ol>
    </section>
  );
}

function PresenterPanel({
  slides,
  families,
  catalogs,
  units,
  index,
  cropPath,
  next,
}: Props & { index: number; cropPath: boolean; next: Props['slides'][number] | undefined }) {
  const slide = slides[index]!;
  const family = slide.familyId ? families[slide.familyId] : undefined;
  const catalog = slide.familyId ? catalogs[slide.familyId] : undefined;
  const [started] = useState(() => Date.now());
  const [now, setNow] = useState(() => Date.now());
  useEffect(() => {
    const t = setInterval(() => setNow(Date.now()), 1000);
    return () => clearInterval(t);
  }, []);
  const elapsed = Math.floor((now - started) / 1000);
  const clock = `${Math.floor(elapsed / 60)}:${String(elapsed % 60).padStart(2, '0')}`;
  const notes = useMemo(() => ({ __html: slide.notesHtml || '<p><em>No talking points on this slide.</em></p>' }), [slide.notesHtml]);
  return (
    <main id="main" className="grid h-full grid-cols-[3fr_2fr] gap-8 overflow-hidden px-8 py-6">
      <section className="min-h-0 overflow-auto" aria-label="Talking points" tabIndex={0}>
        <p className="text-xl text-ink-muted">Now showing{cropPath ? ' the crop path of' : ''}:</p>
        <h2 className="text-[40px] font-bold leading-tight" data-testid="presenter-title">
          {index + 1}. {slide.title}
        </h2>
        <div className="notes mt-4 text-[28px] leading-relaxed" data-testid="presenter-notes" dangerouslySetInnerHTML={notes} />
      </section>
      <aside className="min-h-0 space-y-6 overflow-auto" tabIndex={0} aria-label="Next slide and timer">
        <p className="text-[44px] font-bold tabular-nums" aria-label={`Time since the start: ${clock}`}>
          {clock}
        </p>
        {family && catalog && slide.layout && (
          <div className="card">
            <CageDiagram family={family} layout={slide.layout} catalog={catalog} findings={slide.findings} units={units} compact />
          </div>
        )}
        <div className="card">
          <p className="text-lg text-ink-muted">Next</p>
          <p className="text-[26px] font-semibold" data-testid="presenter-next">
            {next ? next.title : 'End of the deck'}
          </p>
        </div>
      </aside>
    </main>
  );
}

export default Presenter;
