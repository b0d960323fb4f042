import { expect } from 'chai';
import type { OutletNode } from '../../engine/network-document';
import { parseDocument } from '../../engine/validate';
import { dripFields } from '../../client/src/app/screens/layout/kinds/farm-terms';

const field = (key: string) => dripFields.find((f) => f.key === key)!;
const zone = (extra: Partial<OutletNode> = {}): OutletNode => ({
  id: 'D',
  kind: 'outlet',
  elevation_m: 0,
  outlet_type: 'drip-zone',
  demand_m3s: 240 * (2e-3 / 3600),
  emitters: 240,
  ...extra,
});
const apply = (o: OutletNode, patch: Record<string, unknown>): OutletNode => ({ ...o, ...patch }) as OutletNode;

/** A drip zone entered as rows of tape in the properties panel (issue 12: "tape length × flow per 100 ft"). */
describe('Layout: a drip zone as rows of tape', () => {
  it("switching to tape keeps the zone's flow; rows, row length and spacing then set emitters and flow (engine/drip-tape)", () => {
    let o = zone();
    const before = o.demand_m3s;
    o = apply(o, field('drip_entry').choose!(o, 'tape'));
    expect(o.drip_tape).to.deep.equal({ rows: 1, row_length_m: 72, spacing_m: 0.3 });
    expect(o.demand_m3s).to.be.closeTo(before, 1e-15);
    expect(field('emitter_flow').read!(o)).to.be.closeTo(2e-3 / 3600, 1e-15);
    // 6 rows of 25 m at 30 cm, 2 L/h each: 500 emitters, 1000 L/h (C: rows × length ÷ spacing × flow).
    o = apply(o, field('drip_tape.rows').write!(o, 6));
    o = apply(o, field('drip_tape.row_length_m').write!(o, 25));
    expect(o.emitters).to.equal(500);
    expect(o.demand_m3s * 3.6e6).to.be.closeTo(1000, 1e-9);
    o = apply(o, field('emitter_flow').write!(o, 1.6e-3 / 3600));
    expect(o.demand_m3s * 3.6e6).to.be.closeTo(800, 1e-9);
    o = apply(o, field('drip_tape.spacing_m').write!(o, 0.6));
    expect(o.emitters).to.equal(250);
    expect(o.demand_m3s * 3.6e6).to.be.closeTo(400, 1e-9);
    expect(parseDocument({ schema: 'runnel.network/1', headloss: 'hazen-williams', nodes: [o], links: [] }).ok).to.equal(true);
  });

  it('shows the tape fields only for a zone laid as tape, the emitter count only for one counted', () => {
    const counted = zone();
    const taped = zone({ drip_tape: { rows: 2, row_length_m: 10, spacing_m: 0.3 } });
    expect(field('drip_tape.rows').when!(counted)).to.equal(false);
    expect(field('drip_tape.rows').when!(taped)).to.equal(true);
    expect(field('emitters').when!(taped)).to.equal(false);
    expect(field('drip_entry').read!(taped)).to.equal('tape');
    expect(field('drip_entry').choose!(taped, 'emitters')).to.deep.equal({ drip_tape: undefined });
  });

  it('a tape the schema cannot take is refused with the field named', () => {
    const r = parseDocument({
      schema: 'runnel.network/1',
      headloss: 'hazen-williams',
      links: [],
      nodes: [zone({ drip_tape: { rows: 0, row_length_m: 10, spacing_m: 0.3 } })],
    });
    expect(r.ok).to.equal(false);
    expect(JSON.stringify(r)).to.match(/drip_tape\.rows/);
  });
});
