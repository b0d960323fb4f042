import { expect } from 'chai';
import { defaultRoughness, findPipeSize, pipeSeries, pipeSizes, pressureRatingPsi } from '../../engine/pipe-catalogue';
import { PSI_PER_METRE_OF_WATER } from '../../engine/units';

describe('pipe catalogue (pipe-catalogue.ts)', () => {
  // ASTM D1785 Schedule 40 PVC (V2, REFERENCES.md)
  const d1785: [string, number, number, number, number][] = [
    ['1/2"', 0.84, 0.109, 0.622, 600],
    ['3/4"', 1.05, 0.113, 0.824, 480],
    ['1"', 1.315, 0.133, 1.049, 450],
    ['1-1/4"', 1.66, 0.14, 1.38, 370],
    ['1-1/2"', 1.9, 0.145, 1.61, 330],
    ['2"', 2.375, 0.154, 2.067, 280],
  ];
  for (const [nominal, od, wall, id, psi] of d1785) {
    it(`Sch 40 ${nominal}: OD ${od} in, wall ${wall} in, ID ${id} in, ${psi} psi (ASTM D1785, V2)`, () => {
      const s = findPipeSize('pvc-sch40', nominal);
      expect(s).to.not.equal(undefined);
      expect(s?.od_in).to.equal(od);
      expect(s?.wall_in).to.equal(wall);
      expect(s?.id_in).to.equal(id);
      expect(s?.rating_psi).to.equal(psi);
      expect(s?.od_m).to.be.closeTo(od * 0.0254, 1e-15);
      expect(s?.rating_m).to.be.closeTo(psi / PSI_PER_METRE_OF_WATER, 1e-12);
      // the table's ratings follow P = 2S/(DR − 1) with S = 2000 psi (PVC 1120, V) within 1 %
      expect(pressureRatingPsi(2000, od / wall, 'OD')).to.be.closeTo(psi, 0.01 * psi);
    });
  }
  it('D2241 SDR 21 = 200 psi and SDR 26 = 160 psi, wall = OD/SDR (V2, C)', () => {
    for (const s of pipeSizes('pvc-sdr21')) {
      expect(s.rating_psi).to.equal(200);
      expect(s.wall_in).to.be.closeTo(Math.max(s.od_in / 21, 0.06), 1e-12);
    }
    for (const s of pipeSizes('pvc-sdr26')) {
      expect(s.rating_psi).to.equal(160);
      expect(s.id_in).to.be.closeTo(s.od_in - 2 * Math.max(s.od_in / 26, 0.06), 1e-12);
    }
    expect(findPipeSize('pvc-sdr21', '2"')?.od_in).to.equal(findPipeSize('pvc-sch40', '2"')?.od_in);
  });
  it('minimum walls against the published tables, to the 0.001 in they are printed to (ASTM D2241 and D3035 tables, M: from memory)', () => {
    const published: [string, string, number][] = [
      ['pvc-sdr21', '1"', 0.063],
      ['pvc-sdr21', '1-1/4"', 0.079],
      ['pvc-sdr21', '1-1/2"', 0.09],
      ['pvc-sdr21', '2"', 0.113],
      ['pvc-sdr26', '1-1/2"', 0.073],
      ['pvc-sdr26', '2"', 0.091],
      ['pvc-sdr26', '1"', 0.06], // 1.315/26 = 0.051 is under the 0.060 in floor
      ['pe-dr11-pe4710', '1"', 0.12],
      ['pe-dr11-pe4710', '1-1/2"', 0.173],
      ['pe-dr11-pe4710', '2"', 0.216],
    ];
    for (const [series, nominal, wall] of published) expect(findPipeSize(series, nominal)?.wall_in, `${series} ${nominal}`).to.be.closeTo(wall, 0.001);
  });
  it('D3035 PE DR 11: PE4710 200 psi, PE3608 160 psi, IPS OD (V, Plastics Pipe Institute)', () => {
    for (const s of pipeSizes('pe-dr11-pe4710')) {
      expect(s.rating_psi).to.equal(200);
      expect(s.wall_in).to.be.closeTo(s.od_in / 11, 1e-12);
    }
    for (const s of pipeSizes('pe-dr11-pe3608')) expect(s.rating_psi).to.equal(160);
    expect(findPipeSize('pe-dr11-pe4710', '1"')?.od_in).to.equal(1.315);
  });
  it('D2239 PE SIDR: ID equal to Sch 40 ID (M), wall = ID/SIDR, P = 2S/(SIDR + 1) with S = 800 psi', () => {
    const expected: Record<string, number> = { 'pe-sidr7': 200, 'pe-sidr9': 160, 'pe-sidr11.5': 128, 'pe-sidr15': 100 };
    for (const [series, psi] of Object.entries(expected)) {
      for (const s of pipeSizes(series)) {
        expect(s.rating_psi).to.equal(psi);
        expect(s.id_in).to.equal(findPipeSize('pvc-sch40', s.nominal)?.id_in);
        expect(s.od_in).to.be.closeTo(s.id_in + 2 * s.wall_in, 1e-12);
      }
    }
  });
  it('every series cites its standard and covers 1/2"–2" at least from 1"', () => {
    for (const series of pipeSeries) {
      expect(series.standard).to.match(/^ASTM D\d{4}$/);
      const nominals = pipeSizes(series.id).map((s) => s.nominal);
      for (const n of ['1"', '1-1/4"', '1-1/2"', '2"']) expect(nominals, series.id).to.include(n);
      const ids = pipeSizes(series.id).map((s) => s.id_m);
      expect([...ids].sort((a, b) => a - b)).to.deep.equal(ids);
    }
    expect(pipeSizes('nope')).to.deep.equal([]);
    expect(findPipeSize('pvc-sch40', '7"')).to.equal(undefined);
  });
  it('default roughness: PVC C 150 (Uni-Bell, V2), PE C 140 (Engineering ToolBox, V); ε 0.0015 / 0.007 mm (M)', () => {
    expect(defaultRoughness('pvc', 'hazen-williams')).to.equal(150);
    expect(defaultRoughness('pe', 'hazen-williams')).to.equal(140);
    expect(defaultRoughness('pvc', 'darcy-weisbach')).to.equal(0.0015);
    expect(defaultRoughness('pe', 'darcy-weisbach')).to.equal(0.007);
  });
});
