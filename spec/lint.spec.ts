import { expect } from 'chai';
import { spawnSync } from 'node:child_process';

const repoRoot = new URL('..', import.meta.url).pathname;

// The linter (eslint.config.js: typescript-eslint and angular-eslint) over every TypeScript source and
// the client's templates; a warning fails as an error does, so none pile up.
describe('Lint', function () {
  this.timeout(240_000);

  it('eslint finds nothing (npm run lint)', () => {
    const r = spawnSync(process.execPath, ['node_modules/eslint/bin/eslint.js', '.', '--max-warnings', '0'], { cwd: repoRoot, encoding: 'utf8' });
    expect(r.stdout + r.stderr, 'eslint output').to.equal('');
    expect(r.status).to.equal(0);
  });

  // The formatter (.prettierrc.json, .prettierignore) over every source, template, style and doc:
  // `npm run format` rewrites, this only checks.
  it('prettier finds every file formatted (npm run format:check)', () => {
    const r = spawnSync(process.execPath, ['node_modules/prettier/bin/prettier.cjs', '--check', '.', '--log-level', 'warn'], {
      cwd: repoRoot,
      encoding: 'utf8',
    });
    expect(r.stdout + r.stderr, 'files prettier would change').to.equal('');
    expect(r.status).to.equal(0);
  });
});
