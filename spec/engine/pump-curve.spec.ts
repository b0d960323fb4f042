import { expect } from 'chai';
import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fitPumpCurve } from '../../engine/pump-curve/index';
import { solve } from '../../engine/index';
import type { NetworkDocument } from '../../engine/network-document';

/** Ordinary least squares by the normal equations (AᵀA)x = Aᵀh and Cramer's rule: an independent route to the same fit. */
function normalEquations(pts: [number, number][]): number[] {
  const rows = pts.map(([q]) => [1, q, q * q]);
  const ata = [0, 1, 2].map((i) => [0, 1, 2].map((j) => rows.reduce((s, r) => s + r[i] * r[j], 0)));
  const ath = [0, 1, 2].map((i) => rows.reduce((s, r, k) => s + r[i] * pts[k][1], 0));
  const det = (m: number[][]) =>
    m[0][0] * (m[1][1] * m[2][2] - m[1][2] * m[2][1]) - m[0][1] * (m[1][0] * m[2][2] - m[1][2] * m[2][0]) + m[0][2] * (m[1][0] * m[2][1] - m[1][1] * m[2][0]);
  const d = det(ata);
  return [0, 1, 2].map((c) => det(ata.map((row, i) => row.map((v, j) => (j === c ? ath[i] : v)))) / d);
}

describe('Pump curve: least-squares fit through typed points (newcomer item 3)', () => {
  it('recovers a quadratic exactly from points on it (H = 60 − 2·10⁷·Q², C: points computed from the formula)', () => {
    const pts: [number, number][] = [0, 0.0005, 0.001, 0.0015].map((q) => [q, 60 - 2e7 * q * q]);
    const fit = fitPumpCurve(pts);
    expect(fit.c[0]).to.be.closeTo(60, 1e-6);
    expect(fit.c[1]).to.be.closeTo(0, 1e-3);
    expect(fit.c[2]).to.be.closeTo(-2e7, 1);
    expect(fit.runout_m3s).to.be.closeTo(Math.sqrt(60 / 2e7), 1e-9);
    expect(fit.problems).to.deep.equal([]);
  });

  it('matches the normal-equations solution for scattered chart readings (an independent method, C)', () => {
    const pts: [number, number][] = [
      [0, 61.5],
      [0.0004, 57.2],
      [0.0008, 49.8],
      [0.0012, 35.1],
      [0.0016, 15.9],
    ];
    const fit = fitPumpCurve(pts);
    const ref = normalEquations(pts);
    fit.c.forEach((v, i) => expect(v).to.be.closeTo(ref[i], Math.abs(ref[i]) * 1e-6 + 1e-9));
    // residuals of the normal-equations curve at the typed points: root-mean-square over n and the largest (C)
    const resid = pts.map(([q, h]) => h - (ref[0] + ref[1] * q + ref[2] * q * q));
    const rms = Math.sqrt(resid.reduce((sum, e) => sum + e * e, 0) / resid.length);
    expect(rms).to.be.within(0.1, 2); // the readings do scatter about the parabola
    expect(fit.rms_m).to.be.closeTo(rms, 1e-6);
    expect(fit.worst_m).to.be.closeTo(Math.max(...resid.map(Math.abs)), 1e-6);
  });

  it('two points fit the shut-off form H = c0 + c2·Q² through both', () => {
    const fit = fitPumpCurve([
      [0, 40],
      [0.002, 30],
    ]);
    expect(fit.c[0]).to.be.closeTo(40, 1e-9);
    expect(fit.c[2]).to.be.closeTo(-10 / 0.002 ** 2, 1e-3);
  });

  it('says so when the typed head rises with flow', () => {
    expect(
      fitPumpCurve([
        [0, 20],
        [0.001, 30],
        [0.002, 35],
      ]).problems.join(' '),
    ).to.match(/head rises with flow/);
  });

  it('the engine solves a pump on the fitted curve at its duty point: lift 20 m through negligible friction ⇒ H(Q) = 20 m', () => {
    const fit = fitPumpCurve([
      [0, 60],
      [0.0005, 55],
      [0.001, 40],
      [0.0015, 15],
    ]);
    const doc: NetworkDocument = {
      schema: 'runnel.network/1',
      headloss: 'hazen-williams',
      nodes: [
        { id: 'W', kind: 'source', elevation_m: 0, head_m: 0 },
        { id: 'P', kind: 'tee', elevation_m: 0, demand_m3s: 0 },
        { id: 'T', kind: 'tank', elevation_m: 19, diameter_m: 2, level_m: 1, min_level_m: 0.1, max_level_m: 1.8 },
      ],
      links: [
        { id: 'PU', kind: 'pump', from: 'W', to: 'P', curve: fit.samples },
        { id: 'R', kind: 'pipe', from: 'P', to: 'T', length_m: 1, diameter_m: 0.3, roughness: 140 },
      ],
    };
    const q = solve(doc).links['PU'].flow_m3s;
    const head = fit.c[0] + fit.c[1] * q + fit.c[2] * q * q;
    // The engine interpolates between samples, so the duty point sits on the fit within the chord error.
    expect(head).to.be.closeTo(20, 0.5);
  });

  it('the CLI prints the fit and refuses a bad row by number', () => {
    const dir = mkdtempSync(join(tmpdir(), 'curve-'));
    const good = join(dir, 'good.json');
    const bad = join(dir, 'bad.json');
    writeFileSync(
      good,
      JSON.stringify([
        [0, 40],
        [0.002, 30],
      ]),
    );
    writeFileSync(
      bad,
      JSON.stringify([
        [0, 40],
        [-1, 30],
      ]),
    );
    const run = (f: string) => spawnSync(process.execPath, ['--import', 'tsx', 'engine/pump-curve/cli.ts', f], { encoding: 'utf8' });
    const ok = run(good);
    expect(ok.status).to.equal(0);
    expect(JSON.parse(ok.stdout).shutoff_m).to.be.closeTo(40, 1e-9);
    const no = run(bad);
    expect(no.status).to.equal(2);
    expect(no.stderr).to.match(/row 2: flow_m3s must not be negative/);
  });
});
