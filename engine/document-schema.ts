/**
 * The network document's schema: the ONE description of Runnel's JSON format for a gravity water
 * network, used by the engine (validateDocument, solve, the CLI), the server (PUT …/network), the
 * browser's solver worker and the Layout's import. The TypeScript types in ./network-document are
 * inferred from it. Cross-element rules (ids unique, links name nodes, levels in order) live
 * beside it in ./physical-checks; numeric bounds in ./bounds; older versions in ./migrations.
 *
 * SI units inside (metres, seconds, m³/s). Field names are stable: saved designs and outside tools
 * depend on them. Adding a field: add it here (optional, with its bound); renaming or reshaping
 * one: bump SCHEMA_VERSION and add a step to ./migrations (see engine/README.md).
 * Unknown fields are accepted and kept (not typed), so a newer editor's extra data survives.
 */
import { z } from 'zod';
import { BOUNDS, MAX_ELEMENTS, MAX_ID_LENGTH, MAX_NAME_LENGTH, MAX_NOTES_LENGTH, type Bound, type BoundName } from './bounds';

/** The current version of the document format; `schema` is `runnel.network/<version>`. */
export const SCHEMA_VERSION = 1;
export const NETWORK_SCHEMA = 'runnel.network/1';

/** A number within BOUNDS[name], with native zod checks (fast); messages as "must be at most 100000 m". */
function quantity(name: BoundName) {
  const bound: Bound = BOUNDS[name];
  const unit = bound.unit ? ' ' + bound.unit : '';
  let n = z.number({ error: 'must be a number' });
  if (bound.min >= 0 && (bound.above || bound.min > 0)) n = n.gt(0, { error: 'must be a positive number', abort: true });
  if (bound.min === 0 && !bound.above) n = n.gte(0, { error: 'must be a number ≥ 0', abort: true });
  if (bound.min !== 0)
    n = bound.above
      ? n.gt(bound.min, { error: `must be above ${bound.min}${unit}`, abort: true })
      : n.gte(bound.min, { error: `must be at least ${bound.min}${unit}`, abort: true });
  return n.lte(bound.max, `must be at most ${bound.max}${unit}`);
}

const id = z
  .string({ error: 'must be a non-empty string' })
  .max(MAX_ID_LENGTH, `must be at most ${MAX_ID_LENGTH} characters`)
  .refine((s) => s.trim() !== '', 'must be a non-empty string');
const name = z.string({ error: 'must be text' }).max(MAX_NAME_LENGTH, `must be at most ${MAX_NAME_LENGTH} characters`);
const notes = z.string({ error: 'must be text' }).max(MAX_NOTES_LENGTH, `must be at most ${MAX_NOTES_LENGTH} characters`);
const flag = z.boolean({ error: 'must be true or false' });
const point = z.tuple([quantity('coordinate_m'), quantity('coordinate_m')], { error: 'must be an [x_m, y_m] pair' });
const hourly = (bound: BoundName, what: string) =>
  z.array(quantity(bound), { error: `must be a list of 24 ${what}` }).length(24, `must be a list of 24 ${what} (one per hour)`);

export const ELEVATION_SOURCES = ['unset', 'survey', 'nearest'] as const;

/** Fields every node may carry. x_m/y_m are site-plan coordinates (metres, y up) used by the editor. */
const nodeBase = {
  id,
  name: name.optional(),
  elevation_m: quantity('elevation_m'),
  x_m: quantity('coordinate_m').optional(),
  y_m: quantity('coordinate_m').optional(),
  notes: notes.optional(),
  /** Editor: where the elevation came from (absent: typed); 'unset' asks for it and holds back pressures. */
  elevation_source: z.enum(ELEVATION_SOURCES, { error: `must be one of ${ELEVATION_SOURCES.join(', ')}` }).optional(),
  /** Editor: the survey point or element an elevation was taken from. */
  elevation_from: name.optional(),
};

/** A fixed water surface: spring box, creek intake or well (head_m = water surface elevation). */
const sourceNode = z.object({
  ...nodeBase,
  kind: z.literal('source'),
  head_m: quantity('head_m'),
  /** 'spring' | 'creek' | 'well' — display only. */
  source_type: name.optional(),
});

