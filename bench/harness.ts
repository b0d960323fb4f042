import { pathToFileURL } from 'node:url';

/**
 * A benchmark case: `run()` is timed `repeats` times after `warmup` untimed runs; the median and
 * the minimum are reported. `target_ms` is the budget from the engine issue (informational).
 */
export interface BenchCase {
  name: string;
  /** What one run does, for the table. */
  detail: string;
  warmup: number;
  repeats: number;
  target_ms?: number;
  /** Optional sanity check on the last run's output (throws on a wrong answer). */
  check?: (output: unknown) => void;
  run: () => unknown;
}

export interface BenchResult {
  name: string;
  detail: string;
  median_ms: number;
  min_ms: number;
  target_ms?: number;
}

/**
 * The p-quantile (p from 0 to 1) of the samples by nearest rank (the ⌈p·n⌉-th smallest); NaN
 * without samples. @example percentile([3, 1, 2], 0.5) // 2
 */
export function percentile(xs: readonly number[], p: number): number {
  if (!xs.length) return NaN;
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.min(s.length - 1, Math.max(0, Math.ceil(p * s.length) - 1))];
}

/** Time one case. @example const r = measure(demoSteady); */
export function measure(c: BenchCase): BenchResult {
  let out: unknown;
  for (let i = 0; i < c.warmup; i++) out = c.run();
  const times: number[] = [];
  for (let i = 0; i < c.repeats; i++) {
    const t0 = performance.now();
    out = c.run();
    times.push(performance.now() - t0);
  }
  c.check?.(out);
  times.sort((a, b) => a - b);
  const mid = times.length >> 1;
  const median = times.length % 2 ? times[mid] : (times[mid - 1] + times[mid]) / 2;
  return { name: c.name, detail: c.detail, median_ms: median, min_ms: times[0], target_ms: c.target_ms };
}

/**
 * Time ratio b/a from interleaved runs (a, b, a, b, …): both cases see the same machine load at
 * nearly the same moment, so on a shared machine the median of the per-pair ratios is far
 * steadier than a ratio of two medians taken minutes apart.
 * @example pairedRatio(grid10k, grid20k, 9) // ≈ 2 when time grows linearly
 */
export function pairedRatio(a: BenchCase, b: BenchCase, pairs: number): number {
  for (let i = 0; i < Math.min(a.warmup, b.warmup); i++) {
    a.run();
    b.run();
  }
  const ratios: number[] = [];
  for (let i = 0; i < pairs; i++) {
    const t0 = performance.now();
    a.run();
    const t1 = performance.now();
    b.run();
    const t2 = performance.now();
    ratios.push((t2 - t1) / (t1 - t0));
  }
  ratios.sort((x, y) => x - y);
  const mid = ratios.length >> 1;
  return ratios.length % 2 ? ratios[mid] : (ratios[mid - 1] + ratios[mid]) / 2;
}

/** Print a table of results. */
export function printTable(results: BenchResult[]): void {
  const rows = results.map((r) => [r.name, fmt(r.median_ms), fmt(r.min_ms), r.target_ms === undefined ? '' : `≤ ${r.target_ms}`, r.detail]);
  const head = ['case', 'median ms', 'min ms', 'target ms', 'what one run does'];
  const widths = head.map((h, i) => Math.max(h.length, ...rows.map((row) => row[i].length)));
  const line = (cells: string[]) => cells.map((c, i) => (i >= 1 && i <= 3 ? c.padStart(widths[i]) : c.padEnd(widths[i]))).join('  ');
  console.log(line(head));
  console.log(widths.map((w) => '-'.repeat(w)).join('  '));
  for (const row of rows) console.log(line(row));
}

function fmt(ms: number): string {
  return ms < 1 ? ms.toFixed(3) : ms < 100 ? ms.toFixed(1) : ms.toFixed(0);
}

/** Run a case when its file is executed directly (`npx tsx bench/grid-10k.ts`). */
export function runIfMain(url: string, c: BenchCase): void {
  if (process.argv[1] && url === pathToFileURL(process.argv[1]).href) printTable([measure(c)]);
}

/** Run `main` when the module at `url` is the script being run (for scripts that print their own report). */
export function runIfMainScript(url: string, main: () => void): void {
  if (process.argv[1] && url === pathToFileURL(process.argv[1]).href) main();
}
