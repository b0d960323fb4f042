import type { HeadlossModel } from './network-document';
import { FOOT_M, INCH_M, PSI_PER_METRE_OF_WATER } from './units';

/**
 * Plastic pipe catalogue: dimensions and pressure ratings of the common farm-water series.
 * Sources (marks as in REFERENCES.md):
 * - PVC Schedule 40, ASTM D1785: OD, minimum wall, nominal ID and rating at 73 °F for 1/2"–2" (V2);
 *   2-1/2", 3", 4" (M, from memory of the same table).
 * - PVC SDR 21 / SDR 26, ASTM D2241: same ODs as Schedule 40 (V2), wall = OD/SDR with a 0.060 in
 *   minimum (C/M), ratings 200 / 160 psi (V2).
 * - PE SIDR 7 / 9 / 11.5 / 15, ASTM D2239 (PE3608): inside diameter controlled, equal to the
 *   Schedule 40 IDs (M), wall = ID/SIDR (C), rating P = 2S/(SIDR + 1) (V2, NRCS National Engineering Handbook).
 * - PE DR 11, ASTM D3035 (PE4710 and PE3608): iron-pipe-size OD (V2), wall = OD/DR (C),
 *   rating P = 2S/(DR − 1) (V2) = 200 / 160 psi (V, Plastics Pipe Institute).
 * Hydrostatic design stresses S (HDS at 73 °F): PVC 1120 2000 psi (V, Moser, Buried Pipe Design);
 * PE4710 1000 psi, PE3608 800 psi (V, Plastics Pipe Institute). Ratings are for 73 °F water;
 * warmer water derates plastic pipe (common practice) — defer to the maker's tables and local code.
 *
 * @example
 * pipeSizes('pe-dr11-pe4710').find((s) => s.nominal === '1"')?.id_m // 0.02631 m
 * findPipeSize('pvc-sch40', '1"')?.rating_psi // 450
 * defaultRoughness('pvc', 'hazen-williams') // 150
 */

export type PipeMaterial = 'pvc' | 'pe';

export interface PipeSeries {
  id: string;
  label: string;
  material: PipeMaterial;
  standard: string;
  /** Which diameter the standard holds fixed. */
  control: 'OD' | 'ID';
  /** Dimension ratio (OD/wall for OD-controlled, ID/wall for ID-controlled); absent for Schedule 40. */
  ratio?: number;
  /** Hydrostatic design stress at 73 °F, psi. */
  hds_psi: number;
}

export interface PipeSize {
  nominal: string;
  od_m: number;
  wall_m: number;
  id_m: number;
  od_in: number;
  wall_in: number;
  id_in: number;
  rating_psi: number;
  rating_m: number;
}

const INCH = INCH_M;

/** Iron-pipe-size outside diameters, in (ASTM D1785/D2241/D3035 share them). */
export const IPS_OD_IN: Record<string, number> = {
  '1/2"': 0.84,
  '3/4"': 1.05,
  '1"': 1.315,
  '1-1/4"': 1.66,
  '1-1/2"': 1.9,
  '2"': 2.375,
  '2-1/2"': 2.875,
  '3"': 3.5,
  '4"': 4.5,
};

/** ASTM D1785 Schedule 40: [minimum wall in, nominal ID in, rating psi]. */
const SCH40: Record<string, [number, number, number]> = {
  '1/2"': [0.109, 0.622, 600],
  '3/4"': [0.113, 0.824, 480],
  '1"': [0.133, 1.049, 450],
  '1-1/4"': [0.14, 1.38, 370],
  '1-1/2"': [0.145, 1.61, 330],
  '2"': [0.154, 2.067, 280],
  '2-1/2"': [0.203, 2.469, 300],
  '3"': [0.216, 3.068, 260],
  '4"': [0.237, 4.026, 220],
};

export const pipeSeries: readonly PipeSeries[] = [
  { id: 'pvc-sch40', label: 'PVC Schedule 40', material: 'pvc', standard: 'ASTM D1785', control: 'OD', hds_psi: 2000 },
  { id: 'pvc-sdr21', label: 'PVC SDR 21 (200 psi)', material: 'pvc', standard: 'ASTM D2241', control: 'OD', ratio: 21, hds_psi: 2000 },
  { id: 'pvc-sdr26', label: 'PVC SDR 26 (160 psi)', material: 'pvc', standard: 'ASTM D2241', control: 'OD', ratio: 26, hds_psi: 2000 },
  { id: 'pe-sidr7', label: 'PE3608 SIDR 7', material: 'pe', standard: 'ASTM D2239', control: 'ID', ratio: 7, hds_psi: 800 },
  { id: 'pe-sidr9', label: 'PE3608 SIDR 9', material: 'pe', standard: 'ASTM D2239', control: 'ID', ratio: 9, hds_psi: 800 },
  { id: 'pe-sidr11.5', label: 'PE3608 SIDR 11.5', material: 'pe', standard: 'ASTM D2239', control: 'ID', ratio: 11.5, hds_psi: 800 },
  { id: 'pe-sidr15', label: 'PE3608 SIDR 15', material: 'pe', standard: 'ASTM D2239', control: 'ID', ratio: 15, hds_psi: 800 },
  { id: 'pe-dr11-pe4710', label: 'PE4710 DR 11 (IPS)', material: 'pe', standard: 'ASTM D3035', control: 'OD', ratio: 11, hds_psi: 1000 },
  { id: 'pe-dr11-pe3608', label: 'PE3608 DR 11 (IPS)', material: 'pe', standard: 'ASTM D3035', control: 'OD', ratio: 11, hds_psi: 800 },
];