/** A cylindrical storage tank; levels are measured from the tank floor at elevation_m. */
const tankNode = z.object({
  ...nodeBase,
  kind: z.literal('tank'),
  diameter_m: quantity('tank_diameter_m'),
  level_m: quantity('tank_level_m'),
  min_level_m: quantity('tank_level_m'),
  max_level_m: quantity('tank_level_m'),
  /** Steady inflow from outside the network (a spring trickling into a cistern), m³/s; used by simulate. */
  inflow_m3s: quantity('flow_m3s').optional(),
  /** Tanks sharing a bank id are drawn joined by a header (display grouping only). */
  bank: name.optional(),
});

/** A branch point; may carry a demand (negative: an inflow). */
const teeNode = z.object({
  ...nodeBase,
  kind: z.literal('tee'),
  demand_m3s: quantity('demand_m3s'),
  /** Id of an hourly pattern in doc.patterns multiplying demand_m3s. */
  pattern: id.optional(),
  /** Review: an air-release valve / a drain fitted at this tee (engine/profile/network-points.ts). */
  air_valve: flag.optional(),
  drain: flag.optional(),
  /** Only outlets have a demand model; a tee carrying one is a mistake the engine would ignore. */
  demand_model: z.never({ error: 'a tee has no demand model (make it an outlet)' }).optional(),
});

export const OUTLET_TYPES = ['hose-bib', 'trough', 'drip-zone', 'sprinkler', 'house', 'other'] as const;

/**
 * How an outlet's flow depends on pressure.
 * - fixed: always demand_m3s (when supply allows).
 * - pressure-dependent: full demand at required_pressure_m falling smoothly to zero at
 *   zero_pressure_m (default 0; Wagner et al. 1988 style pressure-driven demand).
 * - emitter: q = k · p^exponent (p in metres of water, q in m³/s).
 */
const demandModel = z.discriminatedUnion(
  'type',
  [
    z.object({ type: z.literal('fixed') }),
    z.object({ type: z.literal('pressure-dependent'), required_pressure_m: quantity('pressure_m'), zero_pressure_m: quantity('pressure_m').optional() }),
    z.object({ type: z.literal('emitter'), k: quantity('emitter_k'), exponent: quantity('emitter_exponent') }),
  ],
  { error: (issue) => (issue.code === 'invalid_union' ? 'must be "fixed", "pressure-dependent" or "emitter"' : 'must be an object with a type') },
);

const outletNode = z.object({
  ...nodeBase,
  kind: z.literal('outlet'),
  demand_m3s: quantity('flow_m3s'),
  /** Minimum pressure the device needs, m of water; drives the below-minimum check. */
  min_pressure_m: quantity('pressure_m').optional(),
  outlet_type: z.enum(OUTLET_TYPES, { error: `must be one of ${OUTLET_TYPES.join(', ')}` }).optional(),
  demand_model: demandModel.optional(),
  pattern: id.optional(),
  /**
   * Trough with a float valve. The valve passes what the stock drink, so the outlet draws its
   * (patterned) demand_m3s like any outlet; the flag is descriptive (takeoff, review).
   */
  float_valve: flag.optional(),
  /** Editor wording: a trough's refill volume (its design flow is this over the refill time). */
  refill_m3: quantity('refill_m3').optional(),
  /** Editor wording: a drip zone's emitter count (its design flow is this times each emitter's flow). */
  emitters: quantity('emitters').optional(),
  /** Editor wording: a drip zone laid as tape, rows × row length at an emitter spacing (engine/drip-tape); sets `emitters` and demand_m3s. */
  drip_tape: z
    .object(
      {
        rows: quantity('tape_rows'),
        row_length_m: quantity('distance_m'),
        spacing_m: quantity('emitter_spacing_m'),
      },
      { error: 'must be an object { rows, row_length_m, spacing_m }' },
    )
    .optional(),
});

const node = z.discriminatedUnion('kind', [sourceNode, tankNode, teeNode, outletNode], {
  error: (issue) => (issue.code === 'invalid_union' ? 'must be one of source, tank, tee, outlet' : 'must be an object'),
});

