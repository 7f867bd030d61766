import { afterEach, describe, expect, it, vi } from 'vitest';
import { afterPaint, beforeNextPaint } from '~/components/editor/after-paint';

/** A stand-in for the browser's frames: rAF callbacks run when `frame()` is called. */
function fakeFrames() {
  let queue: FrameRequestCallback[] = [];
  vi.stubGlobal('requestAnimationFrame', (cb: FrameRequestCallback) => (queue.push(cb), queue.length));
  vi.stubGlobal('cancelAnimationFrame', () => {});
  return {
    frame() {
      const run = queue;
      queue = [];
      for (const cb of run) cb(0);
    },
  };
}

describe('work deferred past the frame that shows an edit', () => {
  afterEach(() => {
    vi.unstubAllGlobals();
    vi.useRealTimers();
  });

  it('afterPaint runs after the next frame, in a task of its own, not before it', () => {
    vi.useFakeTimers();
    const frames = fakeFrames();
    const done: string[] = [];
    afterPaint(() => done.push('after'));
    vi.advanceTimersByTime(0);
    expect(done).toEqual([]); // no frame yet: nothing ran
    frames.frame();
    expect(done).toEqual([]); // the frame's own callbacks come first
    vi.advanceTimersByTime(0);
    expect(done).toEqual(['after']);
    vi.advanceTimersByTime(200);
    expect(done).toEqual(['after']); // once only (the fallback timer does not run it again)
  });

  it('a page without frames (hidden) still gets the work done, once', () => {
    vi.useFakeTimers();
    fakeFrames();
    const done: string[] = [];
    afterPaint(() => done.push('a'));
    beforeNextPaint(() => done.push('b'));
    vi.advanceTimersByTime(150);
    expect(done.sort()).toEqual(['a', 'b']);
  });

  it('beforeNextPaint runs in the frame; cancelled work never runs', () => {
    vi.useFakeTimers();
    const frames = fakeFrames();
    const done: string[] = [];
    beforeNextPaint(() => done.push('focus'));
    const cancel = afterPaint(() => done.push('cancelled'));
    cancel();
    frames.frame();
    expect(done).toEqual(['focus']);
    vi.advanceTimersByTime(200);
    expect(done).toEqual(['focus']);
  });
});
