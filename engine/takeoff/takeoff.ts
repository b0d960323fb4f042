import type { NetworkDocument, PipeLink } from '../network-document';
import { FITTINGS, fittingCode, pipeSeries, purchaseUnit } from '../pipe-catalogue';
import { networkTurningPoints } from '../profile/network-points';
import { solve, type SteadyResult } from '../steady';
import { pipeKey } from '../sizing/price-catalogue';
import { countFittings, linkSize, type CountedFitting } from './fittings';

/**
 * The material takeoff: quantities derived from the network, never typed.
 * - pipe: length by series (material and class) and size, plus the waste allowance, bought in
 *   whole coils or sticks (../pipe-catalogue purchaseUnit); the joints inside each run that is
 *   longer than one piece need couplings (none for belled pipe);
 * - fittings (./fittings): tees, reducers, elbows, tank and pump adapters;
 * - valves by kind and size; float valves at troughs (outlets with float_valve);
 * - air-release valves at high points and drains at low points of every supply route, from the
 *   route profiles of ../profile (the profile engine's findings, NRCS WA Eng. Tech. Note 16, V2);
 * - tanks and pumps; and the estimator's "other" list (trenching per metre of pipe, thrust
 *   blocks, anything else), a quantity or a rate per metre of pipe.
 * Every row has a price-list code (`pe-sidr9/1"`, `tee/1"`, `other/trenching`) and the elements it
 * comes from. Lengths in metres.
 *
 * @example
 * const t = takeoff(hillSmallholding, { waste_fraction: 0.05 });
 * t.rows.filter((r) => r.group === 'pipe').map((r) => [r.code, r.network_m])
 */

export interface OtherItem {
  code: string;
  description: string;
  unit: string;
  /** A fixed quantity … */
  quantity?: number;
  /** … or this many units per metre of pipe in the network (trenching: 1 m per m). */
  per_pipe_m?: number;
}

export interface TakeoffSettings {
  /** Extra pipe bought for cuts and offcuts, a fraction (default 0.05). */
  waste_fraction?: number;
  /** Bends sharper than this get an elbow, degrees (default 30). */
  bendAngle_deg?: number;
  other?: OtherItem[];
}

export type TakeoffGroup = 'pipe' | 'fitting' | 'valve' | 'tank' | 'pump' | 'other';

export interface TakeoffRow {
  code: string;
  group: TakeoffGroup;
  description: string;
  quantity: number;
  unit: string;
  /** Elements (pipes, nodes) the row comes from. */
  elements: string[];
  /** Pipe rows: network length, length with waste, pieces bought and their length, m. */
  network_m?: number;
  with_waste_m?: number;
  pieces?: number;
  piece_m?: number;
  piece_unit?: 'coil' | 'stick' | 'm';
  note?: string;
}

export interface Takeoff {
  rows: TakeoffRow[];
  fittings: CountedFitting[];
  /** Total pipe length in the network, m. */
  pipe_m: number;
  settings: Required<Pick<TakeoffSettings, 'waste_fraction' | 'bendAngle_deg'>> & { other: OtherItem[] };
}

/** The "other" list a new takeoff starts with (the estimator edits it). */
export const DEFAULT_OTHER: OtherItem[] = [
  { code: 'other/trenching', description: 'Trenching and backfill', unit: 'm', per_pipe_m: 1 },
  { code: 'other/thrust-block', description: 'Thrust blocks at tees and bends', unit: 'each', quantity: 0 },
];

const round = (v: number, d = 3): number => Math.round(v * 10 ** d) / 10 ** d;

function add(rows: Map<string, TakeoffRow>, code: string, group: TakeoffGroup, description: string, unit: string, element: string, quantity = 1): void {
  const row = rows.get(code);
  if (row) {
    row.quantity += quantity;
    if (!row.elements.includes(element)) row.elements.push(element);
    return;
  }
  rows.set(code, { code, group, description, quantity, unit, elements: [element] });
}

