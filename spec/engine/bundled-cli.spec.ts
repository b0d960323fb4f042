import { expect } from 'chai';
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { hillSmallholding } from '../../engine/examples/hill-smallholding';

// `npm run -s solve` and the other engine CLIs run from an esbuild bundle (scripts/bundled-cli.mjs)
// instead of through tsx: the bundle must answer exactly as the TypeScript entry does, exit codes
// and messages on bad input included.
const root = new URL('../..', import.meta.url).pathname;
const viaTsx = (entry: string, ...args: string[]) => spawnSync(process.execPath, ['--import', 'tsx', entry, ...args], { encoding: 'utf8', cwd: root });
const viaBundle = (entry: string, ...args: string[]) =>
  spawnSync(process.execPath, ['scripts/bundled-cli.mjs', entry, ...args], { encoding: 'utf8', cwd: root, maxBuffer: 1 << 26 });

describe('engine CLIs from a bundle (scripts/bundled-cli.mjs)', () => {
  const dir = mkdtempSync(join(tmpdir(), 'runnel-bundled-'));
  const farm = join(dir, 'farm.json');
  writeFileSync(farm, JSON.stringify(hillSmallholding));

  it('npm run solve points at the bundle for every engine CLI', () => {
    const scripts = JSON.parse(readFileSync(join(root, 'package.json'), 'utf8')).scripts as Record<string, string>;
    for (const name of ['solve', 'pump-curve', 'drip-tape', 'budget', 'profile', 'size', 'review', 'takeoff'])
      expect(scripts[name], name).to.match(/^node scripts\/bundled-cli\.mjs engine\/(\w[\w-]*\/)?cli\.ts$/);
  });

  it('solves the demo farm to the same JSON as the TypeScript entry', () => {
    const a = viaBundle('engine/cli.ts', farm);
    const b = viaTsx('engine/cli.ts', farm);
    expect(a.status).to.equal(0);
    expect(JSON.parse(a.stdout)).to.deep.equal(JSON.parse(b.stdout));
  });

  it('bad input exits 2 with the same message naming element and field', () => {
    const bad = join(dir, 'bad.json');
    writeFileSync(bad, JSON.stringify({ ...hillSmallholding, links: [{ ...hillSmallholding.links[2], diameter_m: 0 }] }));
    const a = viaBundle('engine/cli.ts', bad);
    expect(a.status).to.equal(2);
    expect(a.stderr).to.equal('R1.diameter_m: must be a positive number (got 0)\n');
  });

  it('every engine CLI answers a missing file as its TypeScript entry does', () => {
    const missing = join(dir, 'missing.json');
    for (const entry of ['engine/pump-curve/cli.ts', 'engine/drip-tape/cli.ts', 'engine/budget/cli.ts', 'engine/review/cli.ts', 'engine/takeoff/cli.ts']) {
      const a = viaBundle(entry, missing);
      const b = viaTsx(entry, missing);
      expect(a.status, entry).to.equal(b.status);
      expect(a.status, entry).to.not.equal(0);
      expect(a.stderr, entry).to.equal(b.stderr);
    }
  });
});
