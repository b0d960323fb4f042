/**
 * Single-failure what-ifs: every pipe broken (isolated), every valve stuck shut, every tank out of
 * service, the fill pump(s) off for 1, 2 and 3 days. For each: which outlets go short (pressure below
 * the device's requirement or delivery below 99 % of design, or unmet volume over the days) and by how
 * much, and which are unaffected; sorted by the number of outlets hit.
 *
 * Steady failures share one compiled model and one GradientSolver: only the closed-link flags change
 * between scenarios, so the ordering and symbolic factorisation are reused (engine README scenario 2).
 * Pump-off scenarios run the engine's `simulate` from the document's tank levels with the pumps'
 * schedules at zero, against the same run with the pumps working.
 *
 * @example
 * const table = whatIfs(hillSmallholding);
 * table.results[0] // the failure that hits the most outlets
 */
import { GradientSolver } from '../gradient-solver';
import type { NetworkDocument, OutletNode } from '../network-document';
import { compileNetwork } from '../network-model';
import { simulate } from '../simulate';
import { normaliseDocument, steadyState } from '../steady';
import { requiredPressure } from './outlet-checks';
import { DELIVERY_SHARE } from './rules';

export type WhatIfKind = 'pipe-broken' | 'valve-stuck-shut' | 'tank-out' | 'fill-off';

export interface WhatIfScenario {
  key: string;
  kind: WhatIfKind;
  /** The failed element (the first pump for fill-off). */
  element: string;
  elementName?: string;
  /** Fill-off only: how many days. */
  days?: number;
}

export interface OutletHit {
  outlet: string;
  name?: string;
  /** Steady failures: pressure under the failure, m (absent with no supply); how far below the requirement, m (0 if not). */
  pressure_m?: number;
  pressureShort_m?: number;
  /** Steady failures: delivered flow, m³/s, and the shortfall against design, m³/s. */
  delivered_m3s?: number;
  deliveryShort_m3s?: number;
  /** Fill-off: volume not delivered over the days beyond what the working design misses, m³. */
  unmet_m3?: number;
  /** Share of the design delivery lost (0..1): the "how much" used for sorting. */
  lostShare: number;
  /** No open path to any tank or source. */
  noSupply: boolean;
}

export interface WhatIfResult {
  scenario: WhatIfScenario;
  hit: OutletHit[];
  unaffected: string[];
  solved: boolean;
}

export interface WhatIfTable {
  /** Outlets already short in the intact design (steady); a failure counts only what it makes worse. */
  alreadyShort: string[];
  results: WhatIfResult[];
}

/** What counts as "worse": a pressure drop of more than 1 cm or a delivery drop of more than 0.1 %. */
const PRESSURE_TOL_M = 0.01;
const SHARE_TOL = 0.001;
const DAY_S = 86400;

export interface WhatIfOptions {
  /** Fill-off durations, days (default 1, 2, 3). */
  fillOffDays?: number[];
  /** Simulation step for the fill-off runs, s (default 3600: the patterns are hourly; 900 s moves unmet volumes by about 3 % on the demo and costs 7× the time). */
  step_s?: number;
}

