import { geoReferenceOf, toLonLat } from '../../../../../../engine/geo-reference';
import type { NetworkDocument } from '../../../../../../engine/network-document';
import type { SteadyResult } from '../../../../../../engine/steady';
import { linkPoints } from './document-store';

type Feature = { type: 'Feature'; id: string; geometry: { type: 'Point' | 'LineString'; coordinates: unknown }; properties: Record<string, unknown> };
export interface GeoJsonCollection {
  type: 'FeatureCollection';
  features: Feature[];
}

/** Said when the plan cannot be placed on the Earth (RFC 7946 §4 allows only WGS 84 longitude/latitude). */
export const NO_GEO_REFERENCE =
  'GeoJSON needs longitude and latitude, and this plan has no geographic reference yet. Load a GPX survey or a walk recorded on a phone (Walk tab), or set two known points, then export again. File ▸ Export network (JSON) keeps the plan in site metres.';

/**
 * The network as a GeoJSON FeatureCollection (RFC 7946): nodes as Points, links as LineStrings
 * through their bend points, in WGS 84 longitude/latitude (7 decimals, about 1 cm) through the
 * document's geographic reference (`layout.geo`, engine/geo-reference.ts). Each feature carries the
 * element's fields and, when given, its solved results as `result_*` properties (SI units, named
 * in the property). Returns the message above instead when the plan has no reference.
 */
export function toGeoJson(doc: NetworkDocument, results?: SteadyResult | null): { collection: GeoJsonCollection } | { message: string } {
  const ref = geoReferenceOf(doc.layout);
  if (!ref) return { message: NO_GEO_REFERENCE };
  const place = (x: number, y: number) => toLonLat(ref, x, y).map((v) => Math.round(v * 1e7) / 1e7);
  const byId = new Map(doc.nodes.map((n) => [n.id, n]));
  const features: Feature[] = [
    ...doc.nodes.map((n) => {
      const { x_m, y_m, ...props } = n;
      const r = results?.nodes[n.id];
      const solved = r ? { result_head_m: r.head_m, result_pressure_m: r.pressure_m, result_demand_m3s: r.demand_m3s } : {};
      return {
        type: 'Feature' as const,
        id: n.id,
        geometry: { type: 'Point' as const, coordinates: place(x_m ?? 0, y_m ?? 0) },
        properties: { ...props, ...solved },
      };
    }),
    ...doc.links.map((l) => {
      const { vertices: _v, ...props } = l;
      const r = results?.links[l.id];
      const solved = r ? { result_flow_m3s: r.flow_m3s, result_velocity_ms: r.velocity_ms, result_headloss_m: r.headloss_m, result_status: r.status } : {};
      return {
        type: 'Feature' as const,
        id: l.id,
        geometry: { type: 'LineString' as const, coordinates: linkPoints(l, byId).map((p) => place(p.x, p.y)) },
        properties: { ...props, ...solved },
      };
    }),
  ];
  return { collection: { type: 'FeatureCollection', features } };
}
