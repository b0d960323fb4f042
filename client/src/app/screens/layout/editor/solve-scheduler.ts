import type { Timers } from './timers';

/**
 * Debounced, latest-wins job runner for the solver worker: `request(job)` restarts the debounce;
 * when it fires the job is sent if the worker is idle, otherwise it waits as the single pending
 * job (an older pending job is dropped). `finished()` is called when the worker answers.
 * The canvas never waits on it.
 */
export class SolveScheduler<J> {
  private timer: unknown = null;
  private pending: J | null = null;
  private busy = false;
  /** Jobs sent so far (each gets the next sequence number). */
  sent = 0;

  constructor(
    private readonly send: (job: J, seq: number) => void,
    private readonly timers: Timers,
    readonly debounceMs = 60,
  ) {}

  /**
   * Queue `job` to be sent after `delayMs` (the debounce by default) without a newer request.
   * A property-panel edit asks for none (0: sent now if the worker is idle) (one committed value, nothing to coalesce);
   * drags keep the full debounce.
   */
  request(job: J, delayMs = this.debounceMs): void {
    this.pending = job;
    if (this.timer !== null) this.timers.clear(this.timer);
    this.timer = null;
    if (delayMs <= 0) {
      this.pump();
      return;
    }
    this.timer = this.timers.set(() => {
      this.timer = null;
      this.pump();
    }, delayMs);
  }

  /** The worker answered job `seq`; send the pending job, if any. Returns true if seq is the latest. */
  finished(seq: number): boolean {
    this.busy = false;
    this.pump();
    return seq === this.sent && this.pending === null && !this.busy;
  }

  get idle(): boolean {
    return !this.busy && this.pending === null;
  }

  dispose(): void {
    if (this.timer !== null) this.timers.clear(this.timer);
    this.timer = null;
    this.pending = null;
  }

  private pump(): void {
    if (this.busy || this.pending === null || this.timer !== null) return;
    const job = this.pending;
    this.pending = null;
    this.busy = true;
    this.sent++;
    this.send(job, this.sent);
  }
}
