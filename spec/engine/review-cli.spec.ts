import { expect } from 'chai';
import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { hillSmallholding } from '../../engine/examples/hill-smallholding';
import { reviewChecklist, whatIfs } from '../../engine/review';

const run = (...args: string[]) => spawnSync(process.execPath, ['--import', 'tsx', 'engine/review/cli.ts', ...args], { encoding: 'utf8' });

describe('review CLI (npm run -s review)', () => {
  const dir = mkdtempSync(join(tmpdir(), 'runnel-review-cli-'));
  const good = join(dir, 'farm.json');
  writeFileSync(good, JSON.stringify(hillSmallholding));

  it('prints the checklist JSON: rows with rule, source and status, and the counts', () => {
    const r = run(good);
    expect(r.status).to.equal(0);
    const out = JSON.parse(r.stdout);
    expect(out.solved).to.equal(true);
    expect(out.counts.pass + out.counts.caution + out.counts.fail).to.equal(out.rows.length);
    expect(out).to.deep.equal(JSON.parse(JSON.stringify(reviewChecklist(hillSmallholding))));
    expect(out.rows.find((x: { key: string }) => x.key === 'pipe-working-share:L-TR4').status).to.equal('caution');
  });

  it('prints the what-if table with --what-ifs', () => {
    const r = run(good, '--what-ifs');
    expect(r.status).to.equal(0);
    const keys: string[] = JSON.parse(r.stdout).results.map((x: { scenario: { key: string } }) => x.scenario.key);
    // one row per single failure, listed here from the demo document itself: every pipe broken, every valve stuck shut, every tank out
    const expected = hillSmallholding.links.flatMap((l) =>
      l.kind === 'pipe' ? [`pipe-broken:${l.id}`] : l.kind === 'valve' ? [`valve-stuck-shut:${l.id}`] : [],
    );
    expected.push(...hillSmallholding.nodes.filter((n) => n.kind === 'tank').map((n) => `tank-out:${n.id}`));
    expect(keys).to.include.members(expected);
    expect(new Set(keys).size).to.equal(keys.length);
    expect(JSON.parse(r.stdout)).to.deep.equal(JSON.parse(JSON.stringify(whatIfs(hillSmallholding))));
  });

  it('bad input exits 2 naming the element and field', () => {
    const bad = join(dir, 'bad.json');
    writeFileSync(bad, JSON.stringify({ ...hillSmallholding, links: [{ ...hillSmallholding.links[2], diameter_m: 0 }] }));
    const r = run(bad);
    expect(r.status).to.equal(2);
    expect(r.stderr).to.match(/R1\.diameter_m/);
    expect(run(join(dir, 'missing.json')).stderr).to.match(/cannot read/);
  });
});
