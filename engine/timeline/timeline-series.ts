import type { NetworkDocument, OutletNode, PumpLink, TankNode } from '../network-document';
import type { TimeSeriesResult } from '../simulate';

/**
 * The series the Timeline plots, derived from a simulation (./simulate) and its document:
 * tank levels and the bank's stored volume (area × level above each floor), each pump's flow and
 * running state with its daylight (schedule) factor, and each outlet's delivered flow (net flow
 * into the node from its links, so it is what the network really brought) against its requested
 * flow (demand × hourly pattern). A sample at time t reports the step that ended at t, so the
 * pattern and schedule hour are those just before t.
 *
 * @example
 * const s = timelineSeries(doc, simulate(doc, { duration_s: 86400, step_s: 600 }));
 * s.outlets['TR1'].delivered_m3s
 */

export interface TimelineSeries {
  times_s: number[];
  tanks: Record<string, { level_m: number[]; min_level_m: number; max_level_m: number; area_m2: number }>;
  /** Water stored above the tank floors, summed over every tank, m³. */
  bank_volume_m3: number[];
  pumps: Record<string, { flow_m3s: number[]; on: boolean[]; sun: number[] }>;
  outlets: Record<string, { delivered_m3s: number[]; requested_m3s: number[] }>;
}

/** The hour (0–23) a sample at t reports. */
export function sampleHour(t: number): number {
  return t <= 0 ? 0 : Math.floor((t - 1e-6) / 3600) % 24;
}

export function timelineSeries(doc: NetworkDocument, result: TimeSeriesResult): TimelineSeries {
  const times = result.times_s;
  const tanks: TimelineSeries['tanks'] = {};
  const bank = times.map(() => 0);
  for (const node of doc.nodes) {
    if (node.kind !== 'tank' || !result.tanks[node.id]) continue;
    const t = node as TankNode;
    const area = (Math.PI * t.diameter_m * t.diameter_m) / 4;
    const level = result.tanks[t.id].level_m;
    tanks[t.id] = { level_m: level, min_level_m: t.min_level_m, max_level_m: t.max_level_m, area_m2: area };
    level.forEach((l, i) => {
      bank[i] += area * l;
    });
  }
  const pumps: TimelineSeries['pumps'] = {};
  for (const link of doc.links) {
    if (link.kind !== 'pump' || !result.pumps[link.id]) continue;
    const p = link as PumpLink;
    pumps[p.id] = {
      flow_m3s: result.links[p.id]?.flow_m3s ?? [],
      on: result.pumps[p.id].on,
      sun: times.map((t) => (p.schedule ? p.schedule[sampleHour(t)] : 1)),
    };
  }
  const outlets: TimelineSeries['outlets'] = {};
  const into = new Map<string, { link: string; sign: number }[]>();
  for (const link of doc.links) {
    (into.get(link.to) ?? into.set(link.to, []).get(link.to)!).push({ link: link.id, sign: 1 });
    (into.get(link.from) ?? into.set(link.from, []).get(link.from)!).push({ link: link.id, sign: -1 });
  }
  for (const node of doc.nodes) {
    if (node.kind !== 'outlet') continue;
    const o = node as OutletNode;
    const pattern = o.pattern ? doc.patterns?.[o.pattern] : undefined;
    // each end's flow series looked up once, not per sample (a week at 1-minute reports is 10,081)
    const ends = (into.get(o.id) ?? []).map((e) => ({ sign: e.sign, flow: result.links[e.link]?.flow_m3s }));
    const delivered = new Array<number>(times.length);
    for (let i = 0; i < times.length; i++) {
      let sum = 0;
      for (const e of ends) sum += e.sign * (e.flow?.[i] ?? 0);
      delivered[i] = Math.max(0, sum);
    }
    outlets[o.id] = {
      delivered_m3s: delivered,
      requested_m3s: times.map((t) => o.demand_m3s * (pattern ? pattern[sampleHour(t)] : 1)),
    };
  }
  return { times_s: times, tanks, bank_volume_m3: bank, pumps, outlets };
}
