/**
 * The rules of a network document that one field cannot state alone, run after the schema
 * (./document-schema) has accepted every field: ids unique, links joining existing nodes, tank
 * levels in order, controls and float valves naming tanks and levels the tank can reach, pump
 * curves falling, roughness within the bound of the head-loss model. Each problem is one `invalid`
 * warning naming element and field.
 *
 * @example
 * physicalProblems(doc) // [{ path: ['links', 0, 'to'], element: 'P3', message: 'P3.to: must name an existing node (got "J9")' }]
 */
import { BOUNDS, boundProblem } from './bounds';
import type { NetworkDocument, NetworkLink, NetworkNode, TankNode } from './network-document';

/** A problem with one field: `path` into the document (['links', 3, 'to']), the element's id, the message. */
export interface DocumentProblem {
  path: (string | number)[];
  element: string | null;
  message: string;
}

export function physicalProblems(doc: NetworkDocument): DocumentProblem[] {
  const out: DocumentProblem[] = [];
  let at: (string | number)[] = [];
  const bad = (element: string, field: string, message: string): void => {
    out.push({ path: [...at, ...field.split('.')], element, message: `${element}.${field}: ${message}` });
  };
  const nodes = new Map<string, NetworkNode>();
  for (let i = 0; i < doc.nodes.length; i++) {
    const node = doc.nodes[i];
    at = ['nodes', i];
    if (nodes.has(node.id)) {
      bad(node.id, 'id', 'is used by another node');
      continue;
    }
    nodes.set(node.id, node);
    checkNode(node, doc, bad);
  }
  const linkIds = new Set<string>();
  for (let i = 0; i < doc.links.length; i++) {
    const link = doc.links[i];
    at = ['links', i];
    if (linkIds.has(link.id)) {
      bad(link.id, 'id', 'is used by another link');
      continue;
    }
    linkIds.add(link.id);
    if (!nodes.has(link.from)) bad(link.id, 'from', `must name an existing node (got ${show(link.from)})`);
    if (!nodes.has(link.to)) bad(link.id, 'to', `must name an existing node (got ${show(link.to)})`);
    if (link.from === link.to) bad(link.id, 'to', `must differ from "from" (both ${show(link.from)})`);
    checkLink(link, doc, nodes, bad);
  }
  return out;
}

type Report = (element: string, field: string, message: string) => void;

function checkNode(node: NetworkNode, doc: NetworkDocument, bad: Report): void {
  if (node.kind === 'tank') {
    if (node.max_level_m <= node.min_level_m) bad(node.id, 'max_level_m', `must be above min_level_m (got ${node.max_level_m} ≤ ${node.min_level_m})`);
    if (node.level_m > node.max_level_m) bad(node.id, 'level_m', `must not exceed max_level_m ${node.max_level_m} (got ${node.level_m})`);
  }
  if (node.kind === 'tee' || node.kind === 'outlet') {
    if (node.pattern !== undefined && !doc.patterns?.[node.pattern]) bad(node.id, 'pattern', `must name an entry of patterns (got ${show(node.pattern)})`);
  }
  if (node.kind === 'outlet' && node.demand_model?.type === 'pressure-dependent') {
    const { required_pressure_m: req, zero_pressure_m: zero = 0 } = node.demand_model;
    if (req <= zero) bad(node.id, 'demand_model.required_pressure_m', `must be above zero_pressure_m ${zero} (got ${req})`);
  }
}

function checkLink(link: NetworkLink, doc: NetworkDocument, nodes: Map<string, NetworkNode>, bad: Report): void {
  const tank = (field: string, ref: string | undefined): TankNode | null => {
    const t = ref === undefined ? undefined : nodes.get(ref);
    if (t?.kind === 'tank') return t;
    bad(link.id, field, `must name a tank (got ${show(ref)})`);
    return null;
  };
  switch (link.kind) {
    case 'pipe': {
      const bound = doc.headloss === 'darcy-weisbach' ? BOUNDS.roughness_mm : BOUNDS.hazen_williams_c;
      const problem = boundProblem(bound, link.roughness);
      if (problem)
        bad(link.id, 'roughness', `${problem} for ${doc.headloss === 'darcy-weisbach' ? 'Darcy-Weisbach (mm)' : 'Hazen-Williams (C)'} (got ${link.roughness})`);
      if (link.profile?.some((pt, i) => i > 0 && pt[0] < link.profile![i - 1][0])) bad(link.id, 'profile', 'distances must not decrease');
      break;
    }
    case 'pump': {
      if (link.flow_m3s === undefined && link.curve === undefined) bad(link.id, 'flow_m3s', 'a pump needs flow_m3s or a curve');
      if (link.curve) {
        const pts = [...link.curve].sort((a, b) => a[0] - b[0]);
        if (pts.some((pt, i) => i > 0 && (pt[0] === pts[i - 1][0] || pt[1] > pts[i - 1][1])))
          bad(link.id, 'curve', 'head must fall as flow rises, with distinct flows');
        if (pts.length === 1 && pts[0][0] === 0) bad(link.id, 'curve', 'a one-point curve needs a flow above zero');
      }
      if (link.control) {
        const { stop_level_m: stop, start_level_m: start } = link.control;
        const t = tank('control.tank', link.control.tank);
        if (start >= stop) bad(link.id, 'control.start_level_m', `must be below stop_level_m ${stop} (got ${start})`);
        if (t && stop > t.max_level_m) bad(link.id, 'control.stop_level_m', `must not exceed ${t.id}'s max_level_m ${t.max_level_m} (got ${stop})`);
      }
      if (link.low_cutoff) {
        const t = tank('low_cutoff.tank', link.low_cutoff.tank);
        if (t && link.low_cutoff.level_m >= t.max_level_m)
          bad(link.id, 'low_cutoff.level_m', `must be below ${t.id}'s max_level_m ${t.max_level_m} (got ${link.low_cutoff.level_m})`);
      }
      break;
    }
    case 'valve':
      if (link.valve_type === 'prv' && link.setting_m === undefined) bad(link.id, 'setting_m', 'a pressure-reducing valve needs a setting (got nothing)');
      if (link.valve_type === 'float') tank('tank', link.tank);
      break;
  }
}

function show(v: string | undefined): string {
  if (v === undefined) return 'nothing';
  return JSON.stringify(v.length > 40 ? v.slice(0, 40) + '…' : v);
}
