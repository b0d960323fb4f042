/**
 * Password hashing with bcryptjs, on worker threads: a bcrypt check is tens of milliseconds of CPU
 * and must not stall every other request. The pool is bounded: `size` workers and at most
 * `maxQueued` checks waiting; a check beyond that is refused at once (429 busy) instead of piling
 * up, so a sign-in flood costs at most `size` cores (server/README.md "Signing in").
 */
import { Worker } from 'node:worker_threads';
import { ApiError } from '../errors';

/** Cost 10: tens of milliseconds per hash on a small server (common practice for bcrypt). */
export const DEFAULT_BCRYPT_COST = 10;

export interface PasswordPoolOptions {
  /** Worker threads; default 1 (leaves the other cores to the API). */
  size?: number;
  /** Checks allowed to wait for a worker; default 16. */
  maxQueued?: number;
}

type Job = { kind: 'hash'; password: string; cost: number } | { kind: 'compare'; password: string; hash: string };
interface Pending {
  job: Job;
  resolve(value: unknown): void;
  reject(err: Error): void;
}

const WORKER_URL = new URL('./password-worker.mjs', import.meta.url);

export class PasswordPool {
  readonly size: number;
  readonly maxQueued: number;
  private readonly idle: Worker[] = [];
  private readonly busy = new Map<Worker, Pending>();
  private readonly queue: Pending[] = [];
  private workers = 0;
  private readonly alive = new Set<Worker>();
  /** Checks done, and refused for a full queue (for tests and the benchmark). */
  readonly stats = { done: 0, refused: 0 };

  constructor(options: PasswordPoolOptions = {}) {
    this.size = Math.max(1, options.size ?? 1);
    this.maxQueued = Math.max(0, options.maxQueued ?? 16);
  }

  hash(password: string, cost: number): Promise<string> {
    return this.run({ kind: 'hash', password, cost }) as Promise<string>;
  }

  compare(password: string, hash: string): Promise<boolean> {
    return this.run({ kind: 'compare', password, hash }) as Promise<boolean>;
  }

  /** Stops the workers (pending checks fail). */
  async close(): Promise<void> {
    const all = [...this.alive];
    this.alive.clear();
    this.idle.length = 0;
    for (const p of this.queue.splice(0)) p.reject(new Error('password pool closed'));
    await Promise.all(all.map((w) => w.terminate()));
  }

  private run(job: Job): Promise<unknown> {
    return new Promise((resolve, reject) => {
      const pending: Pending = { job, resolve, reject };
      const worker = this.idle.pop() ?? (this.workers < this.size ? this.spawn() : undefined);
      if (worker) return this.dispatch(worker, pending);
      if (this.queue.length >= this.maxQueued) {
        this.stats.refused++;
        return reject(new ApiError('rate-limited', 'The server is busy checking other sign-ins; try again in a few seconds.'));
      }
      this.queue.push(pending);
    });
  }

  private spawn(): Worker {
    this.workers++;
    const worker = new Worker(WORKER_URL);
    this.alive.add(worker);
    worker.unref(); // an idle pool never keeps the process alive
    worker.on('message', (msg: { result?: unknown; error?: string }) => {
      const pending = this.busy.get(worker);
      this.busy.delete(worker);
      this.stats.done++;
      if (pending) {
        if (msg.error !== undefined) pending.reject(new Error(msg.error));
        else pending.resolve(msg.result);
      }
      const next = this.queue.shift();
      if (next) this.dispatch(worker, next);
      else this.idle.push(worker);
    });
    worker.on('error', (err) => this.lose(worker, err));
    worker.on('exit', (code) => {
      if (this.busy.has(worker) || code !== 0) this.lose(worker, new Error(`password worker exited with ${code}`));
    });
    return worker;
  }

  private dispatch(worker: Worker, pending: Pending): void {
    this.busy.set(worker, pending);
    worker.postMessage({ id: 0, ...pending.job });
  }

  /** A worker died: fail its check and let the next check start a new one. */
  private lose(worker: Worker, err: Error): void {
    if (!this.alive.delete(worker)) return;
    const pending = this.busy.get(worker);
    this.busy.delete(worker);
    const at = this.idle.indexOf(worker);
    if (at >= 0) this.idle.splice(at, 1);
    this.workers = Math.max(0, this.workers - 1);
    pending?.reject(err);
    const next = this.queue.shift();
    if (next) this.dispatch(this.spawn(), next);
  }
}

/** The process-wide pool (apps may bring their own through createApp's `passwordPool`). */
const shared = new PasswordPool();

export function sharedPasswordPool(): PasswordPool {
  return shared;
}

export function hashPassword(password: string, cost: number, pool: PasswordPool = shared): Promise<string> {
  return pool.hash(password, cost);
}

export function checkPassword(password: string, hash: string, pool: PasswordPool = shared): Promise<boolean> {
  return pool.compare(password, hash);
}

const dummyHashes = new Map<number, Promise<string>>();

/**
 * Compared against when the e-mail is unknown, so a miss costs as much as a wrong password.
 * Made once per cost, on the pool.
 */
export function dummyHash(cost: number, pool: PasswordPool = shared): Promise<string> {
  let hash = dummyHashes.get(cost);
  if (!hash) {
    hash = pool.hash('not-a-real-password', cost);
    hash.catch(() => dummyHashes.delete(cost));
    dummyHashes.set(cost, hash);
  }
  return hash;
}
