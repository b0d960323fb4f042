/**
 * The network document: Runnel's own JSON format for a gravity water network.
 * SI units inside (metres, seconds, m³/s). Field names are stable: saved designs and outside
 * tools depend on them. Unknown fields are ignored by the engine, so the editor may add its own
 * (names, canvas positions, bend points) without affecting hydraulics.
 *
 * @example
 * const doc: NetworkDocument = {
 *   schema: 'runnel.network/1', headloss: 'hazen-williams',
 *   nodes: [{ id: 'T1', kind: 'tank', elevation_m: 41, diameter_m: 1.6, level_m: 1.2, min_level_m: 0.1, max_level_m: 1.5 }],
 *   links: [],
 * };
 */

export const NETWORK_SCHEMA = 'runnel.network/1';

export type HeadlossModel = 'hazen-williams' | 'darcy-weisbach';

/** Fields every node may carry. x_m/y_m are site-plan coordinates (metres, y up) used by the editor. */
export interface NodeBase {
  id: string;
  name?: string;
  elevation_m: number;
  x_m?: number;
  y_m?: number;
  notes?: string;
}

/** A fixed water surface: spring box, creek intake or well (head_m = water surface elevation). */
export interface SourceNode extends NodeBase {
  kind: 'source';
  head_m: number;
  /** 'spring' | 'creek' | 'well' — display only. */
  source_type?: string;
}

/** A cylindrical storage tank; levels are measured from the tank floor at elevation_m. */
export interface TankNode extends NodeBase {
  kind: 'tank';
  diameter_m: number;
  level_m: number;
  min_level_m: number;
  max_level_m: number;
  /** Steady inflow from outside the network (a spring trickling into a cistern), m³/s; used by simulate. */
  inflow_m3s?: number;
  /** Tanks sharing a bank id are drawn joined by a header (display grouping only). */
  bank?: string;
}

/** A branch point; may carry a demand. */
export interface TeeNode extends NodeBase {
  kind: 'tee';
  demand_m3s: number;
  /** Id of an hourly pattern in doc.patterns multiplying demand_m3s. */
  pattern?: string;
}

export type OutletType = 'hose-bib' | 'trough' | 'drip-zone' | 'sprinkler' | 'house' | 'other';

/**
 * How an outlet's flow depends on pressure.
 * - fixed: always demand_m3s (when supply allows).
 * - pressure-dependent: full demand at required_pressure_m falling smoothly to zero at min_pressure_m
 *   (Wagner et al. 1988 style pressure-driven demand).
 * - emitter: q = k · p^exponent (p in metres of water, q in m³/s).
 */
export type DemandModel =
  | { type: 'fixed' }
  | { type: 'pressure-dependent'; required_pressure_m: number; zero_pressure_m?: number }
  | { type: 'emitter'; k: number; exponent: number };

export interface OutletNode extends NodeBase {
  kind: 'outlet';
  demand_m3s: number;
  /** Minimum pressure the device needs, m of water; drives the below-minimum check. */
  min_pressure_m?: number;
  outlet_type?: OutletType;
  demand_model?: DemandModel;
  pattern?: string;
  /**
   * Trough with a float valve. The valve passes what the stock drink, so the outlet draws its
   * (patterned) demand_m3s like any outlet; the flag is descriptive (takeoff, review).
   */
  float_valve?: boolean;
}

export type NetworkNode = SourceNode | TankNode | TeeNode | OutletNode;
export type NodeKind = NetworkNode['kind'];

/** Fields every link may carry. vertices are editor bend points [[x_m, y_m], …]. */
export interface LinkBase {
  id: string;
  name?: string;
  from: string;
  to: string;
  vertices?: [number, number][];
  notes?: string;
}

export interface PipeLink extends LinkBase {
  kind: 'pipe';
  length_m: number;
  /** Inside diameter, m. */
  diameter_m: number;
  /** Hazen-Williams C, or absolute roughness in mm under Darcy-Weisbach. */
  roughness: number;
  /** Sum of minor-loss coefficients K (dimensionless, default 0). */
  minor_loss?: number;
  /** Catalogue reference (engine/pipe-catalogue.ts): material/series id and nominal size. */
  material?: string;
  series?: string;
  nominal?: string;
  /** Pressure rating, m of water; drives the over-rating check. */
  rating_m?: number;
  /** Ground profile along the pipe [[distance_m from `from`, ground elevation_m], …]. */
  profile?: [number, number][];
  /** Burial depth below the ground profile, m (default 0.45). */
  cover_m?: number;
  /** Initially closed (a pipe with a shut-off). */
  closed?: boolean;
}

export interface PumpControl {
  /** Tank whose level controls the pump. */
  tank: string;
  /** Stop when the tank level reaches this, m. */
  stop_level_m: number;
  /** Restart when the tank level falls to this, m. */
  start_level_m: number;
}

export interface PumpLink extends LinkBase {
  kind: 'pump';
  /** Constant delivered flow (positive-displacement or fill pump), m³/s; used when no curve is given. */
  flow_m3s?: number;
  /** Head–flow curve [[flow_m3s, head_m], …] with head falling as flow rises. */
  curve?: [number, number][];
  /**
   * 24 hourly availability factors 0..1 (a solar pump's daylight profile), used by simulate: they
   * scale a constant-flow pump's flow, or a curve pump's speed (affinity laws). Steady solves run
   * pumps at full availability.
   */
  schedule?: number[];
  control?: PumpControl;
  /** Low-water cut-off on the tank the pump draws from: stop below this level, m. */
  low_cutoff?: { tank: string; level_m: number };
}

export type ValveType = 'shutoff' | 'check' | 'prv' | 'float';

export interface ValveLink extends LinkBase {
  kind: 'valve';
  valve_type: ValveType;
  diameter_m: number;
  /** Shut-off: open or closed. */
  open?: boolean;
  /** Pressure-reducing valve: downstream pressure setting, m of water. */
  setting_m?: number;
  /** Float valve: tank it feeds; closes when that tank reaches max_level_m (reopens 2 cm below). */
  tank?: string;
  minor_loss?: number;
}

export type NetworkLink = PipeLink | PumpLink | ValveLink;
export type LinkKind = NetworkLink['kind'];

export interface NetworkDocument {
  schema: typeof NETWORK_SCHEMA;
  headloss: HeadlossModel;
  nodes: NetworkNode[];
  links: NetworkLink[];
  /** Hourly multiplier patterns by id: 24 factors each. */
  patterns?: Record<string, number[]>;
  /** Editor-only data (backdrop, scale, view); ignored by the engine. */
  layout?: Record<string, unknown>;
  /** Free-form title / description. */
  title?: string;
}
