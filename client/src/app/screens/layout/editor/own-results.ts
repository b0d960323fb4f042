import type { NetworkDocument, NetworkLink, NetworkNode } from '../../../../../../engine/network-document';
import type { SteadyResult } from '../../../../../../engine/index';
import type { ServiceStates } from '../../../../../../engine/service-state';
import { formatQuantity, UnitSystem } from '../../../../../../engine/units';
import { BadgeTone, groupedVolume, linkStateWords, nodeBadge, signedPressure, WORK_WORDS } from './plan-words';

export interface OwnRow {
  key: string;
  label: string;
  value: string;
  tone?: BadgeTone;
}

/**
 * The selected element's own results for the top of its properties: an outlet's pressure, what it
 * needs and its margin (with the verdict), what it delivers; a junction's pressure and share of
 * its pipes' rating; a tank's water now and when full; a line's flow, speed and state.
 */
export function ownResults(el: NetworkNode | NetworkLink, doc: NetworkDocument, res: SteadyResult | null, svc: ServiceStates | null, u: UnitSystem): OwnRow[] {
  if (!res) return [];
  const p = (m: number) => formatQuantity('pressure', m, u);
  const rows: OwnRow[] = [];
  if ('from' in el) {
    const r = res.links[el.id];
    if (!r) return [];
    const s = svc?.links[el.id];
    rows.push({ key: 'flow', label: 'Flow', value: formatQuantity('flow', Math.abs(r.flow_m3s), u) });
    if (el.kind === 'pipe') {
      rows.push({
        key: 'speed',
        label: 'Speed',
        value: `${formatQuantity('velocity', Math.abs(r.velocity_ms), u)}${s ? ` · ${WORK_WORDS[s.work]}` : ''}`,
        tone: s?.work === 'over' ? 'short' : s?.work === 'hard' ? 'close' : undefined,
      });
      rows.push({ key: 'loss', label: 'Pressure lost along it', value: p(Math.abs(r.headloss_m)) });
    } else if (el.kind === 'pump') {
      rows.push({ key: 'lift', label: 'Adds', value: `${formatQuantity('head', Math.max(0, -r.headloss_m), u)} of head` });
    }
    rows.push({ key: 'state', label: 'State', value: linkStateWords(el, r.status, s) });
    return rows;
  }
  const r = res.nodes[el.id];
  const s = svc?.nodes[el.id];
  if (!r || !s) return [];
  if (el.kind === 'tank') {
    if (s.volume_m3 !== undefined && s.capacity_m3 !== undefined) {
      rows.push({ key: 'volume', label: 'Holds now', value: groupedVolume(s.volume_m3, u) });
      rows.push({ key: 'capacity', label: 'Holds when full', value: groupedVolume(s.capacity_m3, u) });
    }
    rows.push({ key: 'surface', label: 'Water surface at', value: formatQuantity('elevation', r.head_m, u) });
    return rows;
  }
  if (el.kind === 'source') return [{ key: 'surface', label: 'Water surface at', value: formatQuantity('elevation', r.head_m, u) }];
  const badge = nodeBadge(el, s, u);
  rows.push({ key: 'pressure', label: 'Pressure here', value: p(r.pressure_m), tone: r.pressure_m < 0 ? 'short' : undefined });
  if (el.kind === 'outlet') {
    if (s.required_m !== undefined) rows.push({ key: 'needs', label: 'Needs', value: p(s.required_m) });
    if (s.margin_m !== undefined) {
      const word = s.state === 'ok' ? 'OK' : s.state;
      rows.push({ key: 'margin', label: 'Margin', value: `${word} ${signedPressure(s.margin_m, u)}`, tone: badge?.tone });
    }
    rows.push({ key: 'delivers', label: 'Delivers', value: `${formatQuantity('flow', r.demand_m3s, u)} of ${formatQuantity('flow', el.demand_m3s, u)}` });
  }
  if (s.ratingShare !== undefined) {
    rows.push({
      key: 'rating',
      label: 'Share of pipe rating',
      value: `${Math.round(s.ratingShare * 100)} %${s.rating === 'near' ? ' · near rating' : s.rating === 'over' ? ' · over rating' : ''}`,
      tone: s.rating === 'over' ? 'over-rating' : s.rating === 'near' ? 'near-rating' : undefined,
    });
  }
  void doc;
  return rows;
}
