import fc from 'fast-check';
import type { NetworkDocument, NetworkLink, NetworkNode, PipeLink, PumpLink, ValveLink } from '../../engine/network-document';
import type { SteadyResult } from '../../engine/steady';

/**
 * Generated networks with every kind of element (fast-check): looped and branched pipes, one or two
 * sources, tanks, fixed, pressure-dependent and emitter outlets, shut-off valves open and shut, check
 * valves either way round, pressure-reducing valves either way round, in series and in parallel,
 * float valves into tanks, constant-flow and curve pumps. Each answer is either converged, and then
 * checked here against the definitions of a steady state written out independently of the engine:
 * - continuity at every tee and outlet to 1e-9 m³/s;
 * - every element's own law to 1e-6 m: Hazen-Williams hL = 10.67·L·Q^1.852/(C^1.852·D^4.8704)
 *   (REFERENCES.md, V) plus K·v²/2g minor losses (common practice), pump head gain piecewise
 *   linear through the curve's points, extended from the end segments (engine/README.md, scenario 6);
 *   check valves: forward flow by the minor-loss law, or no flow and no forward head difference; PRVs
 *   (the usual rules for such valves, US EPA EPANET 2 manual ch. 3): active = downstream at the
 *   setting with forward flow and upstream at least the setting plus the open-valve loss, open =
 *   minor-loss law with the downstream at or below the setting, closed = no flow with no head that
 *   would open it; outlets: q = Q·√((p − p0)/(preq − p0)) between the pressures (Wagner et al. 1988),
 *   emitters q = k·pˣ;
 * or `converged: false` with a reason. None may be a singular system.
 */

const G = 9.80665;
const hw = (q: number, L: number, D: number, C: number): number =>
  (10.67 * L * Math.sign(q) * Math.pow(Math.abs(q), 1.852)) / (Math.pow(C, 1.852) * Math.pow(D, 4.8704));
const minorLoss = (K: number, D: number, q: number): number => (8 * K * q * Math.abs(q)) / (G * Math.PI * Math.PI * D ** 4);
const DIAMETERS = [0.0209, 0.0266, 0.0351, 0.0525, 0.0779];

export interface Gen {
  n: number;
  parents: number[];
  extra: [number, number][];
  elev: number[];
  demand: number[];
  kind: number[];
  diam: number[];
  len: number[];
  sources: number;
  tanks: number;
  valves: { at: number; type: number; reverse: boolean; setting: number }[];
  pumps: { at: number; curve: boolean }[];
}

export const genArb = fc.integer({ min: 4, max: 22 }).chain((n) =>
  fc.record({
    n: fc.constant(n),
    parents: fc.array(fc.nat(), { minLength: n - 1, maxLength: n - 1 }),
    extra: fc.array(fc.tuple(fc.nat(n - 1), fc.nat(n - 1)), { maxLength: 5 }),
    elev: fc.array(fc.double({ min: 0, max: 30, noNaN: true }), { minLength: n, maxLength: n }),
    demand: fc.array(fc.double({ min: 0, max: 0.0015, noNaN: true }), { minLength: n, maxLength: n }),
    kind: fc.array(fc.integer({ min: 0, max: 4 }), { minLength: n, maxLength: n }),
    diam: fc.array(fc.constantFrom(...DIAMETERS), { minLength: n + 5, maxLength: n + 5 }),
    len: fc.array(fc.double({ min: 5, max: 300, noNaN: true }), { minLength: n + 5, maxLength: n + 5 }),
    sources: fc.integer({ min: 1, max: 2 }),
    tanks: fc.integer({ min: 0, max: 1 }),
    valves: fc.array(
      fc.record({ at: fc.nat(n + 4), type: fc.integer({ min: 0, max: 5 }), reverse: fc.boolean(), setting: fc.double({ min: 5, max: 40, noNaN: true }) }),
      { maxLength: 5 },
    ),
    pumps: fc.array(fc.record({ at: fc.nat(n + 4), curve: fc.boolean() }), { maxLength: 2 }),
  }),
);

