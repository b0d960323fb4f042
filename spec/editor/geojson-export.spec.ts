import { expect } from 'chai';
import { NO_GEO_REFERENCE, toGeoJson } from '../../client/src/app/screens/layout/editor/geojson-export';
import { referenceAt, toLocal } from '../../engine/geo-reference';
import { solve } from '../../engine/steady';
import { createEditor } from '../../client/src/app/screens/layout/create-editor';

/** Haversine on the IUGG mean sphere, m: an outside check of the projected coordinates. */
function haversine([lon1, lat1]: number[], [lon2, lat2]: number[]): number {
  const r = Math.PI / 180;
  const h = Math.sin(((lat2 - lat1) * r) / 2) ** 2 + Math.cos(lat1 * r) * Math.cos(lat2 * r) * Math.sin(((lon2 - lon1) * r) / 2) ** 2;
  return 2 * 6371008.8 * Math.asin(Math.sqrt(h));
}

describe('Layout editor: GeoJSON export (RFC 7946, WGS 84)', () => {
  function network() {
    const ed = createEditor();
    ed.placeNode('tank', { x: 0, y: 0 });
    ed.placeNode('tee', { x: 300, y: 400 });
    ed.addLink('pipe', 'T1', 'J1', [[300, 0]]);
    return ed.store.doc;
  }

  it('without a geographic reference: a message saying how to get one, and no file', () => {
    const out = toGeoJson(network());
    expect(out).to.deep.equal({ message: NO_GEO_REFERENCE });
    expect(NO_GEO_REFERENCE).to.match(/no geographic reference/);
  });

  it('with one: longitude/latitude in GeoJSON order, distances kept, results as properties', () => {
    const doc = { ...network(), layout: { geo: referenceAt(44.5, -122.1, 'gpx') } };
    const results = solve(doc);
    const out = toGeoJson(doc, results);
    if (!('collection' in out)) throw new Error(out.message);
    const [tank, tee, pipe] = out.collection.features;
    expect(out.collection.type).to.equal('FeatureCollection');
    expect(tank.geometry).to.deep.equal({ type: 'Point', coordinates: [-122.1, 44.5] });
    const teeAt = tee.geometry.coordinates as number[];
    // The tee is 500 m from the tank on the plan (3-4-5); on the globe within 1 m (sphere vs ellipsoid).
    expect(haversine([-122.1, 44.5], teeAt)).to.be.closeTo(500, 1);
    const back = toLocal(doc.layout.geo, teeAt[1], teeAt[0]);
    expect(back.x_m).to.be.closeTo(300, 0.02);
    expect(back.y_m).to.be.closeTo(400, 0.02);
    expect(pipe.geometry.type).to.equal('LineString');
    expect((pipe.geometry.coordinates as number[][]).length).to.equal(3);
    expect(pipe.properties).to.include({ kind: 'pipe', from: 'T1', to: 'J1' });
    expect(pipe.properties['result_flow_m3s']).to.equal(results.links['P1'].flow_m3s);
    expect(tee.properties['result_pressure_m']).to.equal(results.nodes['J1'].pressure_m);
    expect(tee.properties).to.not.have.property('x_m');
  });
});
