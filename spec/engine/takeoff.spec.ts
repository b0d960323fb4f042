import { expect } from 'chai';
import { demoPriceList } from '../../engine/examples/demo-prices';
import { hillSmallholding } from '../../engine/examples/hill-smallholding';
import type { NetworkDocument, PipeLink } from '../../engine/network-document';
import { findPipeSize, purchaseUnit } from '../../engine/pipe-catalogue';
import { estimate } from '../../engine/takeoff/estimate';
import { applyMinorLossAllowance, minorLossAllowance } from '../../engine/takeoff/minor-loss-allowance';
import { takeoff } from '../../engine/takeoff/takeoff';

function pipe(id: string, from: string, to: string, length_m: number, series: string, nominal: string, extra: Partial<PipeLink> = {}): PipeLink {
  const s = findPipeSize(series, nominal)!;
  return { id, kind: 'pipe', from, to, length_m, diameter_m: s.id_m, roughness: 140, series, nominal, material: 'pe', rating_m: s.rating_m, ...extra };
}

/** Tank → 400 m of 1" PE with one right-angle bend → a tee → 3/4" to a trough and 3/4" to a bib. */
const small: NetworkDocument = {
  schema: 'runnel.network/1',
  headloss: 'hazen-williams',
  nodes: [
    { id: 'T', kind: 'tank', elevation_m: 60, diameter_m: 2, level_m: 1, min_level_m: 0.1, max_level_m: 1.5, x_m: 0, y_m: 0 },
    { id: 'J', kind: 'tee', elevation_m: 40, demand_m3s: 0, x_m: 200, y_m: 200 },
    { id: 'TR', kind: 'outlet', elevation_m: 38, demand_m3s: 0.0001, min_pressure_m: 3, float_valve: true, outlet_type: 'trough', x_m: 300, y_m: 200 },
    { id: 'B', kind: 'outlet', elevation_m: 39, demand_m3s: 0.0001, min_pressure_m: 7, x_m: 200, y_m: 250 },
  ],
  links: [
    pipe('P1', 'T', 'J', 400, 'pe-sidr9', '1"', { vertices: [[200, 0]] }),
    pipe('P2', 'J', 'TR', 100, 'pe-sidr9', '3/4"'),
    pipe('P3', 'J', 'B', 50, 'pe-sidr9', '3/4"'),
  ],
};

