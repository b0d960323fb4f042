import { expect } from 'chai';
import { GRAVITY_MS2 } from '../../engine/constants';
import { equalisationTime } from '../../engine/equalise';
import { hillSmallholding, twoTankBank } from '../../engine/examples/hill-smallholding';
import { hazenWilliamsResistance, HW_FLOW_EXPONENT } from '../../engine/hazen-williams';
import type { NetworkDocument, TankNode } from '../../engine/network-document';
import { area, bisect, hwLoss, minorLoss } from './hand-formulas';

/**
 * Tank banks equalising (equalise.ts) against closed forms (REFERENCES.md, worked examples, V):
 * two tanks joined through an orifice, Q = K·√Δh with K = Cd·a·√(2g), close their level gap H in
 * T = 2·√H / (K·(1/A1 + 1/A2)); to a residual spread tol the time is 2·(√H − √tol)/(K·(1/A1 + 1/A2)).
 */
const K = 0.001 * Math.sqrt(2 * GRAVITY_MS2); // a = 0.001 m², Cd = 1

describe('tank-bank equalisation (equalise.ts)', () => {
  it('the worked example: A = 1 m², a = 0.001 m², Cd = 1, H = 1 m → T = 225.8 s (REFERENCES.md, C)', () => {
    const r = equalisationTime(twoTankBank, { tanks: ['TA', 'TB'], tolerance_m: 1e-8 });
    expect(r.equalises).to.equal(true);
    expect(r.time_s).to.be.closeTo(225.8, 0.1);
    expect(r.levels_m['TA']).to.be.closeTo(1, 1e-6);
    expect(r.levels_m['TB']).to.be.closeTo(1, 1e-6);
  });

  it('to a 5 mm spread it takes 2(√H − √tol)/(K(1/A1 + 1/A2)) to 0.1 %', () => {
    const tol = 0.005;
    const r = equalisationTime(twoTankBank, { tanks: ['TA', 'TB'], tolerance_m: tol });
    const expected = (2 * (1 - Math.sqrt(tol))) / (K * 2);
    expect(r.time_s).to.be.closeTo(expected, 1e-3 * expected);
  });

  it('unequal tanks (A1 = 1 m², A2 = 3 m²) equalise at the area-weighted level in T = 2√H/(K(1/A1 + 1/A2))', () => {
    const doc = structuredClone(twoTankBank);
    (doc.nodes[1] as TankNode).diameter_m = Math.sqrt(12 / Math.PI);
    const r = equalisationTime(doc, { tanks: ['TA', 'TB'], tolerance_m: 1e-8 });
    expect(r.time_s).to.be.closeTo((2 * 1) / (K * (1 + 1 / 3)), 0.1);
    // conservation of volume: 1.5·1 + 0.5·3 = 3 m³ over 4 m² → 0.75 m
    expect(r.levels_m['TA']).to.be.closeTo(0.75, 1e-6);
    expect(r.levels_m['TB']).to.be.closeTo(0.75, 1e-6);
  });

  it('a Hazen-Williams header: Δh^0.46 falls linearly, T = (H^0.46 − tol^0.46)/(0.46·(1/A1 + 1/A2)·r^−0.54)', () => {
    // header: 6 m of 2" Sch 40 (ID 2.067 in), C = 150, no minor loss; tanks 2.44 m across
    const d = 2.067 * 0.0254;
    const doc: NetworkDocument = {
      schema: 'runnel.network/1',
      headloss: 'hazen-williams',
      nodes: [
        { id: 'T1', kind: 'tank', elevation_m: 100, diameter_m: 2.44, level_m: 1.8, min_level_m: 0, max_level_m: 2, bank: 'b' },
        { id: 'T2', kind: 'tank', elevation_m: 100, diameter_m: 2.44, level_m: 0.6, min_level_m: 0, max_level_m: 2, bank: 'b' },
      ],
      links: [{ id: 'H', kind: 'pipe', from: 'T1', to: 'T2', length_m: 6, diameter_m: d, roughness: 150 }],
    };
    const tol = 0.002;
    const r = equalisationTime(doc, { tanks: ['T1', 'T2'], tolerance_m: tol });
    const area = (Math.PI * 2.44 * 2.44) / 4;
    const beta = 1 / HW_FLOW_EXPONENT;
    const res = hazenWilliamsResistance(6, d, 150);
    const expected = (1.2 ** (1 - beta) - tol ** (1 - beta)) / ((1 - beta) * (2 / area) * res ** -beta);
    expect(r.equalises).to.equal(true);
    expect(r.time_s).to.be.closeTo(expected, 2e-3 * expected);
  });

  it('the demo ridge bank equalises once the tanks start apart', () => {
    const doc = structuredClone(hillSmallholding);
    (doc.nodes.find((n) => n.id === 'T1') as TankNode).level_m = 1.8;
    (doc.nodes.find((n) => n.id === 'T2') as TankNode).level_m = 0.6;
    const r = equalisationTime(doc, { tanks: ['T1', 'T2'], tolerance_m: 0.005 });
    expect(r.equalises).to.equal(true);
    // Worked apart from the engine: the 4 m header of 2" Sch 40 (ID 2.067 in, ASTM D1785, V2), PVC C 150,
    // K 1.5 passes Q(Δ) with hwLoss(Q) + K·v²/2g = Δ (bisection); two tanks of A = π·2.44²/4 close their
    // gap as dΔ/dt = −2Q/A, so T = (A/2)·∫ dΔ/Q(Δ) from 0.005 to 1.2 m (Simpson on ln Δ, 4000 panels; C)
    const d = 2.067 * 0.0254;
    const flow = (gap: number) => bisect((q) => hwLoss(q, 4, d, 150) + minorLoss(1.5, q, d) - gap, 0, 1);
    const [lo, hi, n] = [Math.log(0.005), Math.log(1.2), 4000];
    const g = (u: number) => Math.exp(u) / flow(Math.exp(u));
    let sum = g(lo) + g(hi);
    for (let i = 1; i < n; i++) sum += (i % 2 ? 4 : 2) * g(lo + ((hi - lo) * i) / n);
    const byHand = ((area(2.44) / 2) * (sum * (hi - lo))) / (3 * n);
    expect(byHand).to.be.closeTo(867, 1); // about 14½ minutes
    expect(r.time_s).to.be.closeTo(byHand, 1e-3 * byHand);
    expect(Math.abs(r.levels_m['T1'] - r.levels_m['T2'])).to.be.at.most(0.005 + 1e-9);
    expect(r.levels_m['T1'] + r.levels_m['T2']).to.be.closeTo(2.4, 1e-6); // volume conserved (equal tanks)
  });

  it('a shut header gives a clear "does not equalise"', () => {
    const doc = structuredClone(twoTankBank);
    doc.links[0] = { ...doc.links[0], kind: 'valve', valve_type: 'shutoff', open: false } as NetworkDocument['links'][number];
    const r = equalisationTime(doc, { tanks: ['TA', 'TB'], tolerance_m: 0.01 });
    expect(r.equalises).to.equal(false);
    expect(r.reason).to.match(/no water moves/);
  });

  it('names a non-tank id', () => {
    const r = equalisationTime(twoTankBank, { tanks: ['TA', 'nope'], tolerance_m: 0.01 });
    expect(r.equalises).to.equal(false);
    expect(r.warnings[0]).to.deep.include({ code: 'invalid', element: 'nope' });
  });
});
