import { FOOT_M, INCH_M, US_GALLON_M3 } from '../units';
import type { UseKind } from './budget-document';

/**
 * The one table of default water needs. Each row gives a per-unit daily need in normal and hot
 * weather and names its source with the marks of REFERENCES.md (V read in the source, V2 a
 * secondary copy quoting it, M from memory, "common practice" where none). A project may override
 * any row (BudgetDocument.rates); the screen shows whichever figure is used with its source.
 * Units inside: m³/day per head, per tree or per person; m/day (application depth) per area.
 *
 * @example
 * DEFAULT_RATES['sheep'].hot_rate // 0.014 m³/day (14 L/day, AAFC, V)
 */

const GAL = US_GALLON_M3;
const L = 1e-3;
const INCH = INCH_M;
/** 1 US gal over 1 ft² as a depth, m (3.785411784e-3 m³ / 0.09290304 m²). */
const GAL_PER_FT2 = GAL / (FOOT_M * FOOT_M);

/** What one unit of a use is counted in. */
export type RateUnit = 'per-head' | 'per-tree' | 'per-person' | 'depth' | 'fixed' | 'per-row-metre';

export interface DefaultRate {
  key: string;
  label: string;
  kind: UseKind;
  unit: RateUnit;
  /** Normal-weather daily need per unit, m³/day (or m/day for depth). */
  rate: number;
  /** Hot-weather daily need per unit (the budget's hot months). */
  hot_rate: number;
  source: string;
}

