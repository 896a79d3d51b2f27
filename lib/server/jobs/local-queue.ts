/**
 * The in-process run queue used with the embedded database: only the app process may open PGlite, so it
 * runs every job itself, one (or `concurrency`) at a time, each with an AbortController so a cancel stops
 * the simulations in the worker threads at once. Jobs are run ids; the work function is passed in.
 * A submitter may hand over what it already holds for the run (`hint`); it reaches the work function
 * only when the run starts at once, never after waiting behind others, when it would be out of date.
 */
export type RunWork<H = unknown> = (runId: string, signal: AbortSignal, hint?: H) => Promise<void>;

export class LocalRunQueue<H = unknown> {
  private readonly waiting: string[] = [];
  private readonly active = new Map<string, AbortController>();
  private readonly hints = new Map<string, H>();
  private idleWaiters: (() => void)[] = [];

  constructor(private readonly work: RunWork<H>, private readonly concurrency = 1) {}

  submit(runId: string, hint?: H): void {
    if (this.active.has(runId) || this.waiting.includes(runId)) return;
    this.waiting.push(runId);
    if (hint !== undefined) this.hints.set(runId, hint);
    this.pump();
    this.hints.delete(runId);
  }

  /** Stops a run: drops it from the queue, or aborts it if it is running. */
  cancel(runId: string): void {
    const i = this.waiting.indexOf(runId);
    if (i >= 0) this.waiting.splice(i, 1);
    this.active.get(runId)?.abort();
  }

  cancelAll(): void {
    this.waiting.length = 0;
    for (const c of this.active.values()) c.abort();
  }

  get size(): number {
    return this.waiting.length + this.active.size;
  }

  /** Resolves when nothing is queued or running (tests and shutdown). */
  idle(): Promise<void> {
    if (this.size === 0) return Promise.resolve();
    return new Promise((resolve) => this.idleWaiters.push(resolve));
  }

  private pump(): void {
    while (this.active.size < this.concurrency && this.waiting.length) {
      const runId = this.waiting.shift()!;
      const controller = new AbortController();
      this.active.set(runId, controller);
      // Off the request: the caller of submit() has already answered; failures are recorded on the run by `work`.
      void this.work(runId, controller.signal, this.hints.get(runId))
        .catch((err) => console.error(`[loamwork] run ${runId} failed outside its own error handling`, err))
        .finally(() => {
          this.active.delete(runId);
          this.pump();
          if (this.size === 0) for (const w of this.idleWaiters.splice(0)) w();
        });
    }
  }
}
