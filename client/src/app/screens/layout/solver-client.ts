import { signal } from '@angular/core';
import type { NetworkDocument } from '../../../../../engine/network-document';
import type { SteadyResult } from '../../../../../engine/index';
import { SolveScheduler } from './editor/solve-scheduler';
import { realTimers } from './editor/timers';

/**
 * The solver Web Worker behind a debounced, latest-wins queue. Results are kept apart from the
 * document (never in undo history). `lastMs` is the worker's time for the newest answer.
 */
export class SolverClient {
  private readonly worker: Worker | null;
  private readonly scheduler: SolveScheduler<NetworkDocument>;
  private readonly resultState = signal<SteadyResult | null>(null);
  private readonly errorState = signal<string | null>(null);
  readonly result = this.resultState.asReadonly();
  readonly error = this.errorState.asReadonly();
  readonly lastMs = signal(0);
  /**
   * Called as soon as the worker's answer arrives, before Angular's change detection runs the
   * effects, so the canvas can redraw on the next animation frame.
   */
  onResult: (result: SteadyResult) => void = () => undefined;
  /** Debounce for edits that come one committed value at a time (the properties panel), ms. */
  static readonly QUICK_MS = 0;

  constructor() {
    this.worker = typeof Worker !== 'undefined' ? new Worker(new URL('./solver.worker', import.meta.url), { type: 'module' }) : null;
    this.scheduler = new SolveScheduler<NetworkDocument>((doc, seq) => this.worker?.postMessage({ seq, doc }), realTimers, 60);
    this.worker?.addEventListener('message', (e: MessageEvent<{ seq: number; result?: SteadyResult; error?: string; ms: number }>) => {
      const { seq, result, error, ms } = e.data;
      this.lastMs.set(ms);
      if (result) {
        this.resultState.set(result);
        this.errorState.set(null);
        this.scheduler.finished(seq);
        this.onResult(result);
        return;
      } else this.errorState.set(error ?? 'The solver failed');
      this.scheduler.finished(seq);
    });
  }

  /** Solve `doc` after the debounce (60 ms), or after `QUICK_MS` when `quick`. */
  request(doc: NetworkDocument, quick = false): void {
    this.scheduler.request(doc, quick ? SolverClient.QUICK_MS : undefined);
  }

  /** Another project is open: its first solve starts cold, not from the last project's answer. */
  forget(): void {
    this.worker?.postMessage({ forget: true });
  }

  dispose(): void {
    this.scheduler.dispose();
    this.worker?.terminate();
  }
}