const rows: DefaultRate[] = [
  {
    key: 'beef-cow-dry',
    label: 'Beef cow, dry (1100 lb)',
    kind: 'livestock',
    unit: 'per-head',
    rate: 10.8 * GAL,
    hot_rate: 13.4 * GAL,
    source: 'Oklahoma State fact sheet as tabled by K-State: 10.8 gal/day at 65 °F, 13.4 at 90 °F (V2)',
  },
  {
    key: 'beef-cow-calf',
    label: 'Cow-calf pair',
    kind: 'livestock',
    unit: 'per-head',
    rate: 15 * GAL,
    hot_rate: 20 * GAL,
    source: 'NRCS Kansas, Design of Watering Facilities: 15–20 gal/day per pair (V2)',
  },
  {
    key: 'beef-cow-nursing',
    label: 'Beef cow, nursing',
    kind: 'livestock',
    unit: 'per-head',
    rate: 14.5 * GAL,
    hot_rate: 17.9 * GAL,
    source: 'NDSU AS1763 / K-State: lactating 900 lb cow 14.5 gal/day at 60 °F, 17.9 at 80 °F (V2)',
  },
  {
    key: 'growing-cattle-600',
    label: 'Growing cattle, 600 lb',
    kind: 'livestock',
    unit: 'per-head',
    rate: 5.3 * GAL,
    hot_rate: 5.3 * 1.5 * GAL,
    source: 'NDSU AS1763 Table 1 after NRC 2000: 5.3 gal/day at 40 °F (V2); hot value ×1.5 after the 0.75→1.5 gal/100 lb winter→summer rule (K-State, V)',
  },
  {
    key: 'dairy-cow',
    label: 'Dairy cow',
    kind: 'livestock',
    unit: 'per-head',
    rate: 15 * GAL,
    hot_rate: 30 * GAL,
    source: 'K-State Livestock Watering Handbook Table 1: dairy cows 15–30 gal/day (V)',
  },
  {
    key: 'horse',
    label: 'Horse',
    kind: 'livestock',
    unit: 'per-head',
    rate: 36 * L,
    hot_rate: 55 * L,
    source: 'Agriculture and Agri-Food Canada: horses 36 L/day winter, 55 L/day summer (V)',
  },
  {
    key: 'sheep',
    label: 'Sheep',
    kind: 'livestock',
    unit: 'per-head',
    rate: 3.6 * L,
    hot_rate: 14 * L,
    source: 'Agriculture and Agri-Food Canada: sheep 3.6 L/day winter, 14 L/day summer (V)',
  },
  {
    key: 'goat',
    label: 'Goat',
    kind: 'livestock',
    unit: 'per-head',
    rate: 2 * GAL,
    hot_rate: 2 * GAL,
    source: 'J. Renewable Energy 2017, Table 1: sheep and goats about 2 gal/day (V)',
  },
  {
    key: 'laying-hen',
    label: 'Laying hen',
    kind: 'livestock',
    unit: 'per-head',
    rate: 0.06 * GAL,
    hot_rate: 0.12 * GAL,
    source: 'J. Renewable Energy 2017, Table 1: 100 chickens 6–12 gal/day (V)',
  },
  {
    key: 'finishing-pig',
    label: 'Finishing pig',
    kind: 'livestock',
    unit: 'per-head',
    rate: 3 * GAL,
    hot_rate: 5 * GAL,
    source: 'Extension tables: finishing pigs 2–5 gal/day (M)',
  },
  {
    key: 'garden',
    label: 'Kitchen garden (drip or hand)',
    kind: 'garden',
    unit: 'depth',
    rate: 0.15 * INCH,
    hot_rate: 0.25 * INCH,
    source: 'Common practice: about 1 in a week, more in heat (M)',
  },
  {
    key: 'high-tunnel',
    label: 'High tunnel crops',
    kind: 'tunnel',
    unit: 'depth',
    rate: 0.15 * INCH,
    hot_rate: 0.3 * INCH,
    source: 'Delaware State Univ.: high-tunnel crop use 0.05 to over 0.30 in/day (V2)',
  },
  {
    key: 'greenhouse',
    label: 'Greenhouse bench or bed area',
    kind: 'tunnel',
    unit: 'depth',
    rate: 0.3 * GAL_PER_FT2,
    hot_rate: 0.4 * GAL_PER_FT2,
    source: 'UMass Extension, Sizing the Greenhouse Water System: peak 0.3–0.4 gal/ft²·day (V2)',
  },
  {
    key: 'apple-mature',
    label: 'Fruit tree, mature (large)',
    kind: 'orchard',
    unit: 'per-tree',
    rate: 30 * GAL,
    hot_rate: 50 * GAL,
    source: 'Vossen, UC Cooperative Extension: a large apple tree about 50 gal on a hot day (V2); normal-weather 30 gal is common practice (M)',
  },
  {
    key: 'fruit-young',
    label: 'Fruit tree, young',
    kind: 'orchard',
    unit: 'per-tree',
    rate: 2 * GAL,
    hot_rate: 3 * GAL,
    source: 'Vossen, UC Cooperative Extension: worked example 10 ft² canopy at 0.20 in/day ×2.5 ≈ 3 gal/day (V2); normal 2 gal (M)',
  },
  {
    key: 'household',
    label: 'Household, per person',
    kind: 'household',
    unit: 'per-person',
    rate: 60 * GAL,
    hot_rate: 75 * GAL,
    source: 'Common practice for rural homes: 50–75 gal per person per day, more with summer yard use (M)',
  },
  { key: 'other', label: 'Other fixed use', kind: 'other', unit: 'fixed', rate: 0, hot_rate: 0, source: 'Typed by the designer' },
];

/** The defaults table by key (see module doc). */
export const DEFAULT_RATES: Readonly<Record<string, DefaultRate>> = Object.freeze(Object.fromEntries(rows.map((r) => [r.key, r])));

/** Rows in table order (for pickers). */
export const DEFAULT_RATE_ROWS: readonly DefaultRate[] = rows;

/** Row used when a use names no rate_key. */
export const DEFAULT_KEY_BY_KIND: Readonly<Record<UseKind, string>> = {
  livestock: 'beef-cow-dry',
  garden: 'garden',
  tunnel: 'high-tunnel',
  orchard: 'apple-mature',
  household: 'household',
  other: 'other',
};

/** Exposed for checks: the depth that 1 US gal spreads to over 1 ft², m (≈ 1.605 in; 1 in over 1 ft² = 0.623 gal, V2). */
export const GALLON_PER_SQUARE_FOOT_M = GAL_PER_FT2;
