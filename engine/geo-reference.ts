/**
 * Where the site plan sits on the Earth: a Transverse Mercator projection (WGS 84 ellipsoid, scale
 * 1) centred on a known place, plus the plan's offset, rotation and scale against it. Kept in the
 * network document as `layout.geo`. Transverse Mercator is conformal and, within a few kilometres
 * of its centre, distorts distances by less than 1 part in 10⁶ (scale k ≈ 1 + x²/2R²), so plan
 * metres and ground metres agree on a farm-sized site. Projection maths by proj4.
 *
 * @example
 * const ref = referenceAt(44.5, -122.1);          // plan origin at that place, plan north = true north
 * toLonLat(ref, 100, 0);                           // ≈ [-122.09874, 44.5]
 * toLocal(ref, 44.5, -122.09874);                  // ≈ { x_m: 100, y_m: 0 }
 */
import proj4 from 'proj4';

export interface GeoReference {
  /** Centre of the projection, degrees (WGS 84). */
  lat: number;
  lon: number;
  /** Plan coordinates of that centre, m. */
  x0_m: number;
  y0_m: number;
  /** Turn from plan axes to grid east/north, radians counter-clockwise; 0 when plan north is north. */
  rotation_rad: number;
  /** Grid metres per plan metre; 1 unless fitted to two known points. */
  scale: number;
  /** Where the reference came from, for the screen to say. */
  source: 'gpx' | 'walk' | 'two-points' | 'demo';
}

function projection(ref: Pick<GeoReference, 'lat' | 'lon'>): proj4.Converter {
  return proj4('WGS84', `+proj=tmerc +lat_0=${ref.lat} +lon_0=${ref.lon} +k=1 +x_0=0 +y_0=0 +ellps=WGS84 +units=m +no_defs`);
}

/** A reference whose plan origin (0, 0) is at lat/lon, plan north = true north. */
export function referenceAt(lat: number, lon: number, source: GeoReference['source'] = 'walk'): GeoReference {
  return { lat, lon, x0_m: 0, y0_m: 0, rotation_rad: 0, scale: 1, source };
}

/** [longitude, latitude] of a plan point (GeoJSON order, RFC 7946 §3.1.1). */
export function toLonLat(ref: GeoReference, x_m: number, y_m: number): [number, number] {
  const dx = (x_m - ref.x0_m) * ref.scale;
  const dy = (y_m - ref.y0_m) * ref.scale;
  const c = Math.cos(ref.rotation_rad);
  const s = Math.sin(ref.rotation_rad);
  const [lon, lat] = projection(ref).inverse([dx * c - dy * s, dx * s + dy * c]);
  return [lon, lat];
}

/** Plan metres of a place. */
export function toLocal(ref: GeoReference, lat: number, lon: number): { x_m: number; y_m: number } {
  const [e, n] = projection(ref).forward([lon, lat]);
  const c = Math.cos(-ref.rotation_rad);
  const s = Math.sin(-ref.rotation_rad);
  return { x_m: ref.x0_m + (e * c - n * s) / ref.scale, y_m: ref.y0_m + (e * s + n * c) / ref.scale };
}

/**
 * The reference that puts two plan points on two known places (a similarity: offset, rotation,
 * scale). Throws when the plan points coincide or the places do.
 */
export function referenceFromTwoPoints(
  a: { x_m: number; y_m: number; lat: number; lon: number },
  b: { x_m: number; y_m: number; lat: number; lon: number },
): GeoReference {
  const plan = Math.hypot(b.x_m - a.x_m, b.y_m - a.y_m);
  const [e, n] = projection(a).forward([b.lon, b.lat]);
  const grid = Math.hypot(e, n);
  if (plan < 1e-6 || grid < 1e-6) throw new Error('The two known points must be apart on the plan and on the ground');
  const rotation = Math.atan2(n, e) - Math.atan2(b.y_m - a.y_m, b.x_m - a.x_m);
  return { lat: a.lat, lon: a.lon, x0_m: a.x_m, y0_m: a.y_m, rotation_rad: rotation, scale: grid / plan, source: 'two-points' };
}

/** The document's reference, if it has a well-formed one. */
export function geoReferenceOf(layout: Record<string, unknown> | undefined): GeoReference | null {
  const g = layout?.['geo'] as Partial<GeoReference> | undefined;
  if (!g || typeof g !== 'object') return null;
  const nums = [g.lat, g.lon, g.x0_m, g.y0_m, g.rotation_rad, g.scale];
  if (!nums.every((v) => typeof v === 'number' && Number.isFinite(v)) || !(g.scale! > 0) || Math.abs(g.lat!) > 90 || Math.abs(g.lon!) > 180) return null;
  return g as GeoReference;
}
