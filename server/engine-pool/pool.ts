/**
 * Engine work off the request thread: a pool of worker threads (piscina) running the tasks of
 * ./tasks.ts, each with a time limit. A 10,000-node solve takes about 100 ms and a pathological
 * one could take far longer; on the event loop either would stall every other request.
 *
 * @example
 * const result = await runEngine('solve', [doc], { timeout_ms: 5000 });
 * // throws EngineTimeout after 5 s (the worker is stopped and replaced)
 */
import { availableParallelism } from 'node:os';
import { Piscina } from 'piscina';
import type { EngineFn, EngineTask } from './tasks';

/** Default time limit of one task, ms. */
export const DEFAULT_ENGINE_TIMEOUT_MS = 20_000;

/** The task ran past its time limit; its worker was stopped. */
export class EngineTimeout extends Error {
  constructor(
    readonly task: string,
    readonly timeout_ms: number,
  ) {
    super(`engine task "${task}" stopped after ${timeout_ms} ms`);
  }
}

let pool: Piscina | null = null;

/**
 * The process's pool, made on first use. One thread fewer than the cores (at least one), so the
 * request thread keeps a core; idle workers do not keep the process alive.
 */
function enginePool(): Piscina {
  pool ??= new Piscina({
    filename: new URL('./worker-entry.mjs', import.meta.url).href,
    minThreads: 1,
    maxThreads: Math.max(1, availableParallelism() - 1),
    idleTimeout: 30_000,
  });
  return pool;
}

/**
 * Run an engine task in a worker thread. Arguments and result are copied (structured clone).
 * Rejects with EngineTimeout after `timeout_ms`, or with the task's own error.
 */
export async function runEngine<K extends EngineTask>(
  task: K,
  args: Parameters<EngineFn<K>>,
  options: { timeout_ms?: number } = {},
): Promise<ReturnType<EngineFn<K>>> {
  const timeout_ms = options.timeout_ms ?? DEFAULT_ENGINE_TIMEOUT_MS;
  const signal = AbortSignal.timeout(timeout_ms);
  try {
    return (await enginePool().run({ task, args }, { signal })) as ReturnType<EngineFn<K>>;
  } catch (err) {
    if (signal.aborted) throw new EngineTimeout(task, timeout_ms);
    throw err;
  }
}

/** Start the pool's first worker now (it loads the engine while the caller opens its database). */
export function warmEnginePool(): void {
  enginePool();
}

/** Stop the pool's threads (server shutdown); a later runEngine makes a new pool. */
export async function closeEnginePool(): Promise<void> {
  const p = pool;
  pool = null;
  await p?.destroy();
}
