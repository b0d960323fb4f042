import { expect } from 'chai';
import { spawnSync } from 'node:child_process';

const repoRoot = new URL('..', import.meta.url).pathname;

// mocha runs TypeScript through tsx, which strips types without checking them; this keeps the
// server, engine, drizzle, bench and spec sources honest (the client is checked by `ng build`).
describe('TypeScript sources', () => {
  it('type-check cleanly (tsc -p tsconfig.server.json)', () => {
    const run = spawnSync(process.execPath, ['node_modules/typescript/bin/tsc', '-p', 'tsconfig.server.json', '--noEmit'], {
      cwd: repoRoot,
      encoding: 'utf8',
    });
    expect(run.stdout + run.stderr, 'tsc output').to.equal('');
    expect(run.status).to.equal(0);
  });
});
