import { expect } from 'chai';
import { fromDisplay, toDisplay, formatQuantity, groupThousands } from '../../engine/units';

describe('units (display conversion)', () => {
  it('100 ft is 30.48 m (exact by definition, NIST SP 811)', () => {
    expect(fromDisplay('length', 100, 'us')).to.be.closeTo(30.48, 1e-12);
  });
  it('2.31 ft of water per psi (V, supplier tables; 2.307 at 62 °F, Engineering ToolBox)', () => {
    const ftPerPsi = toDisplay('head', fromDisplay('pressure', 1, 'us'), 'us');
    expect(ftPerPsi).to.be.closeTo(2.31, 0.01);
  });
  it('1 US gpm is 0.0630902 L/s (231 in³ per gallon, exact by definition, NIST SP 811) and round-trips', () => {
    expect(fromDisplay('flow', 1, 'us')).to.be.closeTo(0.003785411784 / 60, 1e-15);
    expect(toDisplay('flow', fromDisplay('flow', 7.5, 'us'), 'us')).to.be.closeTo(7.5, 1e-12);
  });
  it('formats with the unit: 10 m of water is 1000 kg/m³ × 9.80665 m/s² × 10 m = 98.07 kPa, shown as 98 kPa', () => {
    expect(formatQuantity('pressure', 10, 'si')).to.equal('98 kPa');
  });
  it('groups thousands of the whole part only, sign kept (English-language number style)', () => {
    // 6.932 m³ = 6,932 L; 1 US gal = 3.785411784 L exactly (NIST SP 811): 10 m³ = 2,641.7 gal.
    expect(formatQuantity('volume', 6.932, 'si')).to.equal('6,932 L');
    expect(formatQuantity('volume', 10, 'us', 1)).to.equal('2,641.7 gal');
    expect(groupThousands('-1234567.50')).to.equal('-1,234,567.50');
    expect(groupThousands('999.999')).to.equal('999.999');
  });
});
