import { expect } from 'chai';
import { parseQuantity } from '../../engine/quantity-input';

// Expected SI values from the exact definitions (NIST SP 811, V): 1 ft = 0.3048 m, 1 in = 0.0254 m,
// 1 US gal = 3.785411784 L, 1 psi = 6894.757293168 Pa, 1 m of water = 9806.65 Pa.
const si = (text: string, q: Parameters<typeof parseQuantity>[1], system: 'us' | 'si' = 'us'): number => {
  const r = parseQuantity(text, q, system);
  if (!r.ok) throw new Error(r.message);
  return r.si;
};

describe('parseQuantity (engine/quantity-input.ts, mathjs): typed quantities to SI', () => {
  it('lengths and diameters with units, fractions included', () => {
    expect(si('150 ft', 'length')).to.be.closeTo(150 * 0.3048, 1e-12);
    expect(si('3/4 in', 'diameter')).to.be.closeTo(0.75 * 0.0254, 1e-15);
    expect(si('1 1/2 in', 'diameter')).to.be.closeTo(1.5 * 0.0254, 1e-15); // a mixed number, as farmers write sizes
    expect(si('32 mm', 'diameter', 'si')).to.be.closeTo(0.032, 1e-15);
    expect(si('2 m + 6 in', 'length')).to.be.closeTo(2 + 6 * 0.0254, 1e-12);
  });

  it('flows and pressures', () => {
    expect(si('2 gpm', 'flow')).to.be.closeTo((2 * 3.785411784e-3) / 60, 1e-15);
    expect(si('0.5 L/s', 'flow', 'si')).to.be.closeTo(5e-4, 1e-15);
    // mathjs defines psi as 6894.75729 Pa (rounded): agreement to 1e-6 m of water.
    expect(si('40 psi', 'pressure')).to.be.closeTo((40 * 6894.757293168) / 9806.65, 1e-6);
    expect(si('100 kPa', 'pressure', 'si')).to.be.closeTo(1e5 / 9806.65, 1e-9);
  });

  it('a bare number is read in the field’s display unit for the unit system', () => {
    expect(si('100', 'length', 'us')).to.be.closeTo(30.48, 1e-12);
    expect(si('100', 'length', 'si')).to.equal(100);
    expect(si('10', 'flow', 'si')).to.be.closeTo(0.01, 1e-15);
  });

  it('a clear error for the wrong kind of unit, junk and code', () => {
    expect(parseQuantity('12 kg', 'length', 'us')).to.deep.equal({ ok: false, message: '"12 kg" is not a length (try ft or m)' });
    expect(parseQuantity('two feet', 'length', 'us').ok).to.equal(false);
    expect(parseQuantity('x = 3', 'length', 'us')).to.deep.equal({ ok: false, message: '"x = 3" is not a number with a unit' });
    expect(parseQuantity('', 'length', 'us')).to.deep.equal({ ok: false, message: 'enter a number' });
    expect(parseQuantity('1/0', 'length', 'us')).to.deep.equal({ ok: false, message: '"1/0" is not a finite number' });
  });
});

describe('parseQuantity: head and pressure typed either way, emitter flows', () => {
  it('a length in a pressure field is that column of water; a pressure in a head field is the column it holds up', () => {
    expect(si('20 m', 'pressure', 'si')).to.equal(20);
    expect(si('60 ft', 'pressure', 'us')).to.be.closeTo(60 * 0.3048, 1e-12);
    // 1 psi = 6894.757 Pa (NIST SP 811, V) over 9806.65 Pa per m of water = 0.70307 m.
    expect(si('10 psi', 'head', 'us')).to.be.closeTo((10 * 6894.757293168) / 9806.65, 1e-6);
    expect(parseQuantity('3 kg', 'pressure', 'si')).to.deep.equal({ ok: false, message: '"3 kg" is not a pressure (try psi or kPa)' });
  });

  it('an emitter flow in gph or L/h', () => {
    expect(si('0.5 gph', 'emitter-flow', 'us')).to.be.closeTo((0.5 * 3.785411784e-3) / 3600, 1e-15);
    expect(si('2 L/h', 'emitter-flow', 'si')).to.be.closeTo(2e-3 / 3600, 1e-15);
    expect(si('2', 'emitter-flow', 'si')).to.be.closeTo(2e-3 / 3600, 1e-15); // bare: the display unit, L/h
  });
});
