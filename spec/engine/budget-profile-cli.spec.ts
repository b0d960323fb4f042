import { expect } from 'chai';
import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { hillSmallholding } from '../../engine/examples/hill-smallholding';
import { hillSmallholdingBudget } from '../../engine/examples/hill-smallholding-budget';
import { planBudget } from '../../engine/budget';
import { GAL } from './hand-formulas';

const run = (cli: string, ...args: string[]) => spawnSync(process.execPath, ['--import', 'tsx', cli, ...args], { encoding: 'utf8' });

describe('budget and profile CLIs', () => {
  const dir = mkdtempSync(join(tmpdir(), 'runnel-budget-cli-'));
  const plan = join(dir, 'plan.json');
  const budgetOnly = join(dir, 'budget.json');
  const network = join(dir, 'network.json');
  writeFileSync(plan, JSON.stringify({ budget: hillSmallholdingBudget, network: hillSmallholding }));
  writeFileSync(budgetOnly, JSON.stringify(hillSmallholdingBudget));
  writeFileSync(network, JSON.stringify(hillSmallholding));

  it('budget: totals, outlet flows and twelve verdicts for a plan file', () => {
    const r = run('engine/budget/cli.ts', plan);
    expect(r.status, r.stderr).to.equal(0);
    const out = JSON.parse(r.stdout);
    expect(out.months).to.have.length(12);
    expect(out.verdicts).to.have.length(12);
    expect(out).to.deep.equal(JSON.parse(JSON.stringify(planBudget(hillSmallholdingBudget, hillSmallholding))));
    // TR4 by hand (C): 10 cow-calf pairs × 20 gal/day (NRCS Kansas, V2) × 1.1 in 4 h (Ohio State ANR-12, V2), shared with TR3
    const tr4 = out.outlets.find((o: { id: string }) => o.id === 'TR4');
    expect(tr4.design_flow_m3s).to.be.closeTo((10 * 20 * GAL * 1.1) / (4 * 3600) / 2, 1e-12);
  });
  it('budget: a budget file with --network gives the same plan; without one, no verdicts', () => {
    const a = JSON.parse(run('engine/budget/cli.ts', plan).stdout);
    const b = JSON.parse(run('engine/budget/cli.ts', budgetOnly, '--network', network).stdout);
    expect(b).to.deep.equal(a);
    expect(JSON.parse(run('engine/budget/cli.ts', budgetOnly).stdout).verdicts).to.equal(null);
  });
  it('budget: bad input exits 2 naming row and field', () => {
    const bad = join(dir, 'bad.json');
    writeFileSync(bad, JSON.stringify({ ...hillSmallholdingBudget, uses: [{ ...hillSmallholdingBudget.uses[0], count: -3 }] }));
    const r = run('engine/budget/cli.ts', bad);
    expect(r.status).to.equal(2);
    expect(r.stderr).to.equal('uses[0] "Ewe flock (west paddocks)".count: must be a whole number ≥ 0 (got -3)\n');
  });
  it('profile: routes and the profile between two elements, or the longest supply route', () => {
    const r = run('engine/profile/cli.ts', network, '--from', 'T1', '--to', 'TR4');
    expect(r.status, r.stderr).to.equal(0);
    const out = JSON.parse(r.stdout);
    expect(out.routes[0].nodes.at(-1)).to.equal('TR4');
    expect(out.profile.findings.some((f: { kind: string }) => f.kind === 'high-point')).to.equal(true);
    const longest = JSON.parse(run('engine/profile/cli.ts', network).stdout);
    // tank outlet to TR4 across the dip: M1 75 + M2 50 + M3 55 + M4 110 + L-TR4 270 m (examples/hill-smallholding.ts)
    expect(longest.routes[0].length_m).to.equal(560);
  });
  it('profile: unknown or unconnected elements exit 2 naming the field', () => {
    const r = run('engine/profile/cli.ts', network, '--from', 'T1', '--to', 'NOPE');
    expect(r.status).to.equal(2);
    expect(r.stderr).to.equal('to: no element NOPE in the network\n');
    expect(run('engine/profile/cli.ts', network, '--from', 'T1').stderr).to.match(/^--to: give both/);
  });
});
