import { expect } from 'chai';
import fc from 'fast-check';
import { solve } from '../../engine/steady';
import { build, genArb, violation } from './generated-networks.helpers';

describe('generated networks with valves and pumps of every kind (fast-check, 1,200 networks)', () => {
  it('each answer satisfies continuity to 1e-9 m³/s and every element law to 1e-6 m, or says converged:false with a reason', () => {
    let converged = 0;
    let refused = 0;
    fc.assert(
      fc.property(genArb, (g) => {
        const doc = build(g);
        const r = solve(doc);
        if (r.warnings.some((w) => w.code === 'invalid')) return; // the generator may draw a shape the document rules refuse
        if (r.converged) {
          converged++;
          const broken = violation(doc, r);
          expect(broken, JSON.stringify(doc)).to.equal(null);
        } else {
          refused++;
          expect(r.reason, JSON.stringify(doc))
            .to.be.a('string')
            .and.not.match(/singular/);
        }
      }),
      { numRuns: 1200 },
    );
    // almost every network has a physical answer and the solver must find it; the few refused are
    // ones like a constant-flow pump forcing water into a node it cannot leave (about 1.5 %)
    expect(converged).to.be.above(0.97 * (converged + refused));
  });
});
