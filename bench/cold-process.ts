/**
 * A cold solve from a fresh process against a warm one (engine issue: the CLI within 2× the warm
 * solve). Writes the 10,000-tee grid to a temporary file, then, three times each and interleaved:
 * - CLI wall time: `node --import tsx engine/cli.ts grid.json` (process start, TypeScript load,
 *   read, solve, print);
 * - first solve in a fresh process: a child process that times its first solve() (no JIT warm-up,
 *   no cached ordering) and exits;
 * and in this process the median of nine warm solve() calls (JIT warm, ordering cached).
 * Run with `npx tsx bench/cold-process.ts` (also part of `npm run bench`).
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { solve } from '../engine/steady';
import { runIfMainScript } from './harness';
import { loopedGrid } from './looped-grid';

const root = join(fileURLToPath(import.meta.url), '..', '..');

export function coldProcess(): string {
  const doc = loopedGrid(40, 250);
  const file = join(mkdtempSync(join(tmpdir(), 'runnel-bench-')), 'grid.json');
  writeFileSync(file, JSON.stringify(doc));
  const median = (v: number[]): number => [...v].sort((a, b) => a - b)[v.length >> 1];
  const cli: number[] = [];
  const first: number[] = [];
  for (let r = 0; r < 3; r++) {
    let t0 = performance.now();
    execFileSync(process.execPath, ['--import', 'tsx', join(root, 'engine', 'cli.ts'), file], { cwd: root, maxBuffer: 1 << 28 });
    cli.push(performance.now() - t0);
    t0 = performance.now();
    const out = execFileSync(
      process.execPath,
      [
        '--import',
        'tsx',
        '-e',
        `import('${join(root, 'engine', 'steady.ts')}').then(async (m) => { const doc = JSON.parse(require('node:fs').readFileSync('${file}', 'utf8')); const t = performance.now(); m.solve(doc); console.log(performance.now() - t); })`,
      ],
      { cwd: root },
    );
    first.push(Number(String(out).trim()));
  }
  solve(doc);
  const warm: number[] = [];
  for (let r = 0; r < 9; r++) {
    const t0 = performance.now();
    solve(doc);
    warm.push(performance.now() - t0);
  }
  const w = median(warm);
  return [
    'cold process against warm solve(), 10,000-tee grid (40×250)',
    'case | median ms | ratio to warm',
    '--- | --- | ---',
    `warm solve() in a running process | ${w.toFixed(0)} | 1.0`,
    `first solve() in a fresh process (JIT cold, no cached ordering) | ${median(first).toFixed(0)} | ${(median(first) / w).toFixed(1)}`,
    `CLI wall time (node start, TypeScript load, read, solve, print) | ${median(cli).toFixed(0)} | ${(median(cli) / w).toFixed(1)}`,
  ].join('\n');
}

runIfMainScript(import.meta.url, () => console.log(coldProcess()));