/** Minimum wall of ASTM D2241 pipe, in (M). */
const D2241_MIN_WALL_IN = 0.06;

/**
 * Pressure rating, psi: 2S/(DR − 1) for OD-controlled, 2S/(SIDR + 1) for ID-controlled pipe
 * (V2, NRCS National Engineering Handbook). S = hydrostatic design stress, psi.
 * @example pressureRatingPsi(1000, 11, 'OD') // 200 (PE4710 DR 11)
 */
export function pressureRatingPsi(hds_psi: number, ratio: number, control: 'OD' | 'ID'): number {
  return (2 * hds_psi) / (control === 'OD' ? ratio - 1 : ratio + 1);
}

const SERIES_SIZES: Record<string, string[]> = {
  'pvc-sch40': Object.keys(SCH40),
  'pvc-sdr21': ['3/4"', '1"', '1-1/4"', '1-1/2"', '2"', '2-1/2"', '3"', '4"'],
  'pvc-sdr26': ['1"', '1-1/4"', '1-1/2"', '2"', '2-1/2"', '3"', '4"'],
  'pe-sidr7': ['1/2"', '3/4"', '1"', '1-1/4"', '1-1/2"', '2"', '3"', '4"'],
  'pe-sidr9': ['1/2"', '3/4"', '1"', '1-1/4"', '1-1/2"', '2"', '3"', '4"'],
  'pe-sidr11.5': ['1/2"', '3/4"', '1"', '1-1/4"', '1-1/2"', '2"', '3"', '4"'],
  'pe-sidr15': ['1/2"', '3/4"', '1"', '1-1/4"', '1-1/2"', '2"', '3"', '4"'],
  'pe-dr11-pe4710': ['1/2"', '3/4"', '1"', '1-1/4"', '1-1/2"', '2"', '3"', '4"'],
  'pe-dr11-pe3608': ['1/2"', '3/4"', '1"', '1-1/4"', '1-1/2"', '2"', '3"', '4"'],
};

function size(nominal: string, odIn: number, wallIn: number, idIn: number, psi: number): PipeSize {
  return {
    nominal,
    od_in: odIn,
    wall_in: wallIn,
    id_in: idIn,
    od_m: odIn * INCH,
    wall_m: wallIn * INCH,
    id_m: idIn * INCH,
    rating_psi: psi,
    rating_m: psi / PSI_PER_METRE_OF_WATER,
  };
}

/**
 * Sizes of a series, smallest first ([] for an unknown series id).
 * @example pipeSizes('pvc-sch40').map((s) => s.nominal) // ['1/2"', …, '4"']
 */
export function pipeSizes(seriesId: string): PipeSize[] {
  const series = pipeSeries.find((s) => s.id === seriesId);
  if (!series) return [];
  return (SERIES_SIZES[seriesId] ?? []).map((nominal) => {
    if (seriesId === 'pvc-sch40') {
      const [wall, id, psi] = SCH40[nominal];
      return size(nominal, IPS_OD_IN[nominal], wall, id, psi);
    }
    const ratio = series.ratio ?? 1;
    const psi = Math.round(pressureRatingPsi(series.hds_psi, ratio, series.control));
    if (series.control === 'ID') {
      const id = SCH40[nominal][1];
      const wall = id / ratio;
      return size(nominal, id + 2 * wall, wall, id, psi);
    }
    const od = IPS_OD_IN[nominal];
    const wall = series.standard === 'ASTM D2241' ? Math.max(od / ratio, D2241_MIN_WALL_IN) : od / ratio;
    return size(nominal, od, wall, od - 2 * wall, psi);
  });
}

/** One size of a series, or undefined. @example findPipeSize('pe-sidr9', '1"')?.id_m // 0.02664 */
export function findPipeSize(seriesId: string, nominal: string): PipeSize | undefined {
  return pipeSizes(seriesId).find((s) => s.nominal === nominal);
}

/**
 * Default roughness for a material under a headloss model: Hazen-Williams C (PVC 150, V2 Uni-Bell;
 * PE 140, Engineering ToolBox — PPI quotes up to 150), or Darcy-Weisbach ε in mm (PVC 0.0015,
 * PE 0.007; M, common handbook values for smooth plastic).
 * @example defaultRoughness('pe', 'darcy-weisbach') // 0.007
 */
export function defaultRoughness(material: PipeMaterial | string, headloss: HeadlossModel): number {
  const pe = material === 'pe' || material.startsWith('pe');
  if (headloss === 'darcy-weisbach') return pe ? 0.007 : 0.0015;
  return pe ? 140 : 150;
}

