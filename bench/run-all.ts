/**
 * Engine benchmarks: `npm run bench` prints a table of medians (and minima) for each case in
 * bench/ (one script per case; each also runs alone with `npx tsx bench/<case>.ts`).
 */
import { demoSteady } from './demo-steady';
import { farmWeek } from './farm-week';
import { grid10k } from './grid-10k';
import { grid10kCold } from './grid-10k-cold';
import { grid1k } from './grid-1k';
import { gridCase } from './grid-cases';
import { grid20k } from './grid-20k';
import { grid20kCold } from './grid-20k-cold';
import { gridSquare10k } from './grid-square-10k';
import { gridSquare20k } from './grid-square-20k';
import { sizingDemo } from './sizing-demo';
import { sizingTwoLoop } from './sizing-two-loop';
import { coldProcess } from './cold-process';
import { factorisationRatio } from './factorisation-ratio';
import { measure, pairedRatio, printTable, type BenchResult } from './harness';
import { reviewWhatIfs } from './review-what-ifs';
import { printChart10k } from './chart-10k';
import { timelineWeek } from './timeline-week';

// the 20,000-tee grids are over the document bound and timed without validation (./grid-cases),
// so the 20k/10k ratios pair them with 10k cases timed the same way
const inside10k = [gridCase(40, 250, undefined, false, true), gridCase(40, 250, undefined, true, true), gridCase(100, 100, undefined, false, true)];
const results: BenchResult[] = [];
for (const c of [
  demoSteady,
  grid1k,
  grid10k,
  inside10k[0],
  grid20k,
  grid10kCold,
  inside10k[1],
  grid20kCold,
  gridSquare10k,
  inside10k[2],
  gridSquare20k,
  farmWeek,
  timelineWeek,
  sizingDemo,
  sizingTwoLoop,
  reviewWhatIfs,
]) {
  results.push(measure(c));
}
printTable(results);
const ratio = (a: string, b: string): string => {
  const x = results.find((r) => r.name.includes(a));
  const y = results.find((r) => r.name.includes(b));
  return x && y ? (y.median_ms / x.median_ms).toFixed(2) : '?';
};
console.log(
  `\nratio 20k/10k from the medians (both without validation), long grids: ${ratio('10,000 tees (40×250), no validation', '20,000 tees (40×500), no validation')} (target ≤ 2.5); first solves: ${ratio('10,000 tees (40×250), first solve, no validation', '20,000 tees (40×500), first solve, no validation')}; square grids: ${ratio('10,000 tees (100×100), no validation', '20,022 tees')}`,
);
console.log(
  `ratio 20k/10k from 9 interleaved pairs (steadier under load), long grids: ${pairedRatio(inside10k[0], grid20k, 9).toFixed(2)}; first solves: ${pairedRatio(inside10k[1], grid20kCold, 9).toFixed(2)}`,
);
await printChart10k();
console.log(`\n${factorisationRatio()}`);
console.log(`\n${coldProcess()}`);
