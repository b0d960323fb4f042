/** A drip zone as rows of tape: its length, emitters and design flow (./tape.ts). */
export { dripTapeFlow, dripTapeProblem, type DripTapeInput, type DripTapeResult } from './tape';
