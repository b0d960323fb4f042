import type { Warning } from './warnings';

/**
 * Structural validation of an untrusted network document (JSON from a browser or a file).
 * Returns one `invalid` warning per problem, each naming the element id and field, e.g.
 * `{ code: 'invalid', element: 'P3', message: 'P3.diameter_m: must be a positive number (got 0)' }`.
 * Unknown fields are ignored (the editor adds name, x_m, y_m, vertices, layout…). A document with
 * no source or tank is structurally valid (a design in progress); solve() reports `no-fixed-head`.
 *
 * @param doc anything parsed from JSON
 * @returns [] when the document can be compiled and solved
 * @example
 * validateDocument({ schema: 'runnel.network/1', headloss: 'hazen-williams', nodes: [], links: [] }) // []
 */
export function validateDocument(doc: unknown): Warning[] {
  const out: Warning[] = [];
  const bad = (element: string | null, field: string, message: string): void => report(out, element, field, message);
  if (!isObject(doc)) { bad(null, '', 'must be a JSON object'); return out; }
  if (doc['schema'] !== undefined && doc['schema'] !== 'runnel.network/1') bad(null, 'schema', `must be "runnel.network/1" (got ${show(doc['schema'])})`);
  if (doc['headloss'] !== undefined && doc['headloss'] !== 'hazen-williams' && doc['headloss'] !== 'darcy-weisbach') {
    bad(null, 'headloss', `must be "hazen-williams" or "darcy-weisbach" (got ${show(doc['headloss'])})`);
  }
  const patterns = doc['patterns'];
  const patternIds = new Set<string>();
  if (patterns !== undefined) {
    if (!isObject(patterns)) bad(null, 'patterns', 'must be an object of 24-number lists');
    else for (const [id, values] of Object.entries(patterns)) {
      patternIds.add(id);
      if (!Array.isArray(values) || values.length !== 24 || !values.every((v) => isFiniteNumber(v) && v >= 0)) {
        bad(null, `patterns.${id}`, 'must be a list of 24 non-negative numbers (one per hour)');
      }
    }
  }
  const nodes = doc['nodes'];
  const links = doc['links'];
  if (!Array.isArray(nodes)) bad(null, 'nodes', 'must be an array');
  if (!Array.isArray(links)) bad(null, 'links', 'must be an array');
  if (!Array.isArray(nodes) || !Array.isArray(links)) return out;

  const nodeKinds = new Map<string, string>();
  for (let index = 0; index < nodes.length; index++) validateNode(out, nodes[index], index, nodeKinds, patternIds);
  const linkIds = new Set<string>();
  for (let index = 0; index < links.length; index++) validateLink(out, links[index], index, nodeKinds, linkIds);
  return out;
}

function validateNode(out: Warning[], node: unknown, index: number, nodeKinds: Map<string, string>, patternIds: Set<string>): void {
  if (!isObject(node)) { report(out, null, `nodes[${index}]`, 'must be an object'); return; }
  const id = node['id'];
  if (typeof id !== 'string' || blank(id)) { report(out, null, `nodes[${index}].id`, `must be a non-empty string (got ${show(id)})`); return; }
  if (nodeKinds.has(id)) { report(out, id, 'id', 'is used by another node'); return; }
  const kind = node['kind'];
  nodeKinds.set(id, typeof kind === 'string' ? kind : '');
  field_(out, id, node, 'elevation_m', 'finite', false);
  switch (kind) {
    case 'source':
      field_(out, id, node, 'head_m', 'finite', false);
      break;
    case 'tank': {
      field_(out, id, node, 'diameter_m', 'positive', false);
      field_(out, id, node, 'level_m', 'non-negative', false);
      field_(out, id, node, 'min_level_m', 'non-negative', false);
      field_(out, id, node, 'max_level_m', 'positive', false);
      field_(out, id, node, 'inflow_m3s', 'non-negative', true);
      const lo = node['min_level_m'];
      const hi = node['max_level_m'];
      const lv = node['level_m'];
      if (isFiniteNumber(lo) && isFiniteNumber(hi) && hi <= lo) report(out, id, 'max_level_m', `must be above min_level_m (got ${hi} ≤ ${lo})`);
      if (isFiniteNumber(hi) && isFiniteNumber(lv) && lv > hi) report(out, id, 'level_m', `must not exceed max_level_m ${hi} (got ${lv})`);
      break;
    }
    case 'tee':
    case 'outlet': {
      field_(out, id, node, 'demand_m3s', kind === 'outlet' ? 'non-negative' : 'finite', false);
      field_(out, id, node, 'min_pressure_m', 'finite', true);
      const pattern = node['pattern'];
      if (pattern !== undefined && (typeof pattern !== 'string' || !patternIds.has(pattern))) report(out, id, 'pattern', `must name an entry of patterns (got ${show(pattern)})`);
      const dm = node['demand_model'];
      if (dm !== undefined) {
        if (!isObject(dm)) report(out, id, 'demand_model', 'must be an object with a type');
        else if (dm['type'] === 'pressure-dependent') {
          checkNumber(dm['required_pressure_m'], 'finite', (msg) => report(out, id, 'demand_model.required_pressure_m', msg));
          if (dm['zero_pressure_m'] !== undefined) checkNumber(dm['zero_pressure_m'], 'finite', (msg) => report(out, id, 'demand_model.zero_pressure_m', msg));
          const req = dm['required_pressure_m'];
          const zero = dm['zero_pressure_m'] ?? 0;
          if (isFiniteNumber(req) && isFiniteNumber(zero) && req <= zero) report(out, id, 'demand_model.required_pressure_m', `must be above zero_pressure_m ${zero} (got ${req})`);
        } else if (dm['type'] === 'emitter') {
          checkNumber(dm['k'], 'positive', (msg) => report(out, id, 'demand_model.k', msg));
          checkNumber(dm['exponent'], 'positive', (msg) => report(out, id, 'demand_model.exponent', msg));
        } else if (dm['type'] !== 'fixed') report(out, id, 'demand_model.type', `must be "fixed", "pressure-dependent" or "emitter" (got ${show(dm['type'])})`);
      }
      break;
    }
    default:
      report(out, id, 'kind', `must be one of source, tank, tee, outlet (got ${show(kind)})`);
  }
}

