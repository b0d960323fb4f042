import { gridCase } from './grid-cases';
import { runIfMain } from './harness';

/** Looped grid benchmark, 141 × 142 tees (square: any direct solver grows as n^1.5 here, George 1973). */
export const gridSquare20k = gridCase(141, 142);

runIfMain(import.meta.url, gridSquare20k);
