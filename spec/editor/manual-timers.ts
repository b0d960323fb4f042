import type { Timers } from '../../client/src/app/screens/layout/editor/timers';

/** Timers stepped by hand: `advance(ms)` runs what falls due, in order. */
export class ManualTimers implements Timers {
  now = 0;
  private seq = 0;
  private queue = new Map<number, { at: number; fn: () => void }>();

  set(fn: () => void, ms: number): unknown {
    const id = ++this.seq;
    this.queue.set(id, { at: this.now + ms, fn });
    return id;
  }

  clear(handle: unknown): void {
    this.queue.delete(handle as number);
  }

  get pending(): number {
    return this.queue.size;
  }

  advance(ms: number): void {
    const end = this.now + ms;
    for (;;) {
      const due = [...this.queue.entries()].filter(([, t]) => t.at <= end).sort((a, b) => a[1].at - b[1].at)[0];
      if (!due) break;
      this.queue.delete(due[0]);
      this.now = due[1].at;
      due[1].fn();
    }
    this.now = end;
  }
}