function validateLink(out: Warning[], link: unknown, index: number, nodeKinds: Map<string, string>, linkIds: Set<string>): void {
  if (!isObject(link)) { report(out, null, `links[${index}]`, 'must be an object'); return; }
  const id = link['id'];
  if (typeof id !== 'string' || blank(id)) { report(out, null, `links[${index}].id`, `must be a non-empty string (got ${show(id)})`); return; }
  if (linkIds.has(id)) { report(out, id, 'id', 'is used by another link'); return; }
  linkIds.add(id);
  const from = link['from'];
  const to = link['to'];
  if (typeof from !== 'string' || !nodeKinds.has(from)) report(out, id, 'from', `must name an existing node (got ${show(from)})`);
  if (typeof to !== 'string' || !nodeKinds.has(to)) report(out, id, 'to', `must name an existing node (got ${show(to)})`);
  if (link['from'] === link['to'] && typeof link['from'] === 'string') report(out, id, 'to', `must differ from "from" (both ${show(link['from'])})`);
  const kind = link['kind'];
  switch (kind) {
    case 'pipe': {
      field_(out, id, link, 'length_m', 'positive', false);
      field_(out, id, link, 'diameter_m', 'positive', false);
      field_(out, id, link, 'roughness', 'positive', false);
      field_(out, id, link, 'minor_loss', 'non-negative', true);
      field_(out, id, link, 'rating_m', 'positive', true);
      field_(out, id, link, 'cover_m', 'non-negative', true);
      const profile = link['profile'];
      if (profile !== undefined) {
        if (!Array.isArray(profile) || !profile.every((pt) => Array.isArray(pt) && pt.length === 2 && isFiniteNumber(pt[0]) && isFiniteNumber(pt[1]))) {
          report(out, id, 'profile', 'must be a list of [distance_m, elevation_m] pairs');
        } else if (profile.some((pt, i) => i > 0 && pt[0] < profile[i - 1][0])) report(out, id, 'profile', 'distances must not decrease');
      }
      break;
    }
    case 'pump': {
      const flow = link['flow_m3s'];
      const curve = link['curve'];
      if (flow === undefined && curve === undefined) report(out, id, 'flow_m3s', 'a pump needs flow_m3s or a curve');
      if (flow !== undefined) field_(out, id, link, 'flow_m3s', 'non-negative', false);
      if (curve !== undefined) {
        if (!Array.isArray(curve) || curve.length === 0 || !curve.every((pt) => Array.isArray(pt) && pt.length === 2 && isFiniteNumber(pt[0]) && isFiniteNumber(pt[1]) && pt[0] >= 0 && pt[1] >= 0)) {
          report(out, id, 'curve', 'must be a non-empty list of [flow_m3s, head_m] pairs (non-negative)');
        } else {
          const pts = [...(curve as [number, number][])].sort((a, b) => a[0] - b[0]);
          if (pts.some((pt, i) => i > 0 && (pt[0] === pts[i - 1][0] || pt[1] > pts[i - 1][1]))) report(out, id, 'curve', 'head must fall as flow rises, with distinct flows');
          if (pts.length === 1 && pts[0][0] === 0) report(out, id, 'curve', 'a one-point curve needs a flow above zero');
        }
      }
      const schedule = link['schedule'];
      if (schedule !== undefined && (!Array.isArray(schedule) || schedule.length !== 24 || !schedule.every((v) => isFiniteNumber(v) && v >= 0 && v <= 1))) {
        report(out, id, 'schedule', 'must be 24 hourly factors between 0 and 1');
      }
      const control = link['control'];
      if (control !== undefined) {
        if (!isObject(control)) report(out, id, 'control', 'must be an object { tank, stop_level_m, start_level_m }');
        else {
          tankRef(out, nodeKinds, id, 'control.tank', control['tank']);
          checkNumber(control['stop_level_m'], 'non-negative', (msg) => report(out, id, 'control.stop_level_m', msg));
          checkNumber(control['start_level_m'], 'non-negative', (msg) => report(out, id, 'control.start_level_m', msg));
          if (isFiniteNumber(control['stop_level_m']) && isFiniteNumber(control['start_level_m']) && control['start_level_m'] >= control['stop_level_m']) {
            report(out, id, 'control.start_level_m', `must be below stop_level_m ${control['stop_level_m']} (got ${control['start_level_m']})`);
          }
        }
      }
      const cutoff = link['low_cutoff'];
      if (cutoff !== undefined) {
        if (!isObject(cutoff)) report(out, id, 'low_cutoff', 'must be an object { tank, level_m }');
        else {
          tankRef(out, nodeKinds, id, 'low_cutoff.tank', cutoff['tank']);
          checkNumber(cutoff['level_m'], 'non-negative', (msg) => report(out, id, 'low_cutoff.level_m', msg));
        }
      }
      break;
    }
    case 'valve': {
      const vt = link['valve_type'];
      if (vt !== 'shutoff' && vt !== 'check' && vt !== 'prv' && vt !== 'float') report(out, id, 'valve_type', `must be shutoff, check, prv or float (got ${show(vt)})`);
      field_(out, id, link, 'diameter_m', 'positive', false);
      field_(out, id, link, 'minor_loss', 'non-negative', true);
      if (vt === 'prv') field_(out, id, link, 'setting_m', 'non-negative', false);
      if (vt === 'float') tankRef(out, nodeKinds, id, 'tank', link['tank']);
      if (link['open'] !== undefined && typeof link['open'] !== 'boolean') report(out, id, 'open', `must be true or false (got ${show(link['open'])})`);
      break;
    }
    default:
      report(out, id, 'kind', `must be one of pipe, pump, valve (got ${show(kind)})`);
  }
}

