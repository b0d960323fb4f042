import { signal } from '@angular/core';
import type { NetworkDocument } from '../../../../../engine/network-document';
import type { SimulationSummary } from '../../../../../engine/simulate';
import type { BankEqualisation, TimelineEvent, TimelineSeries } from '../../../../../engine/timeline';
import type { Warning } from '../../../../../engine/warnings';

export interface TimelineResult {
  series: TimelineSeries;
  events: TimelineEvent[];
  banks: BankEqualisation[];
  warnings: Warning[];
  summary: SimulationSummary;
  simMs: number;
  ms: number;
}

/**
 * One simulation at a time in its own worker, with a stage and the fraction done for the progress
 * bar and a Cancel that ends the worker (a new one starts for the next run).
 */
export class TimelineRun {
  private worker: Worker | null = null;
  readonly running = signal(false);
  readonly stage = signal<'idle' | 'starting' | 'simulating' | 'events'>('idle');
  /** Fraction of the simulated time done (0–1), from the worker's progress messages. */
  readonly progress = signal(0);
  readonly result = signal<TimelineResult | null>(null);
  readonly error = signal<string | null>(null);
  readonly started = signal(0);

  start(doc: NetworkDocument, duration_s: number, step_s: number): void {
    this.cancel();
    if (typeof Worker === 'undefined') {
      this.error.set('This browser cannot run the simulation in the background.');
      return;
    }
    const worker = new Worker(new URL('./simulate.worker', import.meta.url), { type: 'module' });
    this.worker = worker;
    this.running.set(true);
    this.stage.set('starting');
    this.progress.set(0);
    this.error.set(null);
    // a new run replaces the shown one: no chart of the old span or step while it computes
    this.result.set(null);
    this.started.set(performance.now());
    worker.addEventListener('message', (e: MessageEvent<{ stage?: 'simulating' | 'events'; progress?: number; result?: TimelineResult; error?: string }>) => {
      if (this.worker !== worker) return;
      if (typeof e.data.progress === 'number') {
        this.progress.set(e.data.progress);
        return;
      }
      if (e.data.stage) {
        this.stage.set(e.data.stage);
        return;
      }
      if (e.data.result) this.result.set(e.data.result);
      if (e.data.error) this.error.set(e.data.error);
      this.finish();
    });
    worker.addEventListener('error', (e) => {
      if (this.worker !== worker) return;
      this.error.set(e.message || 'The simulation failed');
      this.finish();
    });
    worker.postMessage({ doc, duration_s, step_s });
  }

  cancel(): void {
    if (!this.worker) return;
    this.finish();
  }

  private finish(): void {
    this.worker?.terminate();
    this.worker = null;
    this.running.set(false);
    this.stage.set('idle');
  }
}