export function build(g: Gen): NetworkDocument {
  const nodes: NetworkNode[] = [];
  for (let i = 0; i < g.n; i++) {
    const id = `N${i}`;
    if (i < g.sources) nodes.push({ id, kind: 'source', elevation_m: 60 + 3 * i, head_m: 60 + 3 * i });
    else if (i < g.sources + g.tanks) nodes.push({ id, kind: 'tank', elevation_m: 45, diameter_m: 2, level_m: 1.5, min_level_m: 0.2, max_level_m: 2 });
    else if (g.kind[i] === 0) nodes.push({ id, kind: 'tee', elevation_m: g.elev[i], demand_m3s: g.demand[i] });
    else if (g.kind[i] === 1)
      nodes.push({
        id,
        kind: 'outlet',
        elevation_m: g.elev[i],
        demand_m3s: g.demand[i],
        demand_model: { type: 'pressure-dependent', required_pressure_m: 15, zero_pressure_m: 2 },
      });
    else if (g.kind[i] === 2)
      nodes.push({ id, kind: 'outlet', elevation_m: g.elev[i], demand_m3s: 0, demand_model: { type: 'emitter', k: 1e-5 + g.demand[i] / 20, exponent: 0.5 } });
    else nodes.push({ id, kind: 'outlet', elevation_m: g.elev[i], demand_m3s: g.demand[i], min_pressure_m: 10 });
  }
  const links: NetworkLink[] = [];
  const ends: [number, number][] = [];
  for (let i = 1; i < g.n; i++) ends.push([g.parents[i - 1] % i, i]);
  for (const [a, b] of g.extra) if (a !== b) ends.push([a, b]);
  const replaced = new Map<number, { type: number; reverse: boolean; setting: number } | { pump: boolean; curve: boolean }>();
  for (const v of g.valves) replaced.set(v.at % ends.length, v);
  for (const p of g.pumps) replaced.set(p.at % ends.length, { pump: true, curve: p.curve });
  ends.forEach(([a, b], k) => {
    const r = replaced.get(k);
    const id = `L${k}`;
    const pipe: PipeLink = {
      id,
      kind: 'pipe',
      from: `N${a}`,
      to: `N${b}`,
      length_m: g.len[k % g.len.length],
      diameter_m: g.diam[k % g.diam.length],
      roughness: 140,
      minor_loss: k % 3 === 0 ? 1.5 : 0,
    };
    if (!r) {
      links.push(pipe);
      return;
    }
    if ('pump' in r) {
      const pump: PumpLink = r.curve
        ? {
            id,
            kind: 'pump',
            from: `N${a}`,
            to: `N${b}`,
            curve: [
              [0, 30],
              [0.002, 24],
              [0.004, 10],
            ],
          }
        : { id, kind: 'pump', from: `N${a}`, to: `N${b}`, flow_m3s: 0.0005 };
      links.push(pump);
      return;
    }
    const [from, to] = r.reverse ? [`N${b}`, `N${a}`] : [`N${a}`, `N${b}`];
    const base = { id, kind: 'valve' as const, from, to, diameter_m: 0.0351, minor_loss: 0.5 };
    const types = ['shutoff', 'shutoff-shut', 'check', 'prv', 'prv-parallel', 'float'];
    const type = types[r.type];
    if (type === 'shutoff') links.push({ ...base, valve_type: 'shutoff', open: true });
    else if (type === 'shutoff-shut') links.push({ ...base, valve_type: 'shutoff', open: false });
    else if (type === 'check') links.push({ ...base, valve_type: 'check' });
    else if (type === 'prv') links.push({ ...base, valve_type: 'prv', setting_m: r.setting });
    else if (type === 'prv-parallel') {
      links.push({ ...base, valve_type: 'prv', setting_m: r.setting });
      links.push({ ...base, id: `${id}b`, valve_type: 'prv', setting_m: r.setting + 4, diameter_m: 0.0209 });
    } else {
      const tank = nodes.find((x) => x.kind === 'tank');
      links.push(tank ? { ...base, to: tank.id, valve_type: 'float', tank: tank.id } : { ...base, valve_type: 'check' });
    }
  });
  return { schema: 'runnel.network/1', headloss: 'hazen-williams', nodes, links };
}

/** Head gain of a curve pump at q (piecewise linear through its points, end segments extended). */
function pumpGain(curve: [number, number][], q: number): number {
  let s = 0;
  while (s < curve.length - 2 && q > curve[s + 1][0]) s++;
  const [q0, h0] = curve[s];
  const [q1, h1] = curve[s + 1];
  return h0 + ((h1 - h0) / (q1 - q0)) * (q - q0);
}

