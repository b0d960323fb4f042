import { gridCase } from './grid-cases';
import { runIfMain } from './harness';

/** Looped grid benchmark, 100 × 100 tees (square: any direct solver grows as n^1.5 here, George 1973). */
export const gridSquare10k = gridCase(100, 100);

runIfMain(import.meta.url, gridSquare10k);
