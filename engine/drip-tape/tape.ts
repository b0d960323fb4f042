/**
 * A drip zone laid as tape (or as dripline with emitters at a spacing): rows × row length of tape,
 * and either each emitter's flow at its spacing or the tape's flow per length as the maker states it
 * ("0.45 gpm per 100 ft"). SI inside.
 *
 * The flow per length is the emitter flow over the spacing (trade practice: a maker's "gpm per
 * 100 ft" is 100 ft ÷ spacing × emitter flow), and the zone draws the whole tape length at that rate,
 * so a row's emitter at its far end counts for its share of spacing rather than as a whole one.
 *
 * @example
 * dripTapeFlow({ rows: 10, row_length_m: 30, spacing_m: 0.3, emitter_flow_m3s: 1.0 / 3.6e6 })
 * // → { tape_m: 300, emitters: 1000, flow_per_m_m3s: 9.26e-7, flow_m3s: 2.78e-4, … }
 */

export interface DripTapeInput {
  /** Rows (laterals) of tape in the zone. */
  rows: number;
  /** Length of each row, m. */
  row_length_m: number;
  /** Emitter spacing along the tape, m; with `emitter_flow_m3s`. */
  spacing_m?: number;
  /** Each emitter's flow at its rated pressure, m³/s; with `spacing_m`. */
  emitter_flow_m3s?: number;
  /** Or the tape's stated flow per metre of tape, m³/s per m. */
  flow_per_m_m3s?: number;
}

export interface DripTapeResult {
  /** Total tape, m (rows × row length). */
  tape_m: number;
  /** Emitters in the zone (tape ÷ spacing, rounded), or null when the tape was given as flow per length. */
  emitters: number | null;
  /** Flow per metre of tape, m³/s per m. */
  flow_per_m_m3s: number;
  /** The whole zone's design flow, m³/s. */
  flow_m3s: number;
}

/** A message naming the field, or null when the input can be computed. */
export function dripTapeProblem(input: DripTapeInput): string | null {
  const positive = (v: unknown) => typeof v === 'number' && Number.isFinite(v) && v > 0;
  if (!positive(input.rows) || !Number.isInteger(input.rows)) return 'rows: must be a whole number of rows, at least 1';
  if (!positive(input.row_length_m)) return 'row_length_m: must be a length above 0';
  const bySpacing = input.spacing_m !== undefined || input.emitter_flow_m3s !== undefined;
  if (bySpacing && input.flow_per_m_m3s !== undefined) return 'give either spacing_m with emitter_flow_m3s, or flow_per_m_m3s, not both';
  if (bySpacing) {
    if (!positive(input.spacing_m)) return 'spacing_m: must be a spacing above 0';
    if (!positive(input.emitter_flow_m3s)) return 'emitter_flow_m3s: must be a flow above 0';
    if (input.spacing_m! > input.row_length_m) return 'spacing_m: is longer than a row';
    return null;
  }
  if (!positive(input.flow_per_m_m3s)) return 'flow_per_m_m3s (or spacing_m with emitter_flow_m3s): must be a flow above 0';
  return null;
}

export function dripTapeFlow(input: DripTapeInput): DripTapeResult {
  const problem = dripTapeProblem(input);
  if (problem) throw new RangeError(problem);
  const tape_m = input.rows * input.row_length_m;
  const perM = input.flow_per_m_m3s ?? input.emitter_flow_m3s! / input.spacing_m!;
  return {
    tape_m,
    emitters: input.spacing_m ? Math.round(tape_m / input.spacing_m) : null,
    flow_per_m_m3s: perM,
    flow_m3s: tape_m * perM,
  };
}
