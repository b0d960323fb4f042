/** Checklist numbers with their units, in both unit systems (factors from engine/units.ts). */
import { expect } from 'chai';
import { formatAmount } from './amount-format';

describe('review: formatAmount', () => {
  it('physical quantities go through engine/units.ts in the chosen system', () => {
    // 10 m of water = 14.2 psi = 98 kPa (1 m H2O = 9.80665 kPa; 1 psi = 6.894757 kPa, NIST SP 811).
    expect(formatAmount({ value: 10, quantity: 'pressure' }, 'us')).to.equal('14.2 psi');
    expect(formatAmount({ value: 10, quantity: 'pressure' }, 'si')).to.equal('98 kPa');
  });
  it('daily volumes, shares, days and hours carry their own units', () => {
    expect(formatAmount({ value: 1, quantity: 'volume-per-day' }, 'si')).to.equal('1,000 L/day');
    expect(formatAmount({ value: 1, quantity: 'volume-per-day' }, 'us')).to.equal('264 gal/day');
    expect(formatAmount({ value: 75.9, quantity: 'percent' }, 'us')).to.equal('76 %');
    expect(formatAmount({ value: 2.29, quantity: 'days' }, 'us')).to.equal('2.3 days');
    expect(formatAmount({ value: 3.5, quantity: 'hours' }, 'si')).to.equal('3.5 h');
  });
  it('missing and infinite values read as a dash or ∞, never NaN', () => {
    expect(formatAmount(undefined, 'us')).to.equal('—');
    expect(formatAmount({ value: Infinity, quantity: 'hours' }, 'us')).to.equal('∞');
    expect(formatAmount({ value: Number.NaN, quantity: 'pressure' }, 'us')).to.equal('—');
  });
});
