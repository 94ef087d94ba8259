/**
 * The one retry schedule of Tautline: an exponential step (base × 2^(failures − 1), at most the
 * cap) of which a share is left to chance, so many clients that failed together do not come back
 * together. `jitter` 1 is "full jitter" (anywhere from zero to the step: the tablet's sync, where
 * many tablets regain signal at once), 0.5 keeps at least half the step (the e-mail outbox, which
 * must never be due again at once), 0 is the plain doubling step (the lone dispatcher process).
 * Pure and shared by the tablet and the server; callers keep the failure count and the timer.
 */
export interface BackoffOptions {
  /** The first step, in ms. */
  baseMs: number;
  /** No step is longer than this, in ms. */
  capMs: number;
  /** The share of the step left to chance, 0 to 1 (default 1, full jitter). */
  jitter?: number;
  /** A number in [0, 1); Math.random unless a test fixes it. */
  random?: () => number;
}

/** How long to wait after the given number of failures in a row (1 after the first failure). */
export function backoffDelayMs(failures: number, options: BackoffOptions): number {
  const { baseMs, capMs, jitter = 1, random = Math.random } = options;
  if (!(jitter >= 0 && jitter <= 1)) throw new RangeError(`jitter must be between 0 and 1, got ${jitter}`);
  const step = Math.min(capMs, baseMs * 2 ** Math.max(0, failures - 1));
  return Math.floor(step * (1 - jitter) + random() * step * jitter);
}
