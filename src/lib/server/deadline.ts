/**
 * Time limits for talking to services outside the process (object store, mail server). A
 * service that accepts a connection and never answers must cost a request seconds, not minutes,
 * and never hold the store: callers talk to services outside database transactions, and every
 * call ends by its deadline.
 */

/** A service did not answer in time, or could not be reached. `service` names it for the log. */
export class ServiceUnavailableError extends Error {
  constructor(
    readonly service: 'object store' | 'mail server',
    message: string,
    readonly timedOut: boolean,
    options?: { cause?: unknown },
  ) {
    super(message, options);
  }
}

/** A whole number of milliseconds from the environment, or the fallback (bad values ignored). */
export function envMs(name: string, fallback: number, env: NodeJS.ProcessEnv = process.env): number {
  const raw = env[name];
  if (raw === undefined || raw.trim() === '') return fallback;
  const n = Number(raw);
  return Number.isFinite(n) && n > 0 ? Math.round(n) : fallback;
}

/**
 * Runs `work` with an AbortSignal that fires after `ms`, and gives up at the deadline even if
 * `work` ignores the signal. The timer is cleared when `work` settles, so nothing started after
 * (a response body being read) is cut off by it.
 */
export async function withDeadline<T>(ms: number, onTimeout: () => Error, work: (signal: AbortSignal) => Promise<T>): Promise<T> {
  const controller = new AbortController();
  let timer: NodeJS.Timeout | undefined;
  const expired = new Promise<never>((_, reject) => {
    timer = setTimeout(() => {
      const err = onTimeout();
      reject(err); // first, so the deadline's error wins over whatever the abort makes `work` throw
      controller.abort(err);
    }, ms);
  });
  const running = work(controller.signal);
  running.catch(() => {}); // after the deadline its own failure is no longer anyone's business
  try {
    return await Promise.race([running, expired]);
  } finally {
    clearTimeout(timer);
  }
}
