import { gridCase } from './grid-cases';
import { runIfMain } from './harness';

/** Looped grid benchmark, 40 × 500 tees (a long grid 40 tees wide: fill and work grow linearly with length). */
export const grid20k = gridCase(40, 500);

runIfMain(import.meta.url, grid20k);
