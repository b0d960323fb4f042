import { expect } from 'chai';
import { hillSmallholding, solve } from '../../engine/index';
import { M_PER_PSI } from './hand-formulas';
import { outletState, pipeWork, ratingState, serviceStates, tankVolume } from '../../engine/service-state';

describe('Service states: what the plan says about each element', () => {
  it("an outlet is short below its requirement, close within 10 % above it, OK beyond (the review checklist's outlet rule)", () => {
    expect(outletState(9.9, 10)).to.equal('short');
    expect(outletState(10.5, 10)).to.equal('close');
    expect(outletState(11.5, 10)).to.equal('ok');
    expect(outletState(5, undefined)).to.equal('unknown');
    expect(outletState(5, 3, false)).to.equal('no-supply');
  });

  it('a junction above 72 % of its pipe rating is near it (ASABE S376 working share, via the review rule), at 100 % over', () => {
    expect(ratingState(0.7)).to.equal('fine');
    expect(ratingState(0.73)).to.equal('near');
    expect(ratingState(1.02)).to.equal('over');
  });

  it('pipe work bands from the velocity as a share of 1.5 m/s (Jarrett, V2)', () => {
    expect(pipeWork(0.3, true)).to.equal('light');
    expect(pipeWork(0.9, true)).to.equal('working');
    expect(pipeWork(1.3, true)).to.equal('hard');
    expect(pipeWork(1.6, true)).to.equal('over');
    expect(pipeWork(0, false)).to.equal('idle');
  });

  it('tank volume is π d²/4 × level: a 2.44 m tank at 1.3 m holds 6.079 m³ (C, by hand: 3.1416 × 5.9536 / 4 × 1.3)', () => {
    expect(tankVolume(2.44, 1.3)).to.be.closeTo(6.0787, 0.001);
  });

  it('the demo: the wellhead is marked near its rating (not healthy), the troughs are OK with their margin, the ridge tanks report their water', () => {
    const res = solve(hillSmallholding);
    const s = serviceStates(hillSmallholding, res);
    const wh = s.nodes['WH'];
    const r1 = hillSmallholding.links.find((l) => l.id === 'R1')!;
    // R1 is 1" PE SIDR 9: P = 2S/(SIDR + 1) = 2·800/10 = 160 psi (NRCS NEH; PE3608 HDS 800 psi, PPI, V),
    // 160 × 0.70307 m/psi = 112.49 m (NIST SP 811 factors, C)
    expect(r1.kind === 'pipe' && r1.rating_m).to.be.closeTo(160 * M_PER_PSI, 0.01);
    // The share is the solved pressure over the rising main's rating, recomputed here from both.
    expect(wh.ratingShare).to.be.closeTo(res.nodes['WH'].pressure_m / (r1 as { rating_m: number }).rating_m, 1e-9);
    expect(wh.rating).to.equal('near');
    const tr4 = s.nodes['TR4'];
    expect(tr4.state).to.equal('ok');
    expect(tr4.margin_m).to.be.closeTo(res.nodes['TR4'].pressure_m - 3.5, 1e-9);
    expect(s.nodes['T1'].capacity_m3).to.be.closeTo(tankVolume(2.44, 1.85), 1e-9);
    expect(s.links['R1'].work).to.not.equal('idle');
  });
});
