// The API suite again on a real PostgreSQL (a fresh database per test app, spec/api/test-app.ts),
// run by spec/run-all.mjs inside scripts/with-postgres.sh. Ends with "postgres pass: N passed, N failed"
// for run-all to add to its summary.
import { readdirSync } from 'node:fs';
import { join } from 'node:path';
import { register } from 'tsx/esm/api';
import Mocha from 'mocha';
import { failedTests } from './failed-tests.mjs';

const apiRoot = new URL('api', import.meta.url).pathname;
process.env['RUNNEL_TEST_STORE'] = 'postgres';
register();
const mocha = new Mocha({ reporter: 'spec', timeout: 60000 });
for (const name of readdirSync(apiRoot)
  .filter((n) => n.endsWith('.spec.ts'))
  .sort())
  mocha.addFile(join(apiRoot, name));
await mocha.loadFilesAsync();
const runner = mocha.run();
const failed = failedTests(runner);
runner.on('end', () => {
  const { passes, failures } = runner.stats;
  const failedList = failed.list('Failed on PostgreSQL:');
  if (failedList) console.log(failedList);
  console.log(`\npostgres pass: ${passes} passed, ${failures} failed`);
  // Pools and sinks a suite left open must not keep the pass alive.
  setTimeout(() => process.exit(failures > 0 ? 1 : 0), 200).unref();
});
