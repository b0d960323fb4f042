import { expect } from 'chai';
import { spawnSync } from 'node:child_process';

const repoRoot = new URL('..', import.meta.url).pathname;

function run(args: string[]): { output: string; status: number | null } {
  const r = spawnSync(process.execPath, args, { cwd: repoRoot, encoding: 'utf8' });
  return { output: r.stdout + r.stderr, status: r.status };
}

// mocha runs TypeScript through tsx, which strips types without checking them; this keeps the
// server, engine, drizzle, bench and spec sources honest (the client is checked by `ng build`).
describe('TypeScript sources', function () {
  this.timeout(240_000);

  it('type-check cleanly (tsc -p tsconfig.server.json)', () => {
    const r = run(['node_modules/typescript/bin/tsc', '-p', 'tsconfig.server.json', '--noEmit']);
    expect(r.output, 'tsc output').to.equal('');
    expect(r.status).to.equal(0);
  });

  // The engine runs in the browser's worker and on the server: no DOM and no Node APIs. Its CLIs
  // (engine/cli.ts, engine/*/cli.ts) use Node and are checked by tsconfig.server.json above.
  it('the engine type-checks with neither DOM nor Node types (tsc -p tsconfig.engine.json)', () => {
    const r = run(['node_modules/typescript/bin/tsc', '-p', 'tsconfig.engine.json']);
    expect(r.output, 'tsc output').to.equal('');
    expect(r.status).to.equal(0);
  });

  // Runtime imports only (.madgerc skips `import type`, which vanish when compiled).
  it('has no import cycles (madge over client, server, engine and shared)', () => {
    const r = run([
      'node_modules/madge/bin/cli.js',
      '--circular',
      '--no-spinner',
      '--no-color',
      'client/src/main.ts',
      'client/src/app',
      'server',
      'engine',
      'shared',
    ]);
    expect(r.output, 'madge output').to.match(/No circular dependency found/);
    expect(r.status).to.equal(0);
  });
});
