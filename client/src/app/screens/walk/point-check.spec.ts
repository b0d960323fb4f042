import { expect } from 'chai';
import { checkPoint } from './point-check';

const fix = (accuracy_m: number, altitude_m: number | null = 312.5) => ({ lat: 44.5, lon: -122.1, accuracy_m, altitude_m, timestamp: 0 });

describe('Walk: may this point be recorded?', () => {
  it('takes the elevation from the fix, and a typed elevation wins over it', () => {
    expect(checkPoint({ label: 'T1', typedElevation_m: null }, fix(4), 10, 'si')).to.deep.equal({
      ok: true,
      elevation_m: 312.5,
      elevation_source: 'fix',
      poor_fix: false,
    });
    expect(checkPoint({ label: 'T1', typedElevation_m: 305 }, fix(4), 10, 'si')).to.deep.equal({
      ok: true,
      elevation_m: 305,
      elevation_source: 'typed',
      poor_fix: false,
    });
  });

  it('no fix and no typed elevation: a message saying both, nothing recorded', () => {
    const r = checkPoint({ label: 'T1', typedElevation_m: null }, null, 10, 'si');
    expect(r).to.deep.include({ ok: false, overridable: false });
    expect(r.ok ? '' : r.message).to.match(/No position fix and no typed elevation/);
  });

  it('no fix but a typed elevation still needs a place', () => {
    const r = checkPoint({ label: 'T1', typedElevation_m: 300 }, null, 10, 'si');
    expect(r.ok ? '' : r.message).to.match(/No position fix yet/);
  });

  it('a fix without altitude needs a typed elevation', () => {
    const r = checkPoint({ label: 'T1', typedElevation_m: null }, fix(3, null), 10, 'si');
    expect(r.ok ? '' : r.message).to.match(/no elevation: type the elevation/);
  });

  it('an accuracy worse than the limit is refused in the project units unless recorded anyway, then flagged', () => {
    const r = checkPoint({ label: 'T1', typedElevation_m: null }, fix(42), 10, 'us');
    expect(r).to.deep.include({ ok: false, overridable: true });
    expect(r.ok ? '' : r.message).to.equal(
      'The fix is good to ±138 ft, worse than the 33 ft limit. Wait for a better fix, or record it anyway marked as poor.',
    );
    expect(checkPoint({ label: 'T1', typedElevation_m: null }, fix(42), 10, 'us', true)).to.deep.include({ ok: true, poor_fix: true });
    // Exactly at the limit is fine.
    expect(checkPoint({ label: 'T1', typedElevation_m: null }, fix(10), 10, 'si')).to.deep.include({ ok: true, poor_fix: false });
  });

  it('a point needs a label', () => {
    expect(checkPoint({ label: '  ', typedElevation_m: 1 }, fix(3), 10, 'si')).to.deep.include({ ok: false, overridable: false });
  });
});
