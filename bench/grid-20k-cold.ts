import { gridCase } from './grid-cases';
import { runIfMain } from './harness';

/** Looped grid 40 × 500 tees, first solve of the layout (ordering and symbolic analysis timed too). */
export const grid20kCold = gridCase(40, 500, undefined, true);

runIfMain(import.meta.url, grid20kCold);