function tankRef(out: Warning[], nodeKinds: Map<string, string>, id: string, field: string, value: unknown): void {
  if (typeof value !== 'string' || nodeKinds.get(value) !== 'tank') report(out, id, field, `must name a tank (got ${show(value)})`);
}

type Rule = 'finite' | 'positive' | 'non-negative';

function report(out: Warning[], element: string | null, field: string, message: string): void {
  out.push({ code: 'invalid', element, message: `${element ?? 'document'}${field ? '.' + field : ''}: ${message}` });
}

/** Check element[field] against a rule; record a warning naming element and field. */
function field_(out: Warning[], id: string, element: Record<string, unknown>, field: string, rule: Rule, optional: boolean): void {
  const v = element[field];
  if (v === undefined && optional) return;
  if (!isFiniteNumber(v) || (rule === 'positive' && v <= 0) || (rule === 'non-negative' && v < 0)) report(out, id, field, `must be ${describeRule(rule)} (got ${show(v)})`);
}

function describeRule(rule: Rule): string {
  return rule === 'finite' ? 'a number' : rule === 'positive' ? 'a positive number' : 'a number ≥ 0';
}

/** Empty or only white space (as `s.trim() === ''`, without making a trimmed copy of every id). */
function blank(s: string): boolean {
  return s.length === 0 || (s.charCodeAt(0) <= 32 || s.charCodeAt(0) >= 127 ? s.trim() === '' : false);
}

function isObject(v: unknown): v is Record<string, unknown> {
  return typeof v === 'object' && v !== null && !Array.isArray(v);
}

function isFiniteNumber(v: unknown): v is number {
  return typeof v === 'number' && Number.isFinite(v);
}

function checkNumber(v: unknown, rule: Rule, onBad: (msg: string) => void): void {
  if (!isFiniteNumber(v) || (rule === 'positive' && v <= 0) || (rule === 'non-negative' && v < 0)) onBad(`must be ${describeRule(rule)} (got ${show(v)})`);
}

function show(v: unknown): string {
  if (v === undefined) return 'nothing';
  if (typeof v === 'string') return JSON.stringify(v.length > 40 ? v.slice(0, 40) + '…' : v);
  if (typeof v === 'number') return String(v);
  try { const s = JSON.stringify(v); return s.length > 40 ? s.slice(0, 40) + '…' : s; } catch { return typeof v; }
}
