// Runs every spec in spec/ (engine, editor, API, browser end-to-end) in one mocha run, then the API
// suite again on a throw-away PostgreSQL when one is installed (spec/run-api-on-postgres.mjs), and
// ends with one plain "N passed, N failed" line over both. Builds the client first for the browser tests.
import { execSync, spawn } from 'node:child_process';
import { existsSync, readdirSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { register } from 'tsx/esm/api';
import Mocha from 'mocha';
import { failedTests } from './failed-tests.mjs';

const root = new URL('..', import.meta.url).pathname;
const specRoot = join(root, 'spec');
const clientRoot = join(root, 'client', 'src');
// Pure client helpers keep their specs beside them; they run first with the other fast suites.
const order = ['client', 'engine', 'editor', 'api', 'e2e'];

function specFiles(dir) {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name);
    if (statSync(path).isDirectory()) return name === '.tmp' ? [] : specFiles(path);
    return name.endsWith('.spec.ts') ? [path] : [];
  });
}

const rank = (file) => {
  if (file.startsWith(clientRoot)) return 0;
  const top = relative(specRoot, file).split('/')[0];
  const i = order.indexOf(top);
  return i < 0 ? order.length : i;
};
const files = [...specFiles(clientRoot), ...specFiles(specRoot)].sort((a, b) => rank(a) - rank(b) || a.localeCompare(b));

if (process.env.RUNNEL_SKIP_BUILD !== '1') {
  console.log('Building the client for the browser tests…');
  execSync('node scripts/build-client.mjs', { cwd: root, stdio: 'inherit' });
}

register();
const mocha = new Mocha({ reporter: 'spec', timeout: 60000 });
for (const file of files) mocha.addFile(file);
await mocha.loadFilesAsync();

/** PostgreSQL's server programs from Debian's package, or null when it is not installed. */
function postgresInstalled() {
  const base = '/usr/lib/postgresql';
  if (!existsSync(base)) return null;
  return readdirSync(base).some((v) => existsSync(join(base, v, 'bin', 'postgres')));
}

/** The PostgreSQL pass in a child process; resolves to its counts (a crash counts as one failure). */
function postgresPass() {
  const script = join(root, 'spec', 'run-api-on-postgres.mjs');
  const [cmd, args] = process.env['RUNNEL_TEST_PG_URL']
    ? [process.execPath, [script]]
    : ['bash', [join(root, 'scripts', 'with-postgres.sh'), process.execPath, script]];
  return new Promise((resolve) => {
    const child = spawn(cmd, args, { cwd: root, stdio: ['ignore', 'pipe', 'inherit'] });
    let tail = '';
    child.stdout.on('data', (chunk) => {
      process.stdout.write(chunk);
      tail = (tail + chunk).slice(-400);
    });
    child.on('close', (code) => {
      const m = /postgres pass: (\d+) passed, (\d+) failed/.exec(tail);
      resolve(m ? { passes: +m[1], failures: +m[2] } : { passes: 0, failures: 1, crashed: code });
    });
  });
}

const runner = mocha.run();
const failed = failedTests(runner);
runner.on('end', async () => {
  let { passes, failures, pending } = runner.stats;
  if (process.env['RUNNEL_SKIP_POSTGRES'] === '1') {
    console.log('\nPostgreSQL pass skipped (RUNNEL_SKIP_POSTGRES=1).');
  } else if (process.env['RUNNEL_TEST_PG_URL'] || postgresInstalled()) {
    console.log('\nThe API suite again on PostgreSQL…');
    const pg = await postgresPass();
    if (pg.crashed !== undefined) console.log(`The PostgreSQL pass stopped without a summary (exit ${pg.crashed}).`);
    passes += pg.passes;
    failures += pg.failures;
  } else {
    console.log('\nPostgreSQL is not installed (apt-get install -y postgresql): the API suite ran on PGlite only.');
  }
  const code = failures > 0 || passes === 0 ? 1 : 0;
  const failedList = failed.list('Failed in the main pass:');
  if (failedList) console.log(failedList);
  console.log(`\n${passes} passed, ${failures} failed${pending ? `, ${pending} skipped` : ''}`);
  // Close any handles (database, SMTP sink) a suite left open.
  setTimeout(() => process.exit(code), 200).unref();
  process.exitCode = code;
});