describe('takeoff and estimate (engine/takeoff)', () => {
  const t = takeoff(small, { waste_fraction: 0.05, other: [{ code: 'other/trenching', description: 'Trenching', unit: 'm', per_pipe_m: 1 }] });
  const row = (code: string) => t.rows.find((r) => r.code === code);

  it('buys pipe in whole coils with the waste allowance, and couplings for the joints (hand count, C)', () => {
    // 400 m × 1.05 = 420 m of 1": 300 ft coils (91.44 m; common practice, M) → 5 coils = 457.2 m, 4 joints
    expect(purchaseUnit('pe-sidr9', '1"')).to.deep.include({ unit: 'coil', length_ft: 300, length_m: 91.44 });
    expect(row('pe-sidr9/1"')).to.deep.include({ network_m: 400, with_waste_m: 420, pieces: 5, quantity: 457.2 });
    // 150 m × 1.05 = 157.5 m of 3/4" → 2 coils; P2 105 m → 1 joint, P3 52.5 m → none
    expect(row('pe-sidr9/3/4"')).to.deep.include({ network_m: 150, pieces: 2, quantity: 182.88 });
    expect(row('coupling/1"')?.quantity).to.equal(4);
    expect(row('coupling/3/4"')?.quantity).to.equal(1);
  });

  it('counts fittings from the topology: one tee, reducers, an elbow at the bend, the tank adapter, the float valve', () => {
    expect(row('tee/1"')?.quantity).to.equal(1);
    expect(row('reducer/1"x3/4"')?.quantity).to.equal(2);
    expect(row('elbow-90/1"')?.quantity).to.equal(1);
    expect(row('tank-adapter/1"')?.quantity).to.equal(1);
    expect(row('valve-float/3/4"')?.quantity).to.equal(1);
    expect(row('other/trenching')?.quantity).to.equal(550);
    // a gentle bend below the angle gets no elbow
    const gentle = takeoff({ ...small, links: [{ ...(small.links[0] as PipeLink), vertices: [[150, 130]] }, ...small.links.slice(1)] }, { bendAngle_deg: 30 });
    expect(gentle.rows.some((r) => r.code.startsWith('elbow'))).to.equal(false);
  });

  it('derives the minor-loss K from counted fittings (Crane TP-410 style K, M)', () => {
    const k = minorLossAllowance(small, t.fittings, 0.05);
    expect(k['P1'].k).to.be.closeTo(0.9 + 0.5 + 4 * 0.1, 1e-9); // elbow 90°, tank entrance, 4 couplings
    // P1 and P2 form the tee's run (the two largest, first listed on a tie); P3 leaves through the branch
    expect(k['P2'].k).to.be.closeTo(0.5 + 0.1, 1e-9); // reducer, 1 coupling
    expect(k['P3'].k).to.be.closeTo(1.5 + 0.5, 1e-9); // tee branch, reducer
    expect(applyMinorLossAllowance(small, k).links.map((l) => (l as PipeLink).minor_loss)).to.deep.equal([k['P1'].k, k['P2'].k, k['P3'].k]);
  });

  it('the demo: every pipe in exactly one row, lengths add up to the network, troughs get float valves, the dip gets its valves', () => {
    const d = takeoff(hillSmallholding);
    const pipes = hillSmallholding.links.filter((l) => l.kind === 'pipe') as PipeLink[];
    const pipeRows = d.rows.filter((r) => r.group === 'pipe');
    expect(pipeRows.flatMap((r) => r.elements).sort()).to.deep.equal(pipes.map((p) => p.id).sort());
    expect(pipeRows.reduce((s, r) => s + (r.network_m ?? 0), 0)).to.be.closeTo(
      pipes.reduce((s, p) => s + p.length_m, 0),
      1e-6,
    );
    expect(d.rows.filter((r) => r.code.startsWith('valve-float/')).reduce((s, r) => s + r.quantity, 0)).to.equal(4);
    const tr4 = d.rows.filter((r) => r.elements.includes('L-TR4')).map((r) => r.code);
    expect(tr4).to.include.members(['air-release-valve/3/4"', 'drain-valve/3/4"']);
    expect(d.rows.find((r) => r.code === 'tank/8651 L')?.quantity).to.equal(2);
  });

  it('estimate: quantities × prices to the cent, labour, markup, tax; unpriced rows listed', () => {
    const prices = new Map<string, number | null>([
      ['pe-sidr9/1"', 1.9],
      ['pe-sidr9/3/4"', 1.35],
      ['tee/1"', 3.05],
      ['other/trenching', null],
    ]);
    const e = estimate(t, prices, { labour_hours: 10, labour_rate: 40, markup_fraction: 0.1, tax_fraction: 0.05 });
    // 457.2 × 1.9 = 868.68; 182.88 × 1.35 = 246.888 → 246.89; tee 3.05 (C)
    expect(e.materials).to.equal(868.68 + 246.89 + 3.05);
    expect(e.labour).to.equal(400);
    expect(e.markup).to.equal(151.86); // (1118.62 + 400) × 0.1 = 151.862
    expect(e.tax).to.equal(83.52); // 1670.48 × 0.05 = 83.524
    expect(e.total).to.equal(1754);
    expect(e.missing).to.include('other/trenching');
    expect(e.missing).to.include('coupling/1"');
  });

  it('the demo price list prices every demo row but the thrust blocks, which are flagged', () => {
    const prices = new Map(demoPriceList().map((r) => [r.code, r.price]));
    const e = estimate(takeoff(hillSmallholding), prices);
    expect(e.missing).to.deep.equal([]); // thrust blocks have quantity 0 by default
    const withBlocks = takeoff(hillSmallholding, { other: [{ code: 'other/thrust-block', description: 'Thrust blocks', unit: 'each', quantity: 6 }] });
    expect(estimate(withBlocks, prices).missing).to.deep.equal(['other/thrust-block']);
  });
});

describe('npm run takeoff (engine/takeoff/cli.ts)', () => {
  it('prints the takeoff and estimate; a bad price row exits 2 naming row and field', async () => {
    const { spawnSync } = await import('node:child_process');
    const { mkdtempSync, writeFileSync } = await import('node:fs');
    const { join } = await import('node:path');
    const { tmpdir } = await import('node:os');
    const dir = mkdtempSync(join(tmpdir(), 'runnel-takeoff-'));
    writeFileSync(join(dir, 'farm.json'), JSON.stringify(hillSmallholding));
    writeFileSync(join(dir, 'list.json'), JSON.stringify(demoPriceList()));
    writeFileSync(
      join(dir, 'bad.json'),
      JSON.stringify([
        { code: 'x', price: 1 },
        { code: 'y', price: 'ten' },
      ]),
    );
    const run = (...a: string[]) => spawnSync(process.execPath, ['--import', 'tsx', 'engine/takeoff/cli.ts', ...a], { encoding: 'utf8' });
    const ok = run(join(dir, 'farm.json'), '--prices', join(dir, 'list.json'), '--labour-hours', '8', '--labour-rate', '50');
    expect(ok.status, ok.stderr).to.equal(0);
    const out = JSON.parse(ok.stdout);
    expect(out.estimate.labour).to.equal(400);
    expect(out.estimate.total).to.equal(out.estimate.materials + 400);
    const bad = run(join(dir, 'farm.json'), '--prices', join(dir, 'bad.json'));
    expect(bad.status).to.equal(2);
    expect(bad.stderr).to.equal(`${join(dir, 'bad.json')}: row 2, price: must be a non-negative number or null (got "ten")\n`);
  });
});
