import type { NetworkDocument } from '../../../../../../engine/network-document';
import { linkPoints } from './document-store';

/**
 * The network's geometry as a GeoJSON FeatureCollection (RFC 7946 structure): nodes as Points,
 * links as LineStrings through their bend points, each with its fields as properties.
 *
 * Coordinates are LOCAL SITE METRES (x east, y north from the plan's origin), not longitude and
 * latitude, unless the plan has been georeferenced; the collection says so in its `crs_note`
 * member so GIS users do not mistake them for degrees.
 */
export function toGeoJson(doc: NetworkDocument): {
  type: 'FeatureCollection';
  crs_note: string;
  features: { type: 'Feature'; id: string; geometry: { type: 'Point' | 'LineString'; coordinates: unknown }; properties: Record<string, unknown> }[];
} {
  const byId = new Map(doc.nodes.map((n) => [n.id, n]));
  const features = [
    ...doc.nodes.map((n) => {
      const { x_m, y_m, ...props } = n;
      return { type: 'Feature' as const, id: n.id, geometry: { type: 'Point' as const, coordinates: [x_m ?? 0, y_m ?? 0] }, properties: props as Record<string, unknown> };
    }),
    ...doc.links.map((l) => {
      const { vertices: _v, ...props } = l;
      return {
        type: 'Feature' as const, id: l.id,
        geometry: { type: 'LineString' as const, coordinates: linkPoints(l, byId).map((p) => [p.x, p.y]) },
        properties: props as Record<string, unknown>,
      };
    }),
  ];
  return { type: 'FeatureCollection', crs_note: 'Coordinates are local site metres (x east, y north), not longitude/latitude.', features };
}
