import type { NetworkDocument, NetworkLink, NetworkNode, PumpLink } from '../../../../../../engine/network-document';
import type { UnitSystem } from '../../../../../../engine/units';
import { LINK_KINDS, nextId, NODE_KINDS } from '../kinds';
import { withDrawnLength } from './document-store';

/** How far from the pump its outlet tee sits along the drawn line, m (at most a fifth of the first stretch). */
const PUMP_OUTLET_M = 3;

/**
 * A pump drawn from one element to another is split the way it is built: the pump at its start
 * (a short link to a pump-outlet tee a few metres along the line) and the rising main, a pipe of
 * the standard new-pipe size from that tee along the drawn line to the end, so the climb's
 * friction counts. Null when the line is too short to split (under 1 m): the pump stays one link.
 */
export function risingMain(doc: NetworkDocument, pump: NetworkLink, units: UnitSystem): { apply(d: NetworkDocument): NetworkDocument } | null {
  if (pump.kind !== 'pump') return null;
  const a = doc.nodes.find((n) => n.id === pump.from);
  const b = doc.nodes.find((n) => n.id === pump.to);
  if (!a || !b) return null;
  const first = pump.vertices?.[0] ? { x: pump.vertices[0][0], y: pump.vertices[0][1] } : { x: b.x_m ?? 0, y: b.y_m ?? 0 };
  const dx = first.x - (a.x_m ?? 0);
  const dy = first.y - (a.y_m ?? 0);
  const stretch = Math.hypot(dx, dy);
  if (stretch < 1) return null;
  const along = Math.min(PUMP_OUTLET_M, stretch / 5);
  const teeId = nextId(
    NODE_KINDS.tee.prefix,
    doc.nodes.map((n) => n.id),
  );
  const tee = NODE_KINDS.tee.create(teeId, (a.x_m ?? 0) + (dx / stretch) * along, (a.y_m ?? 0) + (dy / stretch) * along, units) as NetworkNode;
  // The pump outlet stands at the pump's ground: the source's (or tank's) own elevation.
  Object.assign(tee, {
    name: `${pump.name && pump.name !== pump.id ? pump.name : 'Pump'} outlet`,
    elevation_m: a.elevation_m,
    elevation_source: 'nearest',
    elevation_from: a.name || a.id,
  });
  const pipeId = nextId(
    LINK_KINDS.pipe.prefix,
    doc.links.map((l) => l.id),
  );
  const pipe = LINK_KINDS.pipe.create(pipeId, teeId, b.id, pump.vertices ?? [], units);
  pipe.name = 'Rising main';
  const shortPump: PumpLink = { ...pump, to: teeId, vertices: [] };
  return {
    apply: (d) => {
      const withTee = { ...d, nodes: [...d.nodes, tee] };
      return { ...withTee, links: [...d.links, shortPump, withDrawnLength(pipe, withTee)] };
    },
  };
}
