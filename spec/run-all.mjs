// Runs every spec in spec/ (engine, editor, API, browser end-to-end) in one mocha run and ends
// with a plain "N passed, N failed" line. Builds the client first so the browser tests serve it.
import { execSync } from 'node:child_process';
import { readdirSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { register } from 'tsx/esm/api';
import Mocha from 'mocha';

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
  execSync('npx ng build --configuration production', { cwd: root, stdio: 'inherit' });
}

register();
const mocha = new Mocha({ reporter: 'spec', timeout: 60000 });
for (const file of files) mocha.addFile(file);
await mocha.loadFilesAsync();

const runner = mocha.run();
runner.on('end', () => {
  const { passes, failures, pending } = runner.stats;
  console.log(`\n${passes} passed, ${failures} failed${pending ? `, ${pending} skipped` : ''}`);
  // Close any handles (database, SMTP sink) a suite left open.
  setTimeout(() => process.exit(failures > 0 || passes === 0 ? 1 : 0), 200).unref();
  process.exitCode = failures > 0 || passes === 0 ? 1 : 0;
});
