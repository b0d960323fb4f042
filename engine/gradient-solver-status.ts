import * as kinds from './network-model';
import type { NetworkModel } from './network-model';

/**
 * Link statuses of the gradient solver (./gradient-solver): which links are open, shut by their
 * own logic or cut off, which nodes have a path to a fixed head, and the flows through active
 * pressure-reducing valves. A pressure-reducing valve (PRV) from f to t with setting s holds
 * head(t) = elevation(t) + s when the upstream head can throttle down to it (active), passes
 * water like an open valve when it cannot (open), and shuts when water would flow backwards or
 * the downstream head is held above its setting by another supply (closed). Two valves feeding
 * one node in parallel: the higher setting governs and the lower one shuts (a small/large valve
 * station). The status rules follow the usual ones for such valves (Rossman, EPANET 2 Users
 * Manual, US EPA 2000, ch. 3, public document).
 */

const { LINK_CHECK, LINK_FLOAT, LINK_PIPE, LINK_PRV, LINK_PUMP_CURVE, LINK_PUMP_FLOW, LINK_SHUTOFF, NODE_JUNCTION } = kinds;

/** Link status codes reported by the solver. */
export const STATUS_OPEN = 0;
/** Closed by the document or a control. */
export const STATUS_CLOSED = 1;
/** A check valve, no-reverse pump or empty-tank block holding back reverse flow. */
export const STATUS_CHECK_CLOSED = 2;
/** A PRV holding its setting downstream. */
export const STATUS_ACTIVE = 3;
/** A PRV shut by its own logic (reverse flow, or downstream held above its setting). */
export const STATUS_SHUT = 4;
/** Reported for links with an end cut off from every fixed head (no water can reach them). */
export const STATUS_ISOLATED = 5;
export const STATUS_NAMES = ['open', 'closed', 'check-closed', 'active', 'closed', 'isolated'] as const;

/** Head tolerance of status checks, m (the solver's own law tolerance is no finer). */
export const STATUS_HEAD_TOL = 1e-7;
/** Flow tolerance of status checks, m³/s. */
export const STATUS_FLOW_TOL = 1e-10;

/** What the status rules read and write (the solver's own arrays). */
export interface StatusArrays {
  readonly model: NetworkModel;
  readonly head: Float64Array;
  readonly flow: Float64Array;
  readonly status: Uint8Array;
  readonly active: Uint8Array;
  readonly demand: Float64Array;
  readonly changes: Int32Array;
  readonly queue: Int32Array;
  readonly adjPtr: Int32Array;
  readonly adjLink: Int32Array;
}

/** A link that carries no flow in the Newton system. */
export function isShut(st: number): boolean {
  return st === STATUS_CLOSED || st === STATUS_CHECK_CLOSED || st === STATUS_SHUT;
}

/**
 * Mark nodes with an open path to a fixed head. Water passes an active PRV only downstream, so a
 * node behind a PRV drawn towards the main is not fed through it (its matrix row would be empty).
 */
export function connect(s: StatusArrays): void {
  const { model, active, queue, status, adjPtr, adjLink } = s;
  active.fill(0);
  let tail = 0;
  for (let i = 0; i < model.nodeCount; i++)
    if (model.nodeKind[i] !== NODE_JUNCTION) {
      active[i] = 1;
      queue[tail++] = i;
    }
  let head = 0;
  while (head < tail) {
    const v = queue[head++];
    for (let a = adjPtr[v]; a < adjPtr[v + 1]; a++) {
      const k = adjLink[a];
      const st = status[k];
      if (isShut(st) || model.linkKind[k] === LINK_PUMP_FLOW) continue;
      if (st === STATUS_ACTIVE && model.from[k] !== v) continue;
      const u = model.from[k] === v ? model.to[k] : model.from[k];
      if (!active[u]) {
        active[u] = 1;
        queue[tail++] = u;
      }
    }
  }
}

/** Head a PRV holds downstream, m. */
export function prvHead(model: NetworkModel, k: number): number {
  return model.elevation[model.to[k]] + model.prvSetting[k];
}

/**
 * Flows through active PRVs from continuity at their outlets, downstream valves first (a PRV
 * feeding another carries the other's flow too); parallel valves into one node: the flow goes to
 * the highest setting, shared equally between equal settings. netOut holds the net outflow of
 * every node through all other links. Returns Σ|Δq| of the valves.
 */
