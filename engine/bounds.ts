/**
 * The physical bounds of a network document's numbers, in one place. A value outside its bound is
 * not a design but a typing slip or an attack (1e308 m of pipe, a 1e-300 m bore): the schema
 * (./document-schema) rejects it with a message naming element and field, before any solve.
 * The bounds are generous on purpose: they hold every farm, orchard or village system we can
 * imagine, with room to spare; they are not design limits (those are the warnings of ./checks).
 *
 * @example
 * BOUNDS.length_m // { min: 0, above: true, max: 100000, unit: 'm', why: … }
 */

export interface Bound {
  /** Lowest allowed value (inclusive unless `above`). */
  min: number;
  /** The value must be strictly above `min` (lengths, diameters). */
  above?: boolean;
  max: number;
  unit: string;
  /** Why these numbers. */
  why: string;
}

export const BOUNDS = {
  elevation_m: { min: -500, max: 9000, unit: 'm', why: 'below the lowest dry land (Dead Sea shore, about −430 m) to above any farmed ground' },
  head_m: { min: -500, max: 10000, unit: 'm', why: 'a water surface at a plausible elevation plus a pump head' },
  coordinate_m: { min: -1e7, max: 1e7, unit: 'm', why: 'site-plan positions within 10,000 km of the plan origin' },
  distance_m: { min: 0, max: 100000, unit: 'm', why: 'a distance along a pipe of up to 100 km' },
  length_m: { min: 0, above: true, max: 100000, unit: 'm', why: 'a pipe run of up to 100 km' },
  diameter_m: { min: 0.0005, max: 5, unit: 'm', why: 'from a 0.5 mm micro-tube bore to a 5 m culvert' },
  tank_diameter_m: { min: 0.05, max: 200, unit: 'm', why: 'from a small header drum to a large reservoir' },
  tank_level_m: { min: 0, max: 100, unit: 'm', why: 'water depth in a tank, m above its floor' },
  demand_m3s: { min: -10, max: 10, unit: 'm³/s', why: 'up to 10 m³/s at one point (a tee may carry a negative demand: an inflow)' },
  flow_m3s: { min: 0, max: 10, unit: 'm³/s', why: 'a pump or inflow of up to 10 m³/s' },
  pump_head_m: { min: 0, max: 2000, unit: 'm', why: 'a multistage pump head' },
  pressure_m: { min: -100, max: 2000, unit: 'm', why: 'a pressure an outlet needs, metres of water' },
  setting_m: { min: 0, max: 2000, unit: 'm', why: 'a valve setting, metres of water' },
  rating_m: { min: 0, above: true, max: 2000, unit: 'm', why: 'a pipe pressure rating (2000 m is about 2,800 psi)' },
  roughness: { min: 0, above: true, max: 200, unit: '', why: 'either roughness below (checked per head-loss model in ./physical-checks)' },
  hazen_williams_c: { min: 1, max: 200, unit: '', why: 'Hazen-Williams C (about 60 for old corroded iron to about 150 for plastic)' },
  roughness_mm: { min: 0, above: true, max: 100, unit: 'mm', why: 'absolute roughness under Darcy-Weisbach (0.0015 mm plastic to tens of mm for rough rock)' },
  minor_loss: { min: 0, max: 10000, unit: '', why: 'a sum of loss coefficients K' },
  cover_m: { min: 0, max: 20, unit: 'm', why: 'burial depth' },
  factor: { min: 0, max: 100, unit: '', why: 'an hourly demand multiplier' },
  emitter_k: { min: 0, above: true, max: 10, unit: 'm³/s per m^x', why: 'emitter coefficient' },
  emitter_exponent: { min: 0, above: true, max: 3, unit: '', why: 'emitter exponent (0.5 for an orifice, 0–1 for drippers)' },
  pixels: { min: 0, above: true, max: 1e6, unit: 'px', why: 'a backdrop image size' },
  refill_m3: { min: 0, above: true, max: 1000, unit: 'm³', why: "the water a trough's float valve lets in to refill it (editor wording)" },
  emitters: { min: 1, max: 1e6, unit: '', why: 'the emitters of a drip zone (editor wording)' },
  tape_rows: { min: 1, max: 10000, unit: '', why: 'the rows of drip tape in a zone (editor wording)' },
  emitter_spacing_m: { min: 0, above: true, max: 10, unit: 'm', why: 'the spacing of emitters along drip tape (editor wording)' },
  m_per_px: { min: 0, above: true, max: 1e4, unit: 'm/px', why: 'a backdrop scale' },
} satisfies Record<string, Bound>;

export type BoundName = keyof typeof BOUNDS;

/** Most nodes, and most links, a document may hold (the API's size limit). */
export const MAX_ELEMENTS = 20000;

/** Longest id, name and notes. */
export const MAX_ID_LENGTH = 100;
export const MAX_NAME_LENGTH = 200;
export const MAX_NOTES_LENGTH = 10000;

/**
 * Why `v` is outside `bound`, or null when inside.
 * @example boundProblem(BOUNDS.length_m, 0) // 'must be a positive number'
 */
export function boundProblem(bound: Bound, v: number): string | null {
  if ((bound.above || bound.min > 0) && bound.min >= 0 && v <= 0) return 'must be a positive number';
  if (bound.min === 0 && !bound.above && v < 0) return 'must be a number ≥ 0';
  if (bound.above ? v <= bound.min : v < bound.min) return `must be ${bound.above ? 'above' : 'at least'} ${bound.min}${bound.unit ? ' ' + bound.unit : ''}`;
  if (v > bound.max) return `must be at most ${bound.max}${bound.unit ? ' ' + bound.unit : ''}`;
  return null;
}
