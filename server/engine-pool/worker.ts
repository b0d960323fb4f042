/** A worker thread of the engine pool (./pool.ts): runs one named task of ./tasks.ts per message. */
import { ENGINE_TASKS, type EngineTask } from './tasks';

export default function run({ task, args }: { task: EngineTask; args: unknown[] }): unknown {
  const fn = ENGINE_TASKS[task] as ((...a: unknown[]) => unknown) | undefined;
  if (typeof fn !== 'function') throw new Error(`unknown engine task "${String(task)}"`);
  return fn(...args);
}
