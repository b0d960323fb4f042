import { expect } from 'chai';
import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { dripTapeFlow } from '../../engine/drip-tape/index';

// Exact unit definitions (NIST SP 811, V): 1 ft = 0.3048 m, 1 US gal = 3.785411784e-3 m³.
const FT = 0.3048;
const GAL = 3.785411784e-3;
const gpm = (v: number) => (v * GAL) / 60;
const gph = (v: number) => (v * GAL) / 3600;

describe('Drip tape: a zone as rows × row length of tape (engine/drip-tape)', () => {
  it('a maker\'s "0.45 gpm per 100 ft" at 12 in spacing is 0.27 gph per emitter, and both ways give the same zone flow (trade practice, M: tape tables from memory)', () => {
    const byEmitter = dripTapeFlow({ rows: 10, row_length_m: 200 * FT, spacing_m: 12 * 0.0254, emitter_flow_m3s: gph(0.27) });
    const byLength = dripTapeFlow({ rows: 10, row_length_m: 200 * FT, flow_per_m_m3s: gpm(0.45) / (100 * FT) });
    // 10 rows × 200 ft = 2000 ft of tape at 0.45 gpm per 100 ft = 9 gpm (C: from the definition).
    expect(byLength.flow_m3s).to.be.closeTo(gpm(9), 1e-12);
    expect(byEmitter.flow_m3s).to.be.closeTo(gpm(9), 1e-12);
    expect(byEmitter.emitters).to.equal(2000);
    expect(byLength.emitters).to.equal(null);
    expect(byEmitter.tape_m).to.be.closeTo(2000 * FT, 1e-9);
  });

  it('SI: 6 rows of 25 m at 30 cm with 1.6 L/h emitters is 500 emitters and 800 L/h (C)', () => {
    const r = dripTapeFlow({ rows: 6, row_length_m: 25, spacing_m: 0.3, emitter_flow_m3s: 1.6e-3 / 3600 });
    expect(r.emitters).to.equal(500);
    expect(r.flow_m3s * 3600 * 1000).to.be.closeTo(800, 1e-9);
  });

  it('refuses what cannot be a zone, naming the field', () => {
    expect(() => dripTapeFlow({ rows: 2.5, row_length_m: 10, flow_per_m_m3s: 1e-6 })).to.throw(/^rows:/);
    expect(() => dripTapeFlow({ rows: 2, row_length_m: 0, flow_per_m_m3s: 1e-6 })).to.throw(/^row_length_m:/);
    expect(() => dripTapeFlow({ rows: 2, row_length_m: 10, spacing_m: 0.3 })).to.throw(/^emitter_flow_m3s:/);
    expect(() => dripTapeFlow({ rows: 2, row_length_m: 10, spacing_m: 20, emitter_flow_m3s: 1e-6 })).to.throw(/spacing_m: is longer than a row/);
    expect(() => dripTapeFlow({ rows: 2, row_length_m: 10, spacing_m: 0.3, emitter_flow_m3s: 1e-6, flow_per_m_m3s: 1e-6 })).to.throw(/not both/);
  });

  it('CLI: JSON out; exit 2 naming the row and field', () => {
    const dir = mkdtempSync(join(tmpdir(), 'drip-'));
    const good = join(dir, 'good.json');
    writeFileSync(good, JSON.stringify([{ rows: 6, row_length_m: 25, spacing_m: 0.3, emitter_flow_m3s: 1.6e-3 / 3600 }]));
    const ok = spawnSync(process.execPath, ['--import', 'tsx', 'engine/drip-tape/cli.ts', good], { encoding: 'utf8' });
    expect(ok.status).to.equal(0);
    expect(JSON.parse(ok.stdout)[0].emitters).to.equal(500);
    const bad = join(dir, 'bad.json');
    writeFileSync(
      bad,
      JSON.stringify([
        { rows: 6, row_length_m: 25, flow_per_m_m3s: 1e-6 },
        { rows: 0, row_length_m: 25, flow_per_m_m3s: 1e-6 },
      ]),
    );
    const no = spawnSync(process.execPath, ['--import', 'tsx', 'engine/drip-tape/cli.ts', bad], { encoding: 'utf8' });
    expect(no.status).to.equal(2);
    expect(no.stderr.trim()).to.equal('row 2: rows: must be a whole number of rows, at least 1');
  });
});
