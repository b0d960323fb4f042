import type { NetworkDocument } from '../../../../../engine/network-document';
import type { Checklist } from '../../../../../engine/review/types';
import type { WhatIfTable } from '../../../../../engine/review/what-ifs';

interface Reply {
  seq: number;
  result?: unknown;
  error?: string;
  ms: number;
}

/**
 * Runs the review's engine tasks in review.worker.ts and answers each with a promise; one worker
 * per Review screen, ended with dispose().
 */
export class ReviewEngine {
  private readonly worker: Worker | null = typeof Worker !== 'undefined' ? new Worker(new URL('./review.worker', import.meta.url), { type: 'module' }) : null;
  private seq = 0;
  private readonly waiting = new Map<number, { resolve: (v: { result: unknown; ms: number }) => void; reject: (e: Error) => void }>();

  constructor() {
    this.worker?.addEventListener('message', (e: MessageEvent<Reply>) => {
      const w = this.waiting.get(e.data.seq);
      if (!w) return;
      this.waiting.delete(e.data.seq);
      if (e.data.error !== undefined) w.reject(new Error(e.data.error));
      else w.resolve({ result: e.data.result, ms: e.data.ms });
    });
  }

  private run(task: 'checklist' | 'what-ifs', doc: NetworkDocument, budget?: unknown, cover_m?: number | null): Promise<{ result: unknown; ms: number }> {
    if (!this.worker) return Promise.reject(new Error('This browser cannot run the review engine (no Web Workers)'));
    const seq = ++this.seq;
    return new Promise((resolve, reject) => {
      this.waiting.set(seq, { resolve, reject });
      this.worker!.postMessage({ seq, task, doc, budget, cover_m });
    });
  }

  /** The checklist of `doc`; with the project's budget document the storage checks use it, with its default cover (m) the pipe checks. */
  async checklist(doc: NetworkDocument, budget?: unknown, cover_m?: number | null): Promise<Checklist> {
    return (await this.run('checklist', doc, budget, cover_m)).result as Checklist;
  }

  async whatIfs(doc: NetworkDocument): Promise<{ table: WhatIfTable; ms: number }> {
    const r = await this.run('what-ifs', doc);
    return { table: r.result as WhatIfTable, ms: r.ms };
  }

  dispose(): void {
    this.worker?.terminate();
    for (const w of this.waiting.values()) w.reject(new Error('closed'));
    this.waiting.clear();
  }
}
