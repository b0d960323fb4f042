import { US_GALLON_M3 } from '../units';

/**
 * A house's peak flow from its fixtures, by water-supply fixture units (the probable-demand method
 * of the plumbing codes' appendices): each fixture counts its load in fixture units, the total is
 * read off the demand table for supply systems with flush tanks, never below the largest single
 * fixture's own flow. Sources, with the marks of REFERENCES.md:
 * - fixture flows and minimum pressures: IPC 2018 Table 604.3 (V2 for hose bibb, shower, tank
 *   toilet, lavatory and sink; M for the rest);
 * - fixture units (private use, hot and cold together): IPC Appendix E Table E103.3(2) (M, from memory);
 * - demand from fixture units, flush-tank systems: IPC Appendix E Table E103.3(3) (M, from memory).
 * The daily volume stays per person (./defaults "household"): fixture units size the peak, not the day.
 *
 * @example
 * fixturePeak({ 'toilet-tank': 1, lavatory: 1, shower: 1, 'kitchen-sink': 1, 'clothes-washer': 1, 'hose-bibb': 1 })
 * // { fixture_units: 9.6, flow_m3s: ≈ 14.2 gpm, min_pressure_m: 20 psi (tank toilet) }
 */

const GPM = US_GALLON_M3 / 60;
/** 1 psi as metres of water (2.31 ft per psi, REFERENCES.md, V). */
const PSI_M = 0.70307;

export type FixtureKey = 'toilet-tank' | 'lavatory' | 'shower' | 'bathtub' | 'kitchen-sink' | 'dishwasher' | 'clothes-washer' | 'laundry-tray' | 'hose-bibb';

export interface Fixture {
  key: FixtureKey;
  label: string;
  /** Water-supply fixture units, private use (Table E103.3(2), M). */
  fixture_units: number;
  /** Flow the fixture draws, m³/s (Table 604.3). */
  flow_m3s: number;
  /** Minimum pressure at the fixture, m of water (Table 604.3). */
  min_pressure_m: number;
  source: string;
}

const row = (key: FixtureKey, label: string, wsfu: number, gpm: number, psi: number, source: string): Fixture => ({
  key,
  label,
  fixture_units: wsfu,
  flow_m3s: gpm * GPM,
  min_pressure_m: psi * PSI_M,
  source,
});

const FU = 'fixture units IPC Table E103.3(2), M';
export const FIXTURES: readonly Fixture[] = [
  row('toilet-tank', 'Toilet, tank type', 2.2, 3, 20, `IPC 2018 Table 604.3: 3 gpm at 20 psi (V2); ${FU}`),
  row('lavatory', 'Wash basin (lavatory)', 0.7, 0.8, 8, `IPC 2018 Table 604.3: 0.8 gpm at 8 psi (V2); ${FU}`),
  row('shower', 'Shower', 1.4, 2.5, 8, `IPC 2018 Table 604.3: 2.5 gpm at 8 psi, 20 psi with a balanced-pressure valve (V2); ${FU}`),
  row('bathtub', 'Bathtub', 1.4, 4, 8, `IPC Table 604.3: 4 gpm at 8 psi (M); ${FU}`),
  row('kitchen-sink', 'Kitchen sink', 1.4, 1.75, 8, `IPC 2018 Table 604.3: sink 1.75 gpm at 8 psi (V2); ${FU}`),
  row('dishwasher', 'Dishwasher', 1.4, 2.75, 8, `IPC Table 604.3: 2.75 gpm at 8 psi (M); ${FU}`),
  row('clothes-washer', 'Clothes washer', 1.4, 4, 8, `IPC Table 604.3: 4 gpm at 8 psi (M); ${FU}`),
  row('laundry-tray', 'Laundry tub', 1.4, 4, 8, `IPC Table 604.3: 4 gpm at 8 psi (M); ${FU}`),
  row('hose-bibb', 'Hose bibb (outdoor tap)', 2.5, 5, 8, `IPC 2018 Table 604.3: 5 gpm at 8 psi (V2); ${FU}: 2.5, each further one 1.0`),
];
export const FIXTURE_BY_KEY: Readonly<Record<FixtureKey, Fixture>> = Object.freeze(
  Object.fromEntries(FIXTURES.map((f) => [f.key, f])) as Record<FixtureKey, Fixture>,
);

