import { expect } from 'chai';
import { soldUnit } from '../../engine/takeoff/sold-unit';

describe('soldUnit (a takeoff row in the unit it is bought by)', () => {
  it('pipe kept by the metre is sold by the foot in US projects: 1 ft = 0.3048 m exactly (NIST SP 811)', () => {
    const ft = soldUnit('m', 'us');
    expect(ft.unit).to.equal('ft');
    // $5.89 per m is $1.7953 per ft; 152.4 m is 500 ft; the amount is the same either way
    expect(5.89 / ft.perSi).to.be.closeTo(5.89 * 0.3048, 1e-12);
    expect(152.4 * ft.perSi).to.be.closeTo(500, 1e-9);
  });
  it('SI projects and other units (each, h) are sold as they are', () => {
    expect(soldUnit('m', 'si')).to.deep.equal({ unit: 'm', perSi: 1 });
    expect(soldUnit('each', 'us')).to.deep.equal({ unit: 'each', perSi: 1 });
  });
});
