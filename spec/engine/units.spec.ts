import { expect } from 'chai';
import { fromDisplay, toDisplay, formatQuantity } from '../../engine/units';

describe('units (display conversion)', () => {
  it('100 ft is 30.48 m (exact by definition, NIST SP 811)', () => {
    expect(fromDisplay('length', 100, 'us')).to.be.closeTo(30.48, 1e-12);
  });
  it('2.31 ft of water per psi (V, supplier tables; 2.307 at 62 °F, Engineering ToolBox)', () => {
    const ftPerPsi = toDisplay('head', fromDisplay('pressure', 1, 'us'), 'us');
    expect(ftPerPsi).to.be.closeTo(2.31, 0.01);
  });
  it('round-trips flow in gpm', () => {
    expect(toDisplay('flow', fromDisplay('flow', 7.5, 'us'), 'us')).to.be.closeTo(7.5, 1e-12);
  });
  it('formats with the unit', () => {
    expect(formatQuantity('pressure', 10, 'si')).to.equal('98 kPa');
  });
});