/** Build the takeoff of a (valid) document. */
export function takeoff(doc: NetworkDocument, settings: TakeoffSettings = {}, steady: SteadyResult = solve(doc)): Takeoff {
  const waste = settings.waste_fraction ?? 0.05;
  const bendAngle = settings.bendAngle_deg ?? 30;
  const other = settings.other ?? DEFAULT_OTHER;
  const rows = new Map<string, TakeoffRow>();
  const linkById = new Map(doc.links.map((l) => [l.id, l]));
  let pipeTotal = 0;
  // pipe, grouped by catalogue item
  const groups = new Map<string, { pipes: PipeLink[]; label: string }>();
  for (const l of doc.links) {
    if (l.kind !== 'pipe') continue;
    pipeTotal += l.length_m;
    const code = l.series && l.nominal ? pipeKey(l.series, l.nominal) : `pipe/${linkSize(l)}`;
    const series = pipeSeries.find((s) => s.id === l.series);
    const label = series ? `${series.label} ${l.nominal}` : `Pipe ${linkSize(l)}${l.material ? ` (${l.material})` : ''}`;
    if (!groups.has(code)) groups.set(code, { pipes: [], label });
    groups.get(code)?.pipes.push(l);
  }
  const couplings = new Map<string, { count: number; pipes: string[] }>();
  for (const [code, g] of groups) {
    const first = g.pipes[0];
    const unit = first.series && first.nominal ? purchaseUnit(first.series, first.nominal) : null;
    const network = g.pipes.reduce((s, p) => s + p.length_m, 0);
    const withWaste = network * (1 + waste);
    const pieces = unit ? Math.ceil(withWaste / unit.length_m - 1e-9) : 0;
    rows.set(code, {
      code,
      group: 'pipe',
      description: g.label,
      unit: 'm',
      elements: g.pipes.map((p) => p.id),
      network_m: round(network),
      with_waste_m: round(withWaste),
      piece_unit: unit?.unit ?? 'm',
      piece_m: unit?.length_m ?? 0,
      pieces,
      quantity: unit ? round(pieces * unit.length_m) : round(withWaste),
      note: unit ? `${pieces} ${unit.unit}${pieces === 1 ? '' : 's'} of ${unit.length_ft} ft` : 'custom size: bought by the metre',
    });
    if (unit?.joint === 'coupling') {
      for (const p of g.pipes) {
        const joints = Math.ceil((p.length_m * (1 + waste)) / unit.length_m - 1e-9) - 1;
        if (joints <= 0) continue;
        const c = couplings.get(first.nominal as string) ?? { count: 0, pipes: [] };
        c.count += joints;
        c.pipes.push(p.id);
        couplings.set(first.nominal as string, c);
      }
    }
  }
  for (const [size, c] of couplings) {
    const code = fittingCode('coupling', size);
    rows.set(code, {
      code,
      group: 'fitting',
      description: `${FITTINGS.coupling.label} ${size}`,
      quantity: c.count,
      unit: 'each',
      elements: c.pipes,
      note: 'joints where a run is longer than one coil or stick',
    });
  }
  const fittings = countFittings(doc, { bendAngle_deg: bendAngle });
  for (const f of fittings) add(rows, fittingCode(f.kind, f.size), 'fitting', `${FITTINGS[f.kind].label} ${f.size}`, 'each', f.at);
  // valves by kind, float valves at troughs
  for (const l of doc.links) {
    if (l.kind === 'valve')
      add(rows, fittingCode(`valve-${l.valve_type}`, linkSize(l)), 'valve', `${FITTINGS[`valve-${l.valve_type}`].label} ${linkSize(l)}`, 'each', l.id);
  }
  for (const n of doc.nodes) {
    if (n.kind !== 'outlet' || !n.float_valve) continue;
    const feed = doc.links.find((l) => (l.to === n.id || l.from === n.id) && l.kind !== 'pump');
    const size = feed ? linkSize(feed) : '3/4"';
    add(rows, fittingCode('valve-float', size), 'valve', `${FITTINGS['valve-float'].label} ${size}`, 'each', n.id);
  }
  // Where the profile asks for them (engine/profile, the same points the review checks).
  for (const p of networkTurningPoints(doc, steady)) {
    const link = linkById.get(p.link);
    const size = link ? linkSize(link) : '';
    const kind = p.kind === 'high-point' ? 'air-release-valve' : 'drain-valve';
    add(rows, fittingCode(kind, size), 'valve', `${FITTINGS[kind].label} ${size}`, 'each', p.link);
  }
  for (const n of doc.nodes) {
    if (n.kind !== 'tank') continue;
    const litres = Math.round((Math.PI / 4) * n.diameter_m ** 2 * n.max_level_m * 1000);
    add(rows, `tank/${litres} L`, 'tank', `Tank ${litres} L (⌀ ${round(n.diameter_m, 2)} m)`, 'each', n.id);
  }
  for (const l of doc.links) {
    if (l.kind !== 'pump') continue;
    const flow = l.flow_m3s !== undefined ? `${round(l.flow_m3s * 1000, 2)} L/s` : 'curve';
    add(rows, `pump/${flow}`, 'pump', `Pump ${flow}${l.schedule ? ' (solar, daylight schedule)' : ''}`, 'each', l.id);
  }
  for (const o of other) {
    const quantity = o.per_pipe_m !== undefined ? round(o.per_pipe_m * pipeTotal) : (o.quantity ?? 0);
    rows.set(o.code, {
      code: o.code,
      group: 'other',
      description: o.description,
      quantity,
      unit: o.unit,
      elements: [],
      note: o.per_pipe_m !== undefined ? `${o.per_pipe_m} ${o.unit} per m of pipe` : undefined,
    });
  }
  const order: TakeoffGroup[] = ['pipe', 'fitting', 'valve', 'tank', 'pump', 'other'];
  const list = [...rows.values()].sort((a, b) => order.indexOf(a.group) - order.indexOf(b.group) || (a.group === 'other' ? 0 : a.code.localeCompare(b.code)));
  return { rows: list, fittings, pipe_m: round(pipeTotal), settings: { waste_fraction: waste, bendAngle_deg: bendAngle, other } };
}
