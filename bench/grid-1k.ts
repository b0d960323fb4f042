import { gridCase } from './grid-cases';
import { runIfMain } from './harness';

/** Looped grid benchmark, 40 × 25 tees (a long grid 40 tees wide: fill and work grow linearly with length). */
export const grid1k = gridCase(40, 25);

runIfMain(import.meta.url, grid1k);
