import { expect } from 'chai';
import { colebrookFactor } from '../../engine/colebrook';
import { GRAVITY_MS2 } from '../../engine/constants';
import { darcyFactor, darcyFactorAndSlope, darcyWeisbachHeadloss } from '../../engine/darcy-weisbach';
import { hazenWilliamsHeadloss, hazenWilliamsResistance, HW_OMEGA_SI } from '../../engine/hazen-williams';
import { minorLossCoefficient } from '../../engine/minor-loss';
import { swameeJainFactor } from '../../engine/swamee-jain';
import { colebrook } from './hand-formulas';

const GPM = 3.785411784e-3 / 60; // m³/s per US gpm (exact by definition, NIST SP 811)
const FT = 0.3048;

describe('Hazen-Williams headloss (hazen-williams.ts)', () => {
  // Illinois Administrative Code title 77 part 906, Exhibit I, Schedule 40 plastic, C = 150 (V, REFERENCES.md).
  // 1" Schedule 40 nominal ID 1.049 in (ASTM D1785, V2); the check assumes ω = 10.67.
  const id = 1.049 * 0.0254;
  it('1" Sch 40 at 5 gpm loses 1.52 ft per 100 ft (Illinois Admin Code 77-906 Exh. I, V)', () => {
    const ftPer100 = hazenWilliamsHeadloss(5 * GPM, 100 * FT, id, 150) / FT;
    expect(ftPer100).to.be.closeTo(1.52, 0.01);
  });
  it('1" Sch 40 at 10 gpm loses 5.50 ft per 100 ft (Illinois Admin Code 77-906 Exh. I, V)', () => {
    const ftPer100 = hazenWilliamsHeadloss(10 * GPM, 100 * FT, id, 150) / FT;
    expect(ftPer100).to.be.closeTo(5.5, 0.02);
  });
  it('scales as Q^1.852, L and D^-4.8704 (the defining form of the SI formula)', () => {
    const h = hazenWilliamsHeadloss(0.001, 100, 0.05, 140);
    expect(hazenWilliamsHeadloss(0.002, 100, 0.05, 140) / h).to.be.closeTo(2 ** 1.852, 1e-12);
    expect(hazenWilliamsHeadloss(0.001, 300, 0.05, 140) / h).to.be.closeTo(3, 1e-12);
    expect(hazenWilliamsHeadloss(0.001, 100, 0.1, 140) / h).to.be.closeTo(2 ** -4.8704, 1e-12);
    expect(h).to.be.closeTo((HW_OMEGA_SI * 100 * 0.001 ** 1.852) / (140 ** 1.852 * 0.05 ** 4.8704), 1e-12);
  });
  it('is odd in the flow and zero at zero flow', () => {
    expect(hazenWilliamsHeadloss(-0.001, 100, 0.05, 140)).to.equal(-hazenWilliamsHeadloss(0.001, 100, 0.05, 140));
    expect(hazenWilliamsHeadloss(0, 100, 0.05, 140)).to.equal(0);
  });
  it('ω is a parameter: 10.5088 gives 1.5 % less loss than 10.667 (REFERENCES.md)', () => {
    expect(hazenWilliamsResistance(1000, 0.3, 130, 10.5088) / hazenWilliamsResistance(1000, 0.3, 130, 10.667)).to.be.closeTo(10.5088 / 10.667, 1e-15);
  });
});

describe('Colebrook-White friction factor (colebrook.ts)', () => {
  // Colebrook-White (1939) solved exactly, table in REFERENCES.md (C), 6 significant figures.
  const table: [number, number, number][] = [
    [4e3, 0, 0.039907],
    [4e3, 1e-4, 0.040008],
    [4e3, 1e-3, 0.04091],
    [4e3, 1e-2, 0.049082],
    [1e4, 0, 0.030883],
    [1e4, 1e-4, 0.031037],
    [1e4, 1e-3, 0.032382],
    [1e4, 1e-2, 0.043127],
    [1e5, 0, 0.01799],
    [1e5, 1e-4, 0.018514],
    [1e5, 1e-3, 0.022175],
    [1e5, 1e-2, 0.038504],
    [1e6, 0, 0.011645],
    [1e6, 1e-4, 0.013441],
    [1e6, 1e-3, 0.019943],
    [1e6, 1e-2, 0.037965],
    [1e7, 0, 0.008103],
    [1e7, 1e-4, 0.012166],
    [1e7, 1e-3, 0.019667],
    [1e7, 1e-2, 0.03791],
  ];
  for (const [re, rr, f] of table) {
    it(`Re ${re.toExponential(0)}, ε/D ${rr}: f = ${f} (REFERENCES.md, C)`, () => {
      expect(colebrookFactor(re, rr)).to.be.closeTo(f, 6e-7);
    });
  }
  it('the table itself is reproduced by plain fixed-point iteration on 1/√f, written apart from the engine (hand-formulas.ts, C)', () => {
    for (const [re, rr, f] of table) expect(colebrook(re, rr), `Re ${re}, ε/D ${rr}`).to.be.closeTo(f, 6e-7);
  });
  it('satisfies the Colebrook equation itself to 1e-12 (the defining identity)', () => {
    for (const re of [2500, 3e4, 7e5, 5e7])
      for (const rr of [0, 1e-5, 3e-3, 0.05]) {
        const f = colebrookFactor(re, rr);
        const residual = 1 / Math.sqrt(f) + 2 * Math.log10(rr / 3.7 + 2.51 / (re * Math.sqrt(f)));
        expect(Math.abs(residual)).to.be.below(1e-12);
      }
  });
  it('reads about 0.0185 at Re 1e5, ε/D 1e-4 like the Moody (1944) chart (M)', () => {
    expect(colebrookFactor(1e5, 1e-4)).to.be.closeTo(0.0185, 0.0002);
  });
});

