// Builds the client (`ng build --configuration production`) and returns when the build is done.
// Why not just run ng build: on this stack the ng process has now and then stayed alive, idle,
// after printing its output location (its esbuild services still attached), which would hang
// `npm start` and `npm test` for ever. The files are written before that line is printed, so once
// it appears the process gets a grace period to exit and is then stopped. A failed build still fails.
import { spawn } from 'node:child_process';
import { dirname, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = resolve(dirname(fileURLToPath(import.meta.url)), '..');
const GRACE_MS = 15000;
const LIMIT_MS = 15 * 60 * 1000;

const child = spawn(process.execPath, [resolve(root, 'node_modules/@angular/cli/bin/ng.js'), 'build', '--configuration', 'production'], {
  cwd: root,
  stdio: ['ignore', 'pipe', 'inherit'],
  env: { ...process.env, NG_CLI_ANALYTICS: 'false' },
});
let done = false;
let grace = null;
let tail = '';
child.stdout.on('data', (chunk) => {
  process.stdout.write(chunk);
  tail = (tail + String(chunk)).slice(-200); // the line may arrive split over two chunks
  if (!done && /Output location:/.test(tail)) {
    done = true;
    grace = setTimeout(() => {
      console.log(`(ng build wrote its output but had not exited after ${GRACE_MS / 1000} s: stopped)`);
      child.kill('SIGKILL');
    }, GRACE_MS);
  }
});
const limit = setTimeout(() => {
  console.error(`ng build did not finish in ${LIMIT_MS / 60000} minutes`);
  child.kill('SIGKILL');
}, LIMIT_MS);
child.on('exit', (code, signal) => {
  clearTimeout(limit);
  if (grace) clearTimeout(grace);
  if (done) process.exit(0);
  console.error(`ng build failed (${signal ?? `exit ${code}`})`);
  process.exit(code || 1);
});
