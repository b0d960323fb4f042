/**
 * A cold solve from a fresh process against a warm one (engine issue: the CLI within 2× the warm
 * solve). Writes the 10,000-tee grid to a temporary file, then, five times each and interleaved:
 * - CLI, as `npm run -s solve` runs it: `node scripts/bundled-cli.mjs engine/cli.ts grid.json`
 *   (process start, the prebuilt bundle, read, solve, print);
 * - CLI through tsx, as it ran before 3 Dec 2026 evening: `node --import tsx engine/cli.ts`;
 * - first solve() in a fresh process (JIT cold, no cached ordering), from the bundled engine
 *   and through tsx: a child that times its first solve() and exits;
 * and in this process the median of nine warm solve() calls (JIT warm, ordering cached), before
 * and after the rounds. Each child reports its wall time and its CPU time (user + system, all
 * threads: V8 compiles and collects on helper threads); CPU time hardly moves with the load of
 * the shared machine, wall time does, so both are printed with the load average.
 * Run with `npx tsx bench/cold-process.ts` (also part of `npm run bench`).
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { solve } from '../engine/steady';
import { runIfMainScript } from './harness';
import { loopedGrid } from './looped-grid';

const root = join(fileURLToPath(import.meta.url), '..', '..');

interface Timing {
  wall: number;
  cpu: number;
}

/** Wall and CPU ms of one child process (CPU from its own resource usage at exit, written to `report`). */
function child(args: string[], report: string): Timing & { first?: number; firstCpu?: number } {
  const t0 = performance.now();
  execFileSync(process.execPath, args, { cwd: root, maxBuffer: 1 << 28, env: { ...process.env, RUNNEL_BENCH_REPORT: report } });
  const wall = performance.now() - t0;
  const m = /^cpu (\S+) first (\S+) (\S+)/.exec(readFileSync(report, 'utf8'));
  if (!m) throw new Error(`no timing report from ${args.join(' ')}`);
  return { wall, cpu: Number(m[1]), ...(m[2] !== '-' ? { first: Number(m[2]), firstCpu: Number(m[3]) } : {}) };
}

export function coldProcess(rounds = 5): string {
  const doc = loopedGrid(40, 250);
  const dir = mkdtempSync(join(tmpdir(), 'runnel-bench-'));
  const file = join(dir, 'grid.json');
  writeFileSync(file, JSON.stringify(doc));
  // each child prints its CPU time at exit (and its first solve's wall ms when it times one)
  const report = join(dir, 'report.cjs');
  const reportFile = join(dir, 'report.txt');
  writeFileSync(
    report,
    "process.on('exit', () => { const u = process.resourceUsage(); require('node:fs').writeFileSync(process.env.RUNNEL_BENCH_REPORT, `cpu ${(u.userCPUTime + u.systemCPUTime) / 1000} first ${globalThis.__first ?? '-'} ${globalThis.__firstCpu ?? '-'}`); });\n",
  );
  const firstSolve = join(dir, 'first-solve.ts');
  writeFileSync(
    firstSolve,
    `import { readFileSync } from 'node:fs';\nimport { solve } from ${JSON.stringify(join(root, 'engine', 'steady.ts'))};\nconst doc = JSON.parse(readFileSync(${JSON.stringify(file)}, 'utf8'));\nconst t = performance.now();\nconst c = process.cpuUsage();\nsolve(doc);\nconst u = process.cpuUsage(c);\nObject.assign(globalThis, { __first: performance.now() - t, __firstCpu: (u.user + u.system) / 1000 });\n`,
  );
  const cases: Record<string, string[]> = {
    'CLI as npm run solve (bundle)': ['--require', report, join(root, 'scripts', 'bundled-cli.mjs'), 'engine/cli.ts', file],
    'CLI through tsx': ['--require', report, '--import', 'tsx', join(root, 'engine', 'cli.ts'), file],
    'first solve(), bundled engine': ['--require', report, join(root, 'scripts', 'bundled-cli.mjs'), firstSolve],
    'first solve(), through tsx': ['--require', report, '--import', 'tsx', firstSolve],
  };
  const median = (v: number[]): number => [...v].sort((a, b) => a - b)[v.length >> 1];
  const warmMedian = (): { wall: number; cpu: number } => {
    solve(doc);
    const wall: number[] = [];
    const cpu: number[] = [];
    for (let r = 0; r < 9; r++) {
      const c0 = process.cpuUsage();
      const t0 = performance.now();
      solve(doc);
      wall.push(performance.now() - t0);
      const c = process.cpuUsage(c0);
      cpu.push((c.user + c.system) / 1000);
    }
    return { wall: median(wall), cpu: median(cpu) };
  };
  const load0 = loadavg()[0];
  for (const args of Object.values(cases)) child(args, reportFile); // builds the bundles once, untimed
  const before = warmMedian();
  const times: Record<string, (Timing & { first?: number; firstCpu?: number })[]> = Object.fromEntries(Object.keys(cases).map((n) => [n, []]));
  for (let r = 0; r < rounds; r++) for (const [name, args] of Object.entries(cases)) times[name].push(child(args, reportFile));
  const after = warmMedian();
  const load1 = loadavg()[0];
  const warm = { wall: (before.wall + after.wall) / 2, cpu: (before.cpu + after.cpu) / 2 };
  const lines = [
    `cold process against warm solve(), 10,000-tee grid (40×250), ${rounds} interleaved rounds, load average ${load0.toFixed(1)} → ${load1.toFixed(1)}`,
    'case | wall median ms | ratio to warm (wall) | CPU median ms | ratio to warm (CPU)',
    '--- | --- | --- | --- | ---',
    `warm solve() in a running process (before ${before.wall.toFixed(0)} / after ${after.wall.toFixed(0)} ms) | ${warm.wall.toFixed(0)} | 1.0 | ${warm.cpu.toFixed(0)} | 1.0`,
  ];
  for (const [name, t] of Object.entries(times)) {
    const first = t.every((x) => x.first !== undefined) ? median(t.map((x) => x.first!)) : undefined;
    const wall = median(t.map((x) => x.wall));
    const cpu = median(t.map((x) => x.cpu));
    lines.push(`${name}: whole process | ${wall.toFixed(0)} | ${(wall / warm.wall).toFixed(1)} | ${cpu.toFixed(0)} | ${(cpu / warm.cpu).toFixed(1)}`);
    const firstCpu = first !== undefined ? median(t.map((x) => x.firstCpu!)) : 0;
    if (first !== undefined)
      lines.push(
        `${name}: the solve() call alone | ${first.toFixed(0)} | ${(first / warm.wall).toFixed(1)} | ${firstCpu.toFixed(0)} | ${(firstCpu / warm.cpu).toFixed(1)}`,
      );
  }
  return lines.join('\n');
}

runIfMainScript(import.meta.url, () => console.log(coldProcess()));
