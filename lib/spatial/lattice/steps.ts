/**
 * Progress and cancellation for the square-count tests. Each statistic's permutation loop is written once,
 * as a generator that yields the fraction of its work done at most PROGRESS_STEPS times (so at a bounded
 * rate however many permutations or squares); `runSteps` drives it to the end in one go (the plain
 * functions: moranI, localMoran, …), `runStepsAsync` gives the event loop a turn between steps, so that a
 * run in the app's process can write its progress and notice a cancellation between them.
 */

/** A computation that yields its progress (0..1) and returns its result. */
export type Steps<T> = Generator<number, T, void>;

/** The most progress reports one statistic makes. */
export const PROGRESS_STEPS = 100;

/** How many units of work (permutations, squares) pass between two reports. */
export function stepEvery(total: number): number {
  return Math.max(1, Math.ceil(total / PROGRESS_STEPS));
}

export interface StepOptions {
  /** Hears the fraction done, 0..1, at most PROGRESS_STEPS times per statistic. */
  onProgress?: (fraction: number) => void;
}

export function runSteps<T>(steps: Steps<T>, onProgress?: (fraction: number) => void): T {
  for (;;) {
    const r = steps.next();
    if (r.done) return r.value;
    onProgress?.(r.value);
  }
}

export interface AsyncStepOptions extends StepOptions {
  /** Stops the work at the next step with an AbortError. */
  signal?: AbortSignal;
}

/**
 * Drives the steps, giving the event loop a turn at most every `breatheMs` (20 ms): progress writes and
 * cancellations go through while a long test runs on this thread.
 */
export async function runStepsAsync<T>(steps: Steps<T>, options: AsyncStepOptions = {}, breatheMs = 20): Promise<T> {
  let last = Date.now();
  for (;;) {
    if (options.signal?.aborted) throw new DOMException("The square-count test was cancelled.", "AbortError");
    const r = steps.next();
    if (r.done) return r.value;
    options.onProgress?.(r.value);
    if (Date.now() - last >= breatheMs) {
      await new Promise<void>((resolve) => setImmediate(resolve));
      last = Date.now();
    }
  }
}
