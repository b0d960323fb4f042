import { expect } from 'chai';
import { geoReferenceOf, referenceAt, referenceFromTwoPoints, toLocal, toLonLat } from '../../engine/geo-reference';

/** Haversine distance on a sphere of the IUGG mean radius, m (a check independent of proj4). */
function haversine(lat1: number, lon1: number, lat2: number, lon2: number): number {
  const r = Math.PI / 180;
  const h = Math.sin(((lat2 - lat1) * r) / 2) ** 2 + Math.cos(lat1 * r) * Math.cos(lat2 * r) * Math.sin(((lon2 - lon1) * r) / 2) ** 2;
  return 2 * 6371008.8 * Math.asin(Math.sqrt(h));
}

describe('geo reference (plan metres ⇄ WGS 84)', () => {
  it('the origin is the reference place, and a point 1 km east is 1 km away on the globe (within 0.5 %, sphere vs ellipsoid)', () => {
    const ref = referenceAt(44.5, -122.1);
    expect(toLonLat(ref, 0, 0)).to.deep.equal([-122.1, 44.5]);
    const [lon, lat] = toLonLat(ref, 1000, 0);
    // a degree of longitude at 44.5° on WGS 84 is (π/180)·a·cos φ/√(1 − e²·sin²φ) = 79,529 m
    // (a = 6,378,137 m, e² = 0.00669438; geodesy texts, V2): 1 km east is 0.012574° (C)
    const phi = (44.5 * Math.PI) / 180;
    const degLon = ((Math.PI / 180) * 6378137 * Math.cos(phi)) / Math.sqrt(1 - 0.00669438 * Math.sin(phi) ** 2);
    expect(lon).to.be.closeTo(-122.1 + 1000 / degLon, 2e-6);
    expect(lat).to.be.closeTo(44.5, 1e-4);
    expect(haversine(44.5, -122.1, lat, lon)).to.be.closeTo(1000, 5);
    // One degree of latitude is about 111.1 km near 45° (meridian arc on WGS 84; V2, geodesy tables).
    const [, north] = toLonLat(ref, 0, 1000);
    expect((north - 44.5) * 111132).to.be.closeTo(1000, 2);
  });

  it('toLocal inverts toLonLat to the millimetre, also rotated and scaled', () => {
    const ref = { ...referenceAt(-33.9, 151.2), x0_m: 250, y0_m: -40, rotation_rad: 0.4, scale: 1.02 };
    for (const [x, y] of [
      [0, 0],
      [1234.5, -877.25],
      [-3000, 2500],
    ]) {
      const [lon, lat] = toLonLat(ref, x, y);
      const back = toLocal(ref, lat, lon);
      expect(back.x_m).to.be.closeTo(x, 1e-3);
      expect(back.y_m).to.be.closeTo(y, 1e-3);
    }
  });

  it('two known points fix offset, rotation and scale', () => {
    const truth = { ...referenceAt(51.0, 7.0), x0_m: 10, y0_m: 20, rotation_rad: -0.3, scale: 0.5 };
    const place = (x: number, y: number) => {
      const [lon, lat] = toLonLat(truth, x, y);
      return { x_m: x, y_m: y, lat, lon };
    };
    const ref = referenceFromTwoPoints(place(0, 0), place(400, 300));
    const [lon, lat] = toLonLat(ref, -200, 900);
    const [lon2, lat2] = toLonLat(truth, -200, 900);
    expect(haversine(lat, lon, lat2, lon2)).to.be.lessThan(0.01);
    expect(() => referenceFromTwoPoints(place(1, 1), place(1, 1))).to.throw(/apart/);
  });

  it('reads only a well-formed reference from the document', () => {
    expect(geoReferenceOf(undefined)).to.equal(null);
    expect(geoReferenceOf({ geo: { lat: 45, lon: 7 } })).to.equal(null);
    expect(geoReferenceOf({ geo: { ...referenceAt(45, 7), scale: 0 } })).to.equal(null);
    expect(geoReferenceOf({ geo: referenceAt(45, 7) })).to.deep.equal(referenceAt(45, 7));
  });
});
