/**
 * Unit conversion for display: the single place where SI ⇄ US customary factors live.
 * The document and the engine are SI; screens show US customary by default, SI by a setting.
 * Factors are exact by definition (NIST SP 811) except where noted.
 *
 * @example
 * toDisplay('length', 30.48, 'us') // → 100 (ft)
 * fromDisplay('pressure', 10, 'us') // → 7.03 m of water (10 psi)
 */

export type UnitSystem = 'us' | 'si';
export type Quantity =
  | 'length'
  | 'elevation'
  | 'diameter'
  | 'flow'
  | 'pressure'
  | 'head'
  | 'velocity'
  | 'volume'
  | 'area'
  | 'headloss-gradient'
  | 'daily-volume'
  | 'depth-rate'
  | 'duration'
  | 'emitter-flow';

/** International foot, m (exact). Other files take unit factors from here, never retyped. */
export const FOOT_M = 0.3048;
/** Inch, m (exact). */
export const INCH_M = 0.0254;
/** US gallon, m³ (exact). */
export const US_GALLON_M3 = 3.785411784e-3;
/** psi per metre of water column at about 4–20 °C: 1 m H2O = 9806.65 Pa; 1 psi = 6894.757 Pa. */
const PSI_PER_M_WATER = 9806.65 / 6894.757293168;

interface UnitDef {
  label: string;
  fromSi: (v: number) => number;
  toSi: (v: number) => number;
  digits: number;
}

const TABLE: Record<Quantity, Record<UnitSystem, UnitDef>> = {
  length: {
    us: { label: 'ft', fromSi: (v) => v / FOOT_M, toSi: (v) => v * FOOT_M, digits: 0 },
    si: { label: 'm', fromSi: (v) => v, toSi: (v) => v, digits: 1 },
  },
  elevation: {
    us: { label: 'ft', fromSi: (v) => v / FOOT_M, toSi: (v) => v * FOOT_M, digits: 1 },
    si: { label: 'm', fromSi: (v) => v, toSi: (v) => v, digits: 2 },
  },
  diameter: {
    us: { label: 'in', fromSi: (v) => v / INCH_M, toSi: (v) => v * INCH_M, digits: 3 },
    si: { label: 'mm', fromSi: (v) => v * 1000, toSi: (v) => v / 1000, digits: 1 },
  },
  flow: {
    us: { label: 'gpm', fromSi: (v) => (v / US_GALLON_M3) * 60, toSi: (v) => (v * US_GALLON_M3) / 60, digits: 2 },
    si: { label: 'L/s', fromSi: (v) => v * 1000, toSi: (v) => v / 1000, digits: 3 },
  },
  pressure: {
    us: { label: 'psi', fromSi: (v) => v * PSI_PER_M_WATER, toSi: (v) => v / PSI_PER_M_WATER, digits: 1 },
    si: { label: 'kPa', fromSi: (v) => v * 9.80665, toSi: (v) => v / 9.80665, digits: 0 },
  },
  head: {
    us: { label: 'ft', fromSi: (v) => v / FOOT_M, toSi: (v) => v * FOOT_M, digits: 1 },
    si: { label: 'm', fromSi: (v) => v, toSi: (v) => v, digits: 2 },
  },
  velocity: {
    us: { label: 'ft/s', fromSi: (v) => v / FOOT_M, toSi: (v) => v * FOOT_M, digits: 2 },
    si: { label: 'm/s', fromSi: (v) => v, toSi: (v) => v, digits: 2 },
  },
  volume: {
    us: { label: 'gal', fromSi: (v) => v / US_GALLON_M3, toSi: (v) => v * US_GALLON_M3, digits: 0 },
    si: { label: 'L', fromSi: (v) => v * 1000, toSi: (v) => v / 1000, digits: 0 },
  },
  area: {
    us: { label: 'ft²', fromSi: (v) => v / (FOOT_M * FOOT_M), toSi: (v) => v * FOOT_M * FOOT_M, digits: 1 },
    si: { label: 'm²', fromSi: (v) => v, toSi: (v) => v, digits: 2 },
  },
  /** Water use per day (budget): m³/day inside. */
  'daily-volume': {
    us: { label: 'gal/day', fromSi: (v) => v / US_GALLON_M3, toSi: (v) => v * US_GALLON_M3, digits: 0 },
    si: { label: 'L/day', fromSi: (v) => v * 1000, toSi: (v) => v / 1000, digits: 0 },
  },
  /** Application depth per day (garden, tunnel): m/day inside; 1 in/day over 1 ft² = 0.623 gal/day. */
  'depth-rate': {
    us: { label: 'in/day', fromSi: (v) => v / INCH_M, toSi: (v) => v * INCH_M, digits: 2 },
    si: { label: 'mm/day', fromSi: (v) => v * 1000, toSi: (v) => v / 1000, digits: 1 },
  },
  /** Time spans (windows, reserve): hours in both systems. */
  duration: {
    us: { label: 'h', fromSi: (v) => v / 3600, toSi: (v) => v * 3600, digits: 1 },
    si: { label: 'h', fromSi: (v) => v / 3600, toSi: (v) => v * 3600, digits: 1 },
  },
  /** A drip emitter's flow: m³/s inside, shown per hour (gph, L/h) as emitters are sold. */
  'emitter-flow': {
    us: { label: 'gph', fromSi: (v) => (v / US_GALLON_M3) * 3600, toSi: (v) => (v * US_GALLON_M3) / 3600, digits: 2 },
    si: { label: 'L/h', fromSi: (v) => v * 3.6e6, toSi: (v) => v / 3.6e6, digits: 2 },
  },
  'headloss-gradient': {
    us: { label: 'ft/100 ft', fromSi: (v) => v * 100, toSi: (v) => v / 100, digits: 2 },
    si: { label: 'm/100 m', fromSi: (v) => v * 100, toSi: (v) => v / 100, digits: 2 },
  },
};

export function unitLabel(q: Quantity, system: UnitSystem): string {
  return TABLE[q][system].label;
}

/** Decimal places a value of this quantity is shown with (screens and the exported workbook). */
export function unitDigits(q: Quantity, system: UnitSystem): number {
  return TABLE[q][system].digits;
}

/** SI value → number in the display system. */
export function toDisplay(q: Quantity, si: number, system: UnitSystem): number {
  return TABLE[q][system].fromSi(si);
}

/** Number typed in the display system → SI value. */
export function fromDisplay(q: Quantity, shown: number, system: UnitSystem): number {
  return TABLE[q][system].toSi(shown);
}

/** Formatted value with its unit, e.g. "42.3 psi" or "6,932 L/day" (thousands grouped so large volumes read at a glance). */
export function formatQuantity(q: Quantity, si: number, system: UnitSystem, digits?: number): string {
  const def = TABLE[q][system];
  const value = def.fromSi(si);
  if (!Number.isFinite(value)) return `— ${def.label}`;
  return `${groupThousands(value.toFixed(digits ?? def.digits))} ${def.label}`;
}

/** "-12345.60" → "-12,345.60": commas between thousands of the whole part only (English-language screens). */
export function groupThousands(fixed: string): string {
  const [whole, fraction] = fixed.split('.');
  const grouped = whole.replace(/\B(?=(\d{3})+(?!\d))/g, ',');
  return fraction === undefined ? grouped : `${grouped}.${fraction}`;
}

export const PSI_PER_METRE_OF_WATER = PSI_PER_M_WATER;