/** How the trade sells a series: coils or sticks of a length, joined by couplings or by bells. */
export interface PurchaseUnit {
  unit: 'coil' | 'stick';
  length_m: number;
  /** Length as sold, in feet (what the store's label says). */
  length_ft: number;
  /** Joint between pieces: an insert/compression coupling, or a belled end (no fitting to buy). */
  joint: 'coupling' | 'bell';
}

const FT = FOOT_M;
/** Nominal sizes up to 1" in coils of 300 ft, larger PE in coils of 100 ft, 3"–4" PE in 40 ft sticks (common trade practice, M). */
const SMALL_PE = new Set(['1/2"', '3/4"', '1"']);

/**
 * Purchase unit of a catalogue item (common trade practice, M): PE (D2239, D3035) in coils of
 * 300 ft (≤ 1") or 100 ft (1-1/4"–2"), 3"–4" PE in 40 ft sticks, all joined by couplings; PVC in
 * 20 ft sticks, Schedule 40 plain-end (couplings), D2241 SDR belled (no coupling to buy).
 * @example purchaseUnit('pe-sidr9', '1"') // { unit: 'coil', length_ft: 300, length_m: 91.44, joint: 'coupling' }
 */
export function purchaseUnit(seriesId: string, nominal: string): PurchaseUnit {
  const series = pipeSeries.find((s) => s.id === seriesId);
  const make = (unit: 'coil' | 'stick', ft: number, joint: 'coupling' | 'bell'): PurchaseUnit => ({
    unit,
    length_ft: ft,
    length_m: Math.round(ft * FT * 1e4) / 1e4,
    joint,
  });
  if (series?.material === 'pe') {
    if (SMALL_PE.has(nominal)) return make('coil', 300, 'coupling');
    if (nominal === '3"' || nominal === '4"') return make('stick', 40, 'coupling');
    return make('coil', 100, 'coupling');
  }
  return make('stick', 20, series?.standard === 'ASTM D2241' ? 'bell' : 'coupling');
}

export type FittingKind =
  | 'tee'
  | 'reducer'
  | 'elbow-90'
  | 'elbow-45'
  | 'coupling'
  | 'tank-adapter'
  | 'pump-adapter'
  | 'valve-shutoff'
  | 'valve-check'
  | 'valve-prv'
  | 'valve-float'
  | 'air-release-valve'
  | 'drain-valve';

/**
 * Fittings the takeoff counts, with the loss coefficient K used for a pipe's minor-loss
 * allowance. K values are common handbook values in the form tabulated by Crane Technical Paper
 * 410 (M, from memory; threaded/solvent fittings vary by maker): tee 0.4 along the run, 1.5 through
 * the branch; standard 90° elbow 0.9, 45° elbow 0.4; reducer (contraction) 0.5; insert coupling
 * 0.1; tank outlet (sharp entrance) 0.5; open gate-type shut-off 0.2; swing check 2.0; float valve
 * wide open 3.0 (M). Air-release valves and drains sit off the flow and add none.
 */
export const FITTINGS: Record<FittingKind, { label: string; k: number; kBranch?: number }> = {
  tee: { label: 'Tee', k: 0.4, kBranch: 1.5 },
  reducer: { label: 'Reducer', k: 0.5 },
  'elbow-90': { label: 'Elbow 90°', k: 0.9 },
  'elbow-45': { label: 'Elbow 45°', k: 0.4 },
  coupling: { label: 'Coupling', k: 0.1 },
  'tank-adapter': { label: 'Tank adapter (bulkhead)', k: 0.5 },
  'pump-adapter': { label: 'Pump adapter', k: 0 },
  'valve-shutoff': { label: 'Shut-off valve', k: 0.2 },
  'valve-check': { label: 'Check valve', k: 2 },
  'valve-prv': { label: 'Pressure-reducing valve', k: 0 },
  'valve-float': { label: 'Float valve', k: 3 },
  'air-release-valve': { label: 'Air-release valve', k: 0 },
  'drain-valve': { label: 'Drain valve', k: 0 },
};

/**
 * Price-list code of a fitting of a size (`tee/1"`, `reducer/1-1/2"x1"`).
 * @example fittingCode('tee', '1"') // 'tee/1"'
 */
export function fittingCode(kind: FittingKind, size: string): string {
  return `${kind}/${size}`;
}

/**
 * Nearest catalogue nominal size to an inside diameter (for valves and custom pipes), or the
 * diameter in millimetres when nothing is within 15 %.
 * @example nominalForDiameter(0.0266) // '1"'
 */
export function nominalForDiameter(diameter_m: number): string {
  let best = '';
  let gap = Infinity;
  for (const [nominal, [, id]] of Object.entries(SCH40)) {
    const g = Math.abs(id * INCH - diameter_m) / diameter_m;
    if (g < gap) {
      gap = g;
      best = nominal;
    }
  }
  return gap <= 0.15 ? best : `${Math.round(diameter_m * 1000)} mm`;
}
