/**
 * Work that should not delay the frame showing an edit: `afterPaint` runs a callback after the
 * next frame has been painted (a requestAnimationFrame callback runs just before that frame's
 * style, layout and paint; a task queued from it runs after them). `useAfterPaint` is a value
 * that follows its input one painted frame later, so what renders from it (figures computed
 * from the whole layout) is drawn after the part and its findings.
 *
 * Where there are no frames (a hidden tab, server rendering, tests without a window) the
 * callback still runs: a timer stands in for the frame.
 */
import { useEffect, useState } from 'react';

export function afterPaint(fn: () => void): () => void {
  let cancelled = false;
  const run = () => {
    if (cancelled) return;
    cancelled = true;
    fn();
  };
  if (typeof requestAnimationFrame !== 'function') {
    const t = setTimeout(run, 0);
    return () => {
      cancelled = true;
      clearTimeout(t);
    };
  }
  // A hidden page gets no frames: the timer makes sure the work is done anyway.
  const fallback = setTimeout(run, 100);
  const frame = requestAnimationFrame(() => setTimeout(run, 0));
  return () => {
    cancelled = true;
    clearTimeout(fallback);
    cancelAnimationFrame(frame);
  };
}

/**
 * Runs `fn` in the next frame, just before its style and layout (a requestAnimationFrame
 * callback), so work that forces style and layout (moving focus, scrolling into view) shares
 * them with the frame instead of forcing them once more before it.
 */
export function beforeNextPaint(fn: () => void): () => void {
  if (typeof requestAnimationFrame !== 'function') {
    const t = setTimeout(fn, 0);
    return () => clearTimeout(t);
  }
  let done = false;
  const run = () => {
    if (done) return;
    done = true;
    fn();
  };
  const fallback = setTimeout(run, 100);
  const frame = requestAnimationFrame(run);
  return () => {
    done = true;
    clearTimeout(fallback);
    cancelAnimationFrame(frame);
  };
}

/** `value`, one painted frame late (the first render has it at once). */
export function useAfterPaint<T>(value: T): T {
  const [shown, setShown] = useState(value);
  useEffect(() => {
    if (Object.is(shown, value)) return;
    return afterPaint(() => setShown(() => value));
  }, [value, shown]);
  return shown;
}
