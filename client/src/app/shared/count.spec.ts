import { expect } from 'chai';
import { countOf } from './count';

describe('countOf (a count with its noun in the right number)', () => {
  it('uses the singular for exactly one and the plural otherwise, zero included (English grammar)', () => {
    expect(countOf(1, 'pipe')).to.equal('1 pipe');
    expect(countOf(0, 'pipe')).to.equal('0 pipes');
    expect(countOf(4, 'pipe')).to.equal('4 pipes');
  });
  it('takes an irregular plural', () => {
    expect(countOf(2, 'fix', 'fixes')).to.equal('2 fixes');
    expect(countOf(3, 'row', 'rows')).to.equal('3 rows');
  });
});
