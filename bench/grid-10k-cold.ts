import { gridCase } from './grid-cases';
import { runIfMain } from './harness';

/** Looped grid 40 × 250 tees, first solve of the layout (ordering and symbolic analysis timed too). */
export const grid10kCold = gridCase(40, 250, undefined, true);

runIfMain(import.meta.url, grid10kCold);
