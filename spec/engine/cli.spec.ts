import { expect } from 'chai';
import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { hillSmallholding } from '../../engine/examples/hill-smallholding';
import { solve } from '../../engine/steady';

const run = (...args: string[]) => spawnSync(process.execPath, ['--import', 'tsx', 'engine/cli.ts', ...args], { encoding: 'utf8' });

describe('engine CLI (cli.ts)', () => {
  const dir = mkdtempSync(join(tmpdir(), 'runnel-cli-'));
  const good = join(dir, 'farm.json');
  writeFileSync(good, JSON.stringify(hillSmallholding));

  it('prints the steady result JSON', () => {
    const r = run(good);
    expect(r.status).to.equal(0);
    const out = JSON.parse(r.stdout);
    expect(out.converged).to.equal(true);
    // the same numbers the engine gives in-process (JSON keeps doubles exactly)
    expect(out).to.deep.equal(JSON.parse(JSON.stringify(solve(hillSmallholding))));
    // and the farmhouse sits under the static head of the ridge tanks: water surface 158 + 1.3 m, house 101 m → 58.3 m (C);
    // with water flowing friction takes some of it, but the house keeps its own 14 m minimum
    expect(out.nodes['HOUSE'].pressure_m).to.be.within(14, 58.3);
  });
  it('prints a time series with --simulate --hours --step', () => {
    const r = run(good, '--simulate', '--hours', '2', '--step', '600');
    expect(r.status).to.equal(0);
    // 2 h in 600 s steps: 7200 / 600 = 12 steps, 13 instants counting the start
    expect(JSON.parse(r.stdout).times_s).to.deep.equal([0, 600, 1200, 1800, 2400, 3000, 3600, 4200, 4800, 5400, 6000, 6600, 7200]);
  });
  it('bad input exits 2 with the element and field on stderr', () => {
    const bad = join(dir, 'bad.json');
    writeFileSync(bad, JSON.stringify({ ...hillSmallholding, links: [{ ...hillSmallholding.links[2], diameter_m: 0 }] }));
    const r = run(bad);
    expect(r.status).to.equal(2);
    expect(r.stderr).to.equal('R1.diameter_m: must be a positive number (got 0)\n');
    expect(run(join(dir, 'missing.json')).status).to.equal(2);
    const broken = join(dir, 'broken.json');
    writeFileSync(broken, '{"nodes": [');
    const b = run(broken);
    expect(b.status).to.equal(2);
    expect(b.stderr).to.match(/broken\.json: not valid JSON/);
  });
});