/** Every single failure in turn (validate the document first). */
export function whatIfs(input: NetworkDocument, options: WhatIfOptions = {}): WhatIfTable {
  const doc = normaliseDocument(input);
  const outlets = doc.nodes.filter((n): n is OutletNode => n.kind === 'outlet');
  const model = compileNetwork(doc);
  const solver = new GradientSolver(model);
  const outletIndex = outlets.map((o) => model.nodeIndex.get(o.id)!);

  /** Solve with `closed` links shut (on top of the design state); per outlet pressure, delivery, supply. */
  const run = (closed: number[]) => {
    const state = steadyState(solver, { pressureDriven: true });
    for (const k of closed) state.linkClosed[k] = 1;
    const outcome = solver.solve(state);
    return {
      solved: outcome.converged,
      values: outletIndex.map((i) => ({ p: solver.head[i] - model.elevation[i], q: solver.demand[i], active: solver.active[i] === 1 })),
    };
  };
  const short = (o: OutletNode, v: { p: number; q: number; active: boolean }) => {
    const req = requiredPressure(o);
    return !v.active || (req !== undefined && v.p < req) || (o.demand_m3s > 0 && v.q < DELIVERY_SHARE * o.demand_m3s);
  };
  const base = run([]);
  const alreadyShort = outlets.filter((o, j) => short(o, base.values[j])).map((o) => o.id);

  const results: WhatIfResult[] = [];
  const steady = (scenario: WhatIfScenario, closed: number[]) => {
    const r = run(closed);
    const hit: OutletHit[] = [];
    const unaffected: string[] = [];
    outlets.forEach((o, j) => {
      const v = r.values[j];
      const b = base.values[j];
      const share = (q: number) => (o.demand_m3s > 0 ? q / o.demand_m3s : 1);
      const worse = !v.active || b.p - v.p > PRESSURE_TOL_M || share(b.q) - share(v.q) > SHARE_TOL;
      if (!short(o, v) || !worse) {
        unaffected.push(o.id);
        return;
      }
      const req = requiredPressure(o);
      const p = v.active ? v.p : Number.NaN;
      const q = v.active ? v.q : 0;
      hit.push({
        outlet: o.id,
        ...(o.name ? { name: o.name } : {}),
        ...(v.active ? { pressure_m: p } : {}),
        pressureShort_m: req !== undefined && !(p >= req) ? (v.active ? req - p : req) : 0,
        delivered_m3s: q,
        deliveryShort_m3s: Math.max(0, o.demand_m3s - q),
        lostShare: o.demand_m3s > 0 ? Math.min(1, Math.max(0, 1 - q / o.demand_m3s)) : v.active ? 0 : 1,
        noSupply: !v.active,
      });
    });
    results.push({ scenario, hit, unaffected, solved: r.solved });
  };

  doc.links.forEach((l, k) => {
    if (l.kind === 'pipe' && !l.closed) steady({ key: `pipe-broken:${l.id}`, kind: 'pipe-broken', element: l.id, ...named(l) }, [k]);
  });
  doc.links.forEach((l, k) => {
    if (l.kind === 'valve' && l.open !== false) steady({ key: `valve-stuck-shut:${l.id}`, kind: 'valve-stuck-shut', element: l.id, ...named(l) }, [k]);
  });
  doc.nodes.forEach((n) => {
    if (n.kind !== 'tank') return;
    const touching = doc.links.flatMap((l, k) => (l.from === n.id || l.to === n.id ? [k] : []));
    steady({ key: `tank-out:${n.id}`, kind: 'tank-out', element: n.id, ...named(n) }, touching);
  });

  const pumps = doc.links.filter((l) => l.kind === 'pump');
  if (pumps.length && outlets.length) {
    const step_s = options.step_s ?? 3600;
    const off: NetworkDocument = { ...doc, links: doc.links.map((l) => (l.kind === 'pump' ? { ...l, schedule: new Array(24).fill(0) } : l)) };
    for (const days of options.fillOffDays ?? [1, 2, 3]) {
      const scenario: WhatIfScenario = { key: `fill-off:${days}`, kind: 'fill-off', element: pumps[0].id, ...named(pumps[0]), days };
      const working = simulate(doc, { duration_s: days * DAY_S, step_s });
      const failed = simulate(off, { duration_s: days * DAY_S, step_s });
      const hit: OutletHit[] = [];
      const unaffected: string[] = [];
      for (const o of outlets) {
        const u0 = working.summary.outlets[o.id]?.unmet_m3 ?? 0;
        const u1 = failed.summary.outlets[o.id]?.unmet_m3 ?? 0;
        const wanted = (failed.summary.outlets[o.id]?.delivered_m3 ?? 0) + u1;
        const extra = u1 - u0;
        if (extra > 1e-6 && wanted > 0 && extra / wanted > SHARE_TOL) {
          hit.push({ outlet: o.id, ...(o.name ? { name: o.name } : {}), unmet_m3: extra, lostShare: Math.min(1, extra / wanted), noSupply: false });
        } else unaffected.push(o.id);
      }
      results.push({ scenario, hit, unaffected, solved: true });
    }
  }

  const lost = (r: WhatIfResult) => r.hit.reduce((s, h) => s + h.lostShare, 0);
  results.sort((a, b) => b.hit.length - a.hit.length || lost(b) - lost(a) || a.scenario.key.localeCompare(b.scenario.key));
  return { alreadyShort, results };
}

function named(e: { name?: string }): { elementName?: string } {
  return e.name ? { elementName: e.name } : {};
}
