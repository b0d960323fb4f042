import { GradientSolver } from './gradient-solver';
import type { NetworkDocument } from './network-document';
import { compileNetwork, NODE_TANK } from './network-model';
import { normaliseDocument } from './steady';
import { validateDocument } from './validate';
import type { Warning } from './warnings';

/**
 * How long a tank bank takes to equalise: the tanks joined by header pipes exchange water through
 * the network with pumps stopped and demands and tank inflows off, from their document levels,
 * until the spread of their water surfaces is within tolerance_m. The level ODE
 * A_i·dh_i/dt = Σ flows into tank i is integrated by the classical fourth-order Runge-Kutta method
 * with a step of 2 % of the current spread's time scale (the last step bisected to land on the
 * tolerance), each right-hand side a steady solve
 * (./gradient-solver). For two tanks joined by an orifice (Q = K·√Δh) the closed form is
 * T = 2·(√H − √tol)/(K·(1/A1 + 1/A2)) (fluid-mechanics texts; REFERENCES.md, V).
 *
 * @param doc network document
 * @param options tanks (ids, at least two), tolerance_m (default 0.01 m), max_time_s (default 30 days)
 * @returns time_s to equalise, final levels (m), equalises; reason when it does not
 * @example
 * equalisationTime(hillSmallholding, { tanks: ['T1', 'T2'], tolerance_m: 0.005 })
 */

export interface EqualiseOptions {
  tanks: string[];
  /** Acceptable spread of water surfaces, m (default 0.01). */
  tolerance_m?: number;
  /** Give up after this long, s (default 30 days). */
  max_time_s?: number;
  /** Hazen-Williams ω (default 10.67). */
  omega?: number;
}

export interface EqualiseResult {
  time_s: number;
  /** Tank levels (above each floor) at time_s, m. */
  levels_m: Record<string, number>;
  equalises: boolean;
  reason?: string;
  warnings: Warning[];
}

/** Equalisation time of a tank bank (see module doc). Never throws. */
export function equalisationTime(doc: unknown, options: EqualiseOptions): EqualiseResult {
  const warnings = validateDocument(doc);
  const fail = (reason: string): EqualiseResult => ({ time_s: Number.NaN, levels_m: {}, equalises: false, reason, warnings });
  if (warnings.length > 0) return fail('the document is invalid');
  const network: NetworkDocument = normaliseDocument(doc as NetworkDocument);
  const model = compileNetwork(network, { omega: options.omega });
  const bank = options.tanks.map((id) => model.nodeIndex.get(id) ?? -1);
  const badTank = options.tanks.find((id, j) => bank[j] < 0 || model.nodeKind[bank[j]] !== NODE_TANK);
  if (badTank !== undefined) {
    warnings.push({ code: 'invalid', element: badTank, message: `${badTank}: equalisation needs tank ids (not a tank)` });
    return fail(`${badTank} is not a tank`);
  }
  if (bank.length < 2) return fail('needs at least two tanks');
  const tol = options.tolerance_m ?? 0.01;
  const maxTime = options.max_time_s ?? 30 * 86400;
  const solver = new GradientSolver(model);
  const state = solver.createState();
  state.demandFactor.fill(0);
  state.pumpFactor.fill(0);
  const tanks: number[] = [];
  for (let i = 0; i < model.nodeCount; i++) if (model.nodeKind[i] === NODE_TANK) tanks.push(i);
  const level = new Float64Array(model.nodeCount);
  const minLevel = new Float64Array(model.nodeCount);
  for (const i of tanks) {
    const t = network.nodes[i];
    if (t.kind === 'tank') {
      level[i] = t.level_m;
      minLevel[i] = t.min_level_m;
    }
  }

  const spread = (lv: Float64Array): number => {
    let lo = Infinity;
    let hi = -Infinity;
    for (const i of bank) {
      const h = model.elevation[i] + lv[i];
      lo = Math.min(lo, h);
      hi = Math.max(hi, h);
    }
    return hi - lo;
  };
  const rates = (lv: Float64Array, out: Float64Array): boolean => {
    for (const i of tanks) state.fixedHead[i] = model.elevation[i] + lv[i];
    const outcome = solver.solve(state, { warmStart: true, accuracy: 1e-10 });
    out.fill(0);
    for (let k = 0; k < model.linkCount; k++) {
      out[model.to[k]] += solver.flow[k];
      out[model.from[k]] -= solver.flow[k];
    }
    for (const i of tanks) out[i] /= model.tankArea[i];
    return outcome.converged;
  };
  const levelsOf = (lv: Float64Array): Record<string, number> => Object.fromEntries(bank.map((i) => [model.nodeIds[i], lv[i]]));

  let t = 0;
  let s = spread(level);
  if (s <= tol) return { time_s: 0, levels_m: levelsOf(level), equalises: true, warnings };
  const k1 = new Float64Array(model.nodeCount);
  const k2 = new Float64Array(model.nodeCount);
  const k3 = new Float64Array(model.nodeCount);
  const k4 = new Float64Array(model.nodeCount);
  const tmp = new Float64Array(model.nodeCount);
  const next = new Float64Array(model.nodeCount);
  for (let step = 0; step < 100000; step++) {
    if (!rates(level, k1)) return { ...fail('the network did not converge'), time_s: t, levels_m: levelsOf(level) };
    // rate of change of the spread
    let speed = 0;
    for (const i of bank) speed = Math.max(speed, Math.abs(k1[i]));
    if (speed < 1e-12) return { ...fail('no water moves between the tanks (no open path between them)'), time_s: t, levels_m: levelsOf(level) };
    const dt = Math.min((0.02 * s) / speed, maxTime - t);
    const stage = (from: Float64Array, k: Float64Array, h: number): Float64Array => {
      for (const i of tanks) tmp[i] = Math.max(from[i] + h * k[i], minLevel[i]);
      return tmp;
    };
    const rk4 = (h: number): number => {
      rates(stage(level, k1, h / 2), k2);
      rates(stage(level, k2, h / 2), k3);
      rates(stage(level, k3, h), k4);
      for (const i of tanks) next[i] = Math.max(level[i] + (h / 6) * (k1[i] + 2 * k2[i] + 2 * k3[i] + k4[i]), minLevel[i]);
      return spread(next);
    };
    const s2 = rk4(dt);
    if (s2 <= tol) {
      // bisect the last step so the spread lands on the tolerance
      let lo = 0;
      let hi = dt;
      for (let b = 0; b < 40 && hi - lo > 1e-9 * Math.max(1, t); b++) {
        const mid = (lo + hi) / 2;
        if (rk4(mid) > tol) lo = mid;
        else hi = mid;
      }
      rk4(hi);
      level.set(next);
      return { time_s: t + hi, levels_m: levelsOf(level), equalises: true, warnings };
    }
    if (s2 >= s) return { ...fail('the level spread stopped falling (a tank is empty or the bank is held apart)'), time_s: t, levels_m: levelsOf(level) };
    level.set(next);
    t += dt;
    s = s2;
    if (t >= maxTime) return { ...fail(`the spread is still ${s.toFixed(3)} m after ${Math.round(maxTime / 3600)} h`), time_s: t, levels_m: levelsOf(level) };
  }
  return { ...fail('too many steps'), time_s: t, levels_m: levelsOf(level) };
}