export function prvFlowsByContinuity(s: StatusArrays, prvs: Int32Array, netOut: Float64Array, done: Uint8Array): { change: number; total: number } {
  const { model, status, active, flow, demand } = s;
  let change = 0;
  let total = 0;
  done.fill(0);
  const isActive = (k: number): boolean => status[k] === STATUS_ACTIVE && active[model.from[k]] === 1 && active[model.to[k]] === 1;
  let pending = 0;
  for (let a = 0; a < prvs.length; a++)
    if (isActive(prvs[a])) pending++;
    else done[a] = 1;
  for (let pass = 0; pending > 0 && pass <= prvs.length; pass++) {
    const last = pass === prvs.length; // a cycle of valves: resolve what is left as it stands
    for (let a = 0; a < prvs.length; a++) {
      if (done[a]) continue;
      const t = model.to[prvs[a]];
      // wait while an unresolved active valve leaves t
      let blocked = false;
      for (let b = 0; b < prvs.length && !last; b++)
        if (!done[b] && model.from[prvs[b]] === t) {
          blocked = true;
          break;
        }
      if (blocked) continue;
      let best = -Infinity;
      let count = 0;
      for (let b = a; b < prvs.length; b++) {
        if (done[b] || model.to[prvs[b]] !== t) continue;
        const h = prvHead(model, prvs[b]);
        if (h > best + 1e-12) {
          best = h;
          count = 1;
        } else if (Math.abs(h - best) <= 1e-12) count++;
      }
      const q = netOut[t] + demand[t];
      for (let b = a; b < prvs.length; b++) {
        if (done[b] || model.to[prvs[b]] !== t) continue;
        const k = prvs[b];
        const share = Math.abs(prvHead(model, k) - best) <= 1e-12 ? q / count : 0;
        change += Math.abs(share - flow[k]);
        total += Math.abs(share);
        flow[k] = share;
        netOut[t] -= share;
        netOut[model.from[k]] += share;
        done[b] = 1;
        pending--;
      }
    }
  }
  return { change, total };
}

/**
 * The status a link should have at the current heads and flows (unchanged when it is right).
 * @param linkDirection allowed direction (0 either, ±1) of plain links next to empty tanks
 * @param speed pump availability (curve pumps' shut-off head scales with its square)
 */
export function nextStatus(s: StatusArrays, k: number, linkDirection: number, speed: number): number {
  const { model, status, flow, head, active } = s;
  const st = status[k];
  if (st === STATUS_CLOSED) return st;
  const kind = model.linkKind[k];
  const f = model.from[k];
  const t = model.to[k];
  const hf = active[f] ? head[f] : model.elevation[f];
  const ht = active[t] ? head[t] : model.elevation[t];
  if (kind === LINK_PRV) {
    if (!active[f]) return st;
    const hset = prvHead(model, k);
    const canHold = model.nodeKind[t] === NODE_JUNCTION;
    const q = flow[k];
    if (st === STATUS_ACTIVE) {
      if (q < -STATUS_FLOW_TOL) return STATUS_SHUT;
      if (ht > hset + STATUS_HEAD_TOL) return STATUS_SHUT;
      if (hf < hset + model.minor[k] * Math.abs(q) * q - STATUS_HEAD_TOL) return STATUS_OPEN;
      return st;
    }
    if (st === STATUS_OPEN) {
      if (q < -STATUS_FLOW_TOL) return STATUS_SHUT;
      if (canHold && ht > hset + STATUS_HEAD_TOL) return STATUS_ACTIVE;
      return st;
    }
    if (ht < hset - STATUS_HEAD_TOL) {
      if (canHold && hf > hset + STATUS_HEAD_TOL) return STATUS_ACTIVE;
      if (hf > ht + STATUS_HEAD_TOL) return STATUS_OPEN;
    }
    return st;
  }
  let allowed = linkDirection;
  if (kind === LINK_CHECK || kind === LINK_PUMP_CURVE) allowed = allowed < 0 ? 2 : 1;
  if (allowed === 0 || kind === LINK_PUMP_FLOW)
    return st === STATUS_CHECK_CLOSED && (kind === LINK_PIPE || kind === LINK_SHUTOFF || kind === LINK_FLOAT) ? STATUS_OPEN : st;
  if (allowed === 2) return STATUS_CHECK_CLOSED;
  if (st === STATUS_OPEN) return allowed * flow[k] < -STATUS_FLOW_TOL ? STATUS_CHECK_CLOSED : st;
  // reopen when the head difference pushes flow the allowed way; a part without a fixed head can
  // receive water but not give it
  const up = allowed > 0 ? f : t;
  if (!active[up]) return st;
  let drive = allowed > 0 ? hf - ht : ht - hf;
  if (kind === LINK_PUMP_CURVE) drive += speed * speed * model.curveH[model.curveStart[k]];
  return drive > STATUS_HEAD_TOL ? STATUS_OPEN : st;
}

/** Apply status changes to `links`; true if any changed (each link may change at most 8 times). */
export function updateStatuses(s: StatusArrays, links: Int32Array, linkDirection: Int8Array, pumpFactor: Float64Array): boolean {
  const { model, status, flow, changes } = s;
  let changed = false;
  for (let a = 0; a < links.length; a++) {
    const k = links[a];
    const st = status[k];
    if (st === STATUS_CLOSED || changes[k] > 8) continue;
    const next = nextStatus(s, k, linkDirection[k], pumpFactor[k]);
    if (next === st) continue;
    status[k] = next;
    changes[k]++;
    changed = true;
    if (isShut(next)) flow[k] = 0;
    else if (isShut(st)) flow[k] = (model.linkKind[k] === LINK_PRV || linkDirection[k] >= 0 ? 1 : -1) * 1e-3 * Math.max(model.area[k], 1e-4);
  }
  return changed;
}
