import { expect } from 'chai';
import type { MonthVerdict } from '../../../../../engine/budget';
import { seasonText, verdictText } from './budget-format';

const base: MonthVerdict = {
  month: 7,
  status: 'enough',
  daily_need_m3: 7,
  peak_sun_hours: 6,
  daily_fill_m3: 16,
  balance_m3: 9,
  usable_m3: 15,
  reserve_days: 2.14,
  required_m3: 21,
  required_days: 3,
  rule: '',
  source: '',
};

describe('budget screen wording', () => {
  it('names the shortfall per day and the storage rule with units', () => {
    expect(verdictText(base, 'si')).to.equal('enough');
    expect(verdictText({ ...base, status: 'short', balance_m3: -1.2345 }, 'si')).to.equal('short by 1,235 L per day');
    expect(verdictText({ ...base, status: 'short-and-storage-low', balance_m3: -3.785411784 }, 'us')).to.equal(
      'short by 1,000 gal per day; storage below 3 days (holds 2.1 days)',
    );
  });
  it('seasons read as month runs, wrapping over the new year', () => {
    expect(seasonText([1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12])).to.equal('all year');
    expect(seasonText([4, 5, 6, 7, 8, 9, 10])).to.equal('Apr–Oct');
    expect(seasonText([11, 12, 1, 2])).to.equal('Nov–Feb');
    expect(seasonText([3, 5, 6])).to.equal('Mar, May–Jun');
  });
});
