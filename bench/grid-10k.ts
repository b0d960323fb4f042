import { gridCase } from './grid-cases';
import { runIfMain } from './harness';

/** Looped grid benchmark, 40 × 250 tees (a long grid 40 tees wide: fill and work grow linearly with length). */
export const grid10k = gridCase(40, 250, 150);

runIfMain(import.meta.url, grid10k);