/** Fields every link may carry. vertices are editor bend points [[x_m, y_m], …]. */
const linkBase = {
  id,
  name: name.optional(),
  from: id,
  to: id,
  vertices: z.array(point, { error: 'must be a list of [x_m, y_m] pairs' }).max(10000).optional(),
  notes: notes.optional(),
};

/** How a pipe's length was decided (editor): absent or 'drawing' = measured from the drawing. */
export const LENGTH_SOURCES = ['drawing', 'typed', 'survey'] as const;

const pipeLink = z.object({
  ...linkBase,
  kind: z.literal('pipe'),
  length_m: quantity('length_m'),
  /** Inside diameter, m. */
  diameter_m: quantity('diameter_m'),
  /** Hazen-Williams C, or absolute roughness in mm under Darcy-Weisbach (bounds per model in ./physical-checks). */
  roughness: quantity('roughness'),
  /** Sum of minor-loss coefficients K (dimensionless, default 0). */
  minor_loss: quantity('minor_loss').optional(),
  /** Catalogue reference (engine/pipe-catalogue.ts): material/series id and nominal size. */
  material: name.optional(),
  series: name.optional(),
  nominal: name.optional(),
  /** Pressure rating, m of water; drives the over-rating check. */
  rating_m: quantity('rating_m').optional(),
  /** Ground profile along the pipe [[distance_m from `from`, ground elevation_m], …]. */
  profile: z
    .array(z.tuple([quantity('distance_m'), quantity('elevation_m')]), { error: 'must be a list of [distance_m, elevation_m] pairs' })
    .max(100000)
    .optional(),
  /** Burial depth below the ground profile, m (default 0.45). */
  cover_m: quantity('cover_m').optional(),
  /** Initially closed (a pipe with a shut-off). */
  closed: flag.optional(),
  /** Review: air-release valves and drains fitted along the pipe, m from `from` (engine/profile/network-points.ts). */
  air_valves_m: z.array(quantity('distance_m'), { error: 'must be a list of distances in m' }).max(1000).optional(),
  drains_m: z.array(quantity('distance_m'), { error: 'must be a list of distances in m' }).max(1000).optional(),
  /** Editor: how the length was decided. */
  length_source: z.enum(LENGTH_SOURCES, { error: `must be one of ${LENGTH_SOURCES.join(', ')}` }).optional(),
});

const pumpControl = z.object(
  {
    /** Tank whose level controls the pump. */
    tank: id,
    /** Stop when the tank level reaches this, m. */
    stop_level_m: quantity('tank_level_m'),
    /** Restart when the tank level falls to this, m. */
    start_level_m: quantity('tank_level_m'),
  },
  { error: 'must be an object { tank, stop_level_m, start_level_m }' },
);

const pumpLink = z.object({
  ...linkBase,
  kind: z.literal('pump'),
  /** Constant delivered flow (positive-displacement or fill pump), m³/s; used when no curve is given. */
  flow_m3s: quantity('flow_m3s').optional(),
  /** Head–flow curve [[flow_m3s, head_m], …] with head falling as flow rises. */
  curve: z
    .array(z.tuple([quantity('flow_m3s'), quantity('pump_head_m')]), { error: 'must be a list of [flow_m3s, head_m] pairs' })
    .min(1, 'must be a non-empty list of [flow_m3s, head_m] pairs')
    .max(100)
    .optional(),
  /**
   * 24 hourly availability factors 0..1 (a solar pump's daylight profile), used by simulate: they
   * scale a constant-flow pump's flow, or a curve pump's speed (affinity laws). Steady solves run
   * pumps at full availability.
   */
  schedule: z
    .array(z.number().min(0).max(1), { error: 'must be 24 hourly factors between 0 and 1' })
    .length(24, 'must be 24 hourly factors between 0 and 1')
    .optional(),
  /** Editor: the head–flow points typed from the maker's chart; `curve` is their least-squares fit (engine/pump-curve). */
  curve_points: z
    .array(z.tuple([quantity('flow_m3s'), quantity('pump_head_m')]), { error: 'must be a list of [flow_m3s, head_m] pairs' })
    .max(100)
    .optional(),
  control: pumpControl.optional(),
  /** Low-water cut-off on the tank the pump draws from: stop below this level, m. */
  low_cutoff: z.object({ tank: id, level_m: quantity('tank_level_m') }, { error: 'must be an object { tank, level_m }' }).optional(),
});

