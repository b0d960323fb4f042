import { expect } from 'chai';
import { hillSmallholding, twoTankBank } from '../../engine/examples/hill-smallholding';
import { simulate } from '../../engine/simulate';
import { solve } from '../../engine/steady';
import { validateDocument } from '../../engine/validate';

describe('demo network: the hill smallholding (examples/hill-smallholding.ts)', () => {
  const result = solve(hillSmallholding);

  it('is valid, has 50–60 elements, names and site-plan positions within about 600 m × 400 m', () => {
    expect(validateDocument(hillSmallholding)).to.deep.equal([]);
    expect(validateDocument(twoTankBank)).to.deep.equal([]);
    const count = hillSmallholding.nodes.length + hillSmallholding.links.length;
    expect(count).to.be.within(50, 60);
    for (const node of hillSmallholding.nodes) {
      expect(node.name, node.id).to.be.a('string');
      expect(node.x_m, node.id).to.be.within(0, 600);
      expect(node.y_m, node.id).to.be.within(0, 400);
    }
    for (const link of hillSmallholding.links) expect(link.name, link.id).to.be.a('string');
  });

  it('solves with no invalid or not-converged warnings (in fact none at all)', () => {
    expect(result.converged).to.equal(true);
    expect(result.warnings.map((w) => w.code)).to.not.include.members(['invalid', 'not-converged']);
    expect(result.warnings).to.deep.equal([]);
  });

  it('has the parts the brief asks for: well, solar pump with control, linked ridge tanks, PRV, drip, troughs, a profiled dip', () => {
    const kinds = (k: string) => hillSmallholding.nodes.filter((n) => n.kind === k);
    expect(kinds('source')[0]).to.deep.include({ source_type: 'well' });
    const tanks = kinds('tank');
    expect(tanks).to.have.length(2);
    expect(new Set(tanks.map((t) => (t.kind === 'tank' ? t.bank : '')))).to.have.property('size', 1);
    const pump = hillSmallholding.links.find((l) => l.kind === 'pump');
    expect(pump && pump.kind === 'pump' && pump.schedule?.length).to.equal(24);
    expect(pump && pump.kind === 'pump' && pump.control?.tank).to.equal('T1');
    const outlets = kinds('outlet');
    expect(outlets.filter((o) => o.kind === 'outlet' && o.float_valve)).to.have.length(4);
    expect(outlets.filter((o) => o.kind === 'outlet' && o.demand_model && o.demand_model.type !== 'fixed')).to.have.length(2);
    expect(hillSmallholding.links.filter((l) => l.kind === 'pipe' && l.profile)).to.not.have.length(0);
    expect(Object.keys(hillSmallholding.patterns ?? {})).to.include('stock');
  });

  it('ridge ~50 m above the farmhouse and sensible pressures at the outlets (mostly 15–60 m)', () => {
    const elevation = (id: string) => hillSmallholding.nodes.find((n) => n.id === id)?.elevation_m ?? NaN;
    expect(elevation('T1') - elevation('HOUSE')).to.be.within(40, 60);
    const outlets = hillSmallholding.nodes.filter((n) => n.kind === 'outlet').map((n) => result.nodes[n.id].pressure_m);
    for (const p of outlets) expect(p).to.be.within(3.5, 60);
    expect(outlets.filter((p) => p >= 15).length / outlets.length).to.be.above(0.7);
    // the orchard PRV holds 21 m (30 psi) for the drip blocks
    expect(result.links['PRV1'].status).to.equal('active');
    expect(result.nodes['J5'].pressure_m).to.be.closeTo(21, 1e-6);
  });

  it('runs a week without not-converged steps, with the pump refilling the ridge tanks each day', () => {
    const week = simulate(hillSmallholding, { duration_s: 7 * 86400, step_s: 3600 });
    expect(week.warnings.map((w) => w.code)).to.not.include('not-converged');
    expect(week.times_s).to.have.length(7 * 24 + 1);
    // conservation of volume over the week (C): pumped = delivered at every outlet + overflow + rise of the
    // two 2.44 m tanks (area π·2.44²/4 = 4.676 m² each); and the pump does work (about 19 m³ a day)
    const s = week.summary;
    const delivered = Object.values(s.outlets).reduce((sum, o) => sum + o.delivered_m3, 0);
    const overflow = Object.values(s.tanks).reduce((sum, t) => sum + t.overflow_m3, 0);
    const stored = ['T1', 'T2'].reduce(
      (sum, t) => sum + ((Math.PI * 2.44 ** 2) / 4) * ((week.tanks[t].level_m.at(-1) as number) - week.tanks[t].level_m[0]),
      0,
    );
    expect(s.pumps['PU1'].pumped_m3).to.be.closeTo(delivered + overflow + stored, 1e-4);
    expect(s.pumps['PU1'].pumped_m3 / 7).to.be.within(10, 30);
    for (const level of week.tanks['T1'].level_m) expect(level).to.be.within(0.15, 1.85);
  });
});