/** Demand table for flush-tank systems: [fixture units, gpm] (IPC Table E103.3(3), M). */
const DEMAND: readonly [number, number][] = [
  [1, 3.0],
  [2, 5.0],
  [3, 6.5],
  [4, 8.0],
  [5, 9.4],
  [6, 10.7],
  [7, 11.8],
  [8, 12.8],
  [9, 13.7],
  [10, 14.6],
  [11, 15.4],
  [12, 16.0],
  [13, 16.5],
  [14, 17.0],
  [15, 17.5],
  [16, 18.0],
  [17, 18.4],
  [18, 18.8],
  [19, 19.2],
  [20, 19.6],
  [25, 21.5],
  [30, 23.3],
  [35, 24.9],
  [40, 26.3],
  [45, 27.7],
  [50, 29.1],
  [60, 32.0],
  [70, 35.0],
  [80, 38.0],
  [90, 41.0],
  [100, 43.5],
];
/** Largest load the table here covers; a bigger building needs the code's full table and a plumber. */
export const MAX_FIXTURE_UNITS = 100;
export const FIXTURE_METHOD_SOURCE =
  'water-supply fixture units and the flush-tank demand table, IPC Appendix E Tables E103.3(2) and E103.3(3) (M, from memory); fixture flows IPC 2018 Table 604.3 (V2)';

export interface FixturePeak {
  fixture_units: number;
  /** Probable peak flow of the house, m³/s. */
  flow_m3s: number;
  /** The highest minimum pressure among its fixtures, m of water, and which fixture asks it. */
  min_pressure_m: number;
  min_pressure_for: string;
}

/** Fixture units of a set of fixtures (a second and later hose bibb count 1.0 each, Table E103.3(2), M). */
export function fixtureUnits(counts: Partial<Record<FixtureKey, number>>): number {
  let total = 0;
  for (const f of FIXTURES) {
    const n = counts[f.key] ?? 0;
    if (n <= 0) continue;
    total += f.key === 'hose-bibb' ? f.fixture_units + (n - 1) * 1.0 : n * f.fixture_units;
  }
  return Math.round(total * 1000) / 1000;
}

/** Demand in m³/s read off the table, linear between its rows; NaN beyond MAX_FIXTURE_UNITS. */
export function demandFromFixtureUnits(units: number): number {
  if (units <= 0) return 0;
  if (units > MAX_FIXTURE_UNITS) return Number.NaN;
  if (units <= DEMAND[0][0]) return DEMAND[0][1] * GPM;
  for (let i = 1; i < DEMAND.length; i++) {
    const [u1, q1] = DEMAND[i];
    if (units <= u1) {
      const [u0, q0] = DEMAND[i - 1];
      return (q0 + ((q1 - q0) * (units - u0)) / (u1 - u0)) * GPM;
    }
  }
  return Number.NaN;
}

export function fixturePeak(counts: Partial<Record<FixtureKey, number>>): FixturePeak {
  const units = fixtureUnits(counts);
  const present = FIXTURES.filter((f) => (counts[f.key] ?? 0) > 0);
  const largest = Math.max(0, ...present.map((f) => f.flow_m3s));
  // below one fixture unit the table does not apply: one fixture draws its own flow
  const table = units >= 1 ? demandFromFixtureUnits(units) : 0;
  const highest = present.reduce<Fixture | null>((a, f) => (!a || f.min_pressure_m > a.min_pressure_m ? f : a), null);
  return { fixture_units: units, flow_m3s: Math.max(table, largest), min_pressure_m: highest?.min_pressure_m ?? 0, min_pressure_for: highest?.label ?? '' };
}