/** The first definition of a steady state the result breaks (null if none). */
export function violation(doc: NetworkDocument, r: SteadyResult): string | null {
  const H = (id: string): number => r.nodes[id].head_m;
  const node = new Map(doc.nodes.map((x) => [x.id, x]));
  const lawTol = 1e-6;
  const flowTol = 1e-9;
  const net = new Map<string, number>();
  const cut = (id: string): boolean => r.warnings.some((w) => w.code === 'disconnected' && w.element === id);
  for (const link of doc.links) {
    const res = r.links[link.id];
    const q = res.flow_m3s;
    if (!Number.isFinite(q)) return `${link.id}: flow not finite`;
    net.set(link.to, (net.get(link.to) ?? 0) + q);
    net.set(link.from, (net.get(link.from) ?? 0) - q);
    const dh = H(link.from) - H(link.to);
    if (cut(link.from) || cut(link.to) || res.status === 'isolated') {
      if (q !== 0) return `${link.id}: cut off but carries ${q}`;
      continue;
    }
    if (link.kind === 'pipe') {
      const miss = Math.abs(hw(q, link.length_m, link.diameter_m, link.roughness) + minorLoss(link.minor_loss ?? 0, link.diameter_m, q) - dh);
      if (miss > lawTol) return `${link.id}: pipe law misses by ${miss}`;
      continue;
    }
    if (link.kind === 'pump') {
      if (link.curve) {
        if (res.status === 'check-closed') {
          if (q !== 0 || dh + 30 > lawTol) return `${link.id}: pump held shut but its 30 m shut-off head exceeds the lift ${-dh} m`;
          continue;
        }
        const miss = Math.abs(pumpGain(link.curve, q) + dh);
        if (miss > lawTol || q < -flowTol) return `${link.id}: pump curve misses by ${miss} at ${q}`;
      } else if (Math.abs(q - (link.flow_m3s ?? 0)) > flowTol) return `${link.id}: pump flow ${q}`;
      continue;
    }
    const v = link as ValveLink;
    const open = (): number => Math.abs(minorLoss(v.minor_loss ?? 0, v.diameter_m, q) - dh);
    if (v.valve_type === 'shutoff') {
      if (v.open === false) {
        if (q !== 0) return `${v.id}: shut but flows`;
      } else if (open() > lawTol) return `${v.id}: open-valve law misses by ${open()}`;
    } else if (v.valve_type === 'check') {
      if (res.status === 'check-closed') {
        if (q !== 0 || dh > lawTol) return `${v.id}: held shut against a forward head ${dh}`;
      } else if (open() > lawTol || q < -flowTol) return `${v.id}: check valve law misses by ${open()} (q ${q})`;
    } else if (v.valve_type === 'float') {
      if (res.status === 'closed') {
        if (q !== 0) return `${v.id}: shut float valve flows`;
      } else if (open() > lawTol) return `${v.id}: float valve law misses by ${open()}`;
    } else {
      const to = node.get(v.to)!;
      const hset = to.elevation_m + (v.setting_m ?? 0);
      if (res.status === 'active') {
        if (Math.abs(H(v.to) - hset) > lawTol || q < -flowTol || dh < minorLoss(v.minor_loss ?? 0, v.diameter_m, q) - lawTol)
          return `${v.id}: active PRV off its setting (${H(v.to)} vs ${hset}, q ${q})`;
      } else if (res.status === 'open') {
        if (open() > lawTol || q < -flowTol || (to.kind !== 'source' && to.kind !== 'tank' && H(v.to) > hset + lawTol))
          return `${v.id}: open PRV breaks its law (q ${q}, downstream ${H(v.to)} vs ${hset})`;
      } else {
        if (q !== 0) return `${v.id}: closed PRV flows`;
        const wouldOpen = H(v.to) < hset - lawTol && H(v.from) > H(v.to) + lawTol;
        if (wouldOpen) return `${v.id}: closed PRV with upstream ${H(v.from)} above downstream ${H(v.to)} below its setting ${hset}`;
      }
    }
  }
  for (const x of doc.nodes) {
    if (x.kind === 'source' || x.kind === 'tank') continue;
    const d = r.nodes[x.id].demand_m3s;
    const miss = Math.abs((net.get(x.id) ?? 0) - d);
    if (miss > flowTol) return `${x.id}: continuity misses by ${miss}`;
    if (cut(x.id)) continue;
    const p = r.nodes[x.id].pressure_m;
    if (x.kind === 'outlet' && x.demand_model?.type === 'pressure-dependent') {
      const { required_pressure_m: preq, zero_pressure_m: p0 = 0 } = x.demand_model;
      const full = x.demand_m3s;
      const expected = p <= p0 ? 0 : p >= preq ? full : full * Math.sqrt((p - p0) / (preq - p0));
      // compared as pressures: the square-root law is infinitely steep at p0
      const pOf = (qq: number): number => p0 + (preq - p0) * (qq / full) ** 2;
      // a full demand below the balance tolerance is nothing to test the law on
      const ok =
        (full <= flowTol && d >= -flowTol && d <= full + flowTol) ||
        (d >= full - flowTol && p >= preq - lawTol) ||
        (d <= flowTol && p <= p0 + lawTol) ||
        Math.abs(pOf(d) - p) <= lawTol;
      if (!ok) return `${x.id}: outlet delivers ${d} at ${p} m, its law says ${expected}`;
    } else if (x.kind === 'outlet' && x.demand_model?.type === 'emitter') {
      const { k, exponent } = x.demand_model;
      const pOf = Math.pow(Math.max(d, 0) / k, 1 / exponent);
      if (d < -flowTol || (d <= flowTol ? p - pOf > lawTol : Math.abs(pOf - p) > lawTol)) return `${x.id}: emitter delivers ${d} at ${p} m`;
    } else if (Math.abs(d - x.demand_m3s) > 1e-15) return `${x.id}: fixed demand ${d} of ${x.demand_m3s}`;
  }
  return null;
}