describe('Swamee-Jain explicit factor (swamee-jain.ts)', () => {
  const worst = (reLow: number): number => {
    let w = 0;
    for (let le = Math.log10(reLow); le <= 8.0001; le += 0.05)
      for (let lr = -6; lr <= -1.9999; lr += 0.05) {
        const re = 10 ** le;
        const rr = 10 ** lr;
        w = Math.max(w, Math.abs(swameeJainFactor(re, rr) / colebrookFactor(re, rr) - 1));
      }
    return w;
  };
  it('is within 2.1 % of Colebrook for Re 1e4–1e8, ε/D 1e-6–1e-2 (REFERENCES.md, C)', () => {
    expect(worst(1e4)).to.be.below(0.0213);
  });
  it('reaches 2.8 % at the corner Re 5e3, ε/D 1e-2 (computed here; REFERENCES.md quotes 2.1 % down to 5e3)', () => {
    const w = worst(5e3);
    expect(w).to.be.above(0.021);
    expect(w).to.be.below(0.029);
  });
});

describe('Darcy-Weisbach headloss (darcy-weisbach.ts)', () => {
  it('is laminar f = 64/Re below Re 2000 (Hagen-Poiseuille)', () => {
    expect(darcyFactor(1000, 1e-3)).to.equal(0.064);
    expect(darcyFactor(1999, 0)).to.be.closeTo(64 / 1999, 1e-15);
  });
  it('is Colebrook above Re 4000 and continuous through the 2000–4000 band', () => {
    expect(darcyFactor(5000, 1e-4)).to.equal(colebrookFactor(5000, 1e-4));
    expect(darcyFactor(2000 + 1e-9, 1e-4)).to.be.closeTo(64 / 2000, 1e-9);
    expect(darcyFactor(4000 - 1e-9, 1e-4)).to.be.closeTo(colebrookFactor(4000, 1e-4), 1e-9);
    let previous = darcyFactor(1990, 1e-4);
    for (let re = 2000; re <= 4010; re += 10) {
      const f = darcyFactor(re, 1e-4);
      expect(Math.abs(f - previous)).to.be.below(3e-4);
      previous = f;
    }
  });
  it('reports d ln f / d ln Re consistent with finite differences (used as the Newton gradient)', () => {
    const out = new Float64Array(2);
    for (const re of [500, 2500, 3500, 1e4, 1e6]) {
      darcyFactorAndSlope(re, 1e-4, out);
      const h = 1e-6;
      const fd = (Math.log(darcyFactor(re * (1 + h), 1e-4)) - Math.log(darcyFactor(re * (1 - h), 1e-4))) / (Math.log(1 + h) - Math.log(1 - h));
      expect(out[1]).to.be.closeTo(fd, 1e-5);
    }
  });
  it('equals f·(L/D)·v²/2g (the defining formula) and is finite at zero flow', () => {
    const q = 0.002;
    const d = 0.05;
    const v = q / ((Math.PI * d * d) / 4);
    const re = (v * d) / 1.004e-6;
    const f = darcyFactor(re, 0.0015 / 1000 / d);
    expect(darcyWeisbachHeadloss(q, 100, d, 0.0015)).to.be.closeTo((f * (100 / d) * v * v) / (2 * GRAVITY_MS2), 1e-12);
    expect(darcyWeisbachHeadloss(0, 100, d, 0.0015)).to.equal(0);
  });
});

describe('minor losses (minor-loss.ts)', () => {
  it('K·v²/2g written as m·Q² (Weisbach form)', () => {
    const d = 0.04;
    const q = 0.001;
    const v = q / ((Math.PI * d * d) / 4);
    expect(minorLossCoefficient(1.5, d) * q * q).to.be.closeTo((1.5 * v * v) / (2 * GRAVITY_MS2), 1e-12);
  });
});
