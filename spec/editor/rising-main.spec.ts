import { expect } from 'chai';
import { createEditor } from '../../client/src/app/screens/layout/create-editor';
import { solve } from '../../engine/index';
import { hwLoss, minorLoss } from '../engine/hand-formulas';

describe('Layout: a pump comes with its rising main (newcomer item 3)', () => {
  it('drawing a pump from a well to a tank adds the pump, a pump-outlet tee and a real pipe along the drawn line, in one undo step', () => {
    const ed = createEditor(undefined, 800, 600);
    ed.units = 'si';
    const well = ed.placeNode('source', { x: 0, y: 0 })!;
    ed.store.patchElement(well, { elevation_m: 96, head_m: 58, elevation_source: undefined });
    const tank = ed.placeNode('tank', { x: 300, y: 400 })!;
    ed.store.patchElement(tank, { elevation_m: 158, elevation_source: undefined });
    const before = ed.store.doc;
    ed.addLink('pump', well, tank, [[0, 200]]);
    const doc = ed.store.doc;
    const pump = doc.links.find((l) => l.kind === 'pump')!;
    const main = doc.links.find((l) => l.kind === 'pipe')!;
    const outlet = doc.nodes.find((n) => n.id === pump.to)!;
    expect(pump.from).to.equal(well);
    expect(outlet.kind).to.equal('tee');
    expect(outlet.elevation_m).to.equal(96);
    expect([outlet.x_m, outlet.y_m]).to.deep.equal([0, 3]);
    expect(main).to.include({ name: 'Rising main', from: outlet.id, to: tank });
    expect(main.vertices).to.deep.equal([[0, 200]]);
    // Drawn length: 197 m up to the bend, then √(300² + 200²) = 360.6 m to the tank.
    expect(main.kind === 'pipe' && main.length_m).to.be.closeTo(197 + Math.hypot(300, 200), 0.01); // drawn lengths are kept to the centimetre
    // The climb now loses head to friction in the main: the pump works against more than the lift.
    const r = solve(doc);
    // By hand from the drawn inputs (C): the pump lifts from the well's 58 m water surface to the tank's
    // (158 m + its level) and pays the main's Hazen-Williams loss and its fittings' K·v²/2g at its flow
    // (spec/engine/hand-formulas.ts, REFERENCES.md)
    const tankNode = doc.nodes.find((n) => n.id === tank) as { level_m: number };
    if (main.kind !== 'pipe' || pump.kind !== 'pump') throw new Error('expected a pipe and a pump');
    const q = pump.flow_m3s as number;
    const lift = 158 + tankNode.level_m - 58;
    const friction = hwLoss(q, main.length_m, main.diameter_m, main.roughness) + minorLoss(main.minor_loss ?? 0, q, main.diameter_m);
    expect(friction).to.be.above(0.1);
    expect(-r.links[pump.id].headloss_m).to.be.closeTo(lift + friction, 1e-6);
    ed.undo();
    expect(ed.store.doc).to.equal(before);
  });
});