export const VALVE_TYPES = ['shutoff', 'check', 'prv', 'float'] as const;

const valveLink = z.object({
  ...linkBase,
  kind: z.literal('valve'),
  valve_type: z.enum(VALVE_TYPES, { error: 'must be shutoff, check, prv or float' }),
  diameter_m: quantity('diameter_m'),
  /** Shut-off: open or closed. */
  open: flag.optional(),
  /** Pressure-reducing valve: downstream pressure setting, m of water. */
  setting_m: quantity('setting_m').optional(),
  /** Float valve: tank it feeds; closes when that tank reaches max_level_m (reopens 2 cm below). */
  tank: id.optional(),
  minor_loss: quantity('minor_loss').optional(),
});

const link = z.discriminatedUnion('kind', [pipeLink, pumpLink, valveLink], {
  error: (issue) => (issue.code === 'invalid_union' ? 'must be one of pipe, pump, valve' : 'must be an object'),
});

/** The site backdrop image, placed in world metres (editor; stored in doc.layout.backdrop). */
const backdrop = z.object({
  /** Id of the uploaded image in the project's files. */
  fileId: id,
  opacity: z.number({ error: 'must be a number' }).min(0, 'must be between 0 and 1').max(1, 'must be between 0 and 1'),
  /** World position of the image's top-left corner, m. */
  x_m: quantity('coordinate_m'),
  y_m: quantity('coordinate_m'),
  m_per_px: quantity('m_per_px'),
  width_px: quantity('pixels'),
  height_px: quantity('pixels'),
  /** The two points and the distance typed when calibrating. */
  scale: z.object({ a: point, b: point, distance_m: quantity('length_m') }).optional(),
});

/** Survey files the server reads (server/survey). */
export const SURVEY_FORMATS = ['csv', 'gpx'] as const;

/** A survey point in local site metres (editor; stored in doc.layout.survey.points). */
const surveyPoint = z.object({
  label: name.optional(),
  x_m: quantity('coordinate_m'),
  y_m: quantity('coordinate_m'),
  elevation_m: quantity('elevation_m'),
});

/** Editor-only data; ignored by the engine. Other keys (view state) are kept untyped. */
const layout = z.looseObject(
  {
    backdrop: backdrop.optional(),
    /** The last survey file applied: its name, format and points. */
    survey: z.object({ filename: name.optional(), format: z.enum(SURVEY_FORMATS).optional(), points: z.array(surveyPoint).max(100000) }).optional(),
  },
  { error: 'must be an object' },
);

export const HEADLOSS_MODELS = ['hazen-williams', 'darcy-weisbach'] as const;

export const networkDocumentSchema = z.object(
  {
    schema: z.literal(NETWORK_SCHEMA, { error: `must be "${NETWORK_SCHEMA}"` }),
    headloss: z.enum(HEADLOSS_MODELS, { error: 'must be "hazen-williams" or "darcy-weisbach"' }),
    nodes: z.array(node, { error: 'must be an array' }).max(MAX_ELEMENTS, `must hold at most ${MAX_ELEMENTS} nodes`),
    links: z.array(link, { error: 'must be an array' }).max(MAX_ELEMENTS, `must hold at most ${MAX_ELEMENTS} links`),
    /** Hourly multiplier patterns by id: 24 factors each. */
    patterns: z.record(id, hourly('factor', 'non-negative factors'), { error: 'must be an object of 24-number lists' }).optional(),
    /** Editor-only data (backdrop, survey points, view); ignored by the engine. */
    layout: layout.optional(),
    /** Free-form title / description. */
    title: notes.optional(),
  },
  { error: 'must be a JSON object' },
);

export const schemaParts = {
  node,
  link,
  sourceNode,
  tankNode,
  teeNode,
  outletNode,
  pipeLink,
  pumpLink,
  valveLink,
  demandModel,
  pumpControl,
  backdrop,
  surveyPoint,
  layout,
};
