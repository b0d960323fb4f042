/**
 * The PGlite data folder's lock (server/data-lock.ts, issue 13 item 2): a second server on the same
 * folder is refused with a message naming the owner, a lock left by a killed process is recovered,
 * and a server that cannot bind its port never opens (nor creates) the store.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync, readFileSync, writeFileSync } from 'node:fs';
import { createServer, type Server } from 'node:net';
import { join } from 'node:path';
import { expect } from 'chai';
import { acquireDataLock, DataLockError, lockFileOf } from '../../server/data-lock';
import { openDatabase } from '../../server/db';
import { makeTempDir, removeTempDir } from './test-app';

const repoRoot = new URL('../..', import.meta.url).pathname;

/** The lock is PGlite's: a DATABASE_URL in the caller's environment must not switch the server to PostgreSQL. */
function withoutDatabaseUrl(): NodeJS.ProcessEnv {
  const { DATABASE_URL: _ignored, ...rest } = process.env;
  return rest;
}

interface Child {
  proc: ChildProcess;
  output: () => string;
  exited: Promise<number | null>;
}

function run(args: string[], env: Record<string, string>): Child {
  let output = '';
  const proc = spawn(process.execPath, ['--import', 'tsx', ...args], {
    cwd: repoRoot,
    env: { ...withoutDatabaseUrl(), NODE_ENV: 'test', HOST: '127.0.0.1', ...env },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  proc.stdout!.on('data', (d) => (output += d));
  proc.stderr!.on('data', (d) => (output += d));
  const exited = new Promise<number | null>((resolve) => proc.once('exit', (code) => resolve(code)));
  return { proc, output: () => output, exited };
}

async function until(what: string, check: () => boolean, child: Child): Promise<void> {
  for (let i = 0; i < 600; i++) {
    if (check()) return;
    if (child.proc.exitCode !== null) throw new Error(`${what}: the process exited:\n${child.output()}`);
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`${what}: not within 60 s:\n${child.output()}`);
}

function busyPort(): Promise<{ server: Server; port: number }> {
  return new Promise((resolve) => {
    const server = createServer();
    server.listen(0, '127.0.0.1', () => resolve({ server, port: (server.address() as { port: number }).port }));
  });
}

describe('PGlite data folder lock', function () {
  this.timeout(120_000);
  let dir: string;
  beforeEach(() => {
    dir = makeTempDir('runnel-lock-');
  });
  afterEach(() => {
    removeTempDir(dir);
  });

  it('refuses a second server on the same data folder, naming the owner pid, before it binds or reads anything', async () => {
    const first = run(['server/main.ts'], { PORT: '0', RUNNEL_DATA_DIR: dir });
    try {
      await until('first server listening', () => first.output().includes('Runnel listening'), first);
      const lock = JSON.parse(readFileSync(lockFileOf(join(dir, 'pg')), 'utf8'));
      expect(lock.pid).to.equal(first.proc.pid);
      const { server, port } = await busyPort();
      server.close();
      const second = run(['server/main.ts'], { PORT: String(port), RUNNEL_DATA_DIR: dir });
      expect(await second.exited).to.equal(1);
      expect(second.output()).to.contain(`is in use by Runnel process ${first.proc.pid}`);
      expect(second.output()).to.contain('DATABASE_URL');
      expect(second.output()).to.not.contain('Runnel listening');
      // The first server's lock is untouched.
      expect(JSON.parse(readFileSync(lockFileOf(join(dir, 'pg')), 'utf8')).pid).to.equal(first.proc.pid);
    } finally {
      first.proc.kill('SIGTERM');
      await first.exited;
    }
    expect(existsSync(lockFileOf(join(dir, 'pg'))), 'a clean stop releases the lock').to.equal(false);
  });

  it('recovers a lock left by a process killed with SIGKILL', async () => {
    const pg = join(dir, 'pg');
    const holder = run(
      [
        '-e',
        `const m = await import(${JSON.stringify(join(repoRoot, 'server/data-lock.ts'))}); m.acquireDataLock(${JSON.stringify(pg)}); console.log('locked'); setInterval(() => {}, 1000);`,
      ],
      {},
    );
    await until('child holds the lock', () => holder.output().includes('locked'), holder);
    expect(() => acquireDataLock(pg)).to.throw(DataLockError, `Runnel process ${holder.proc.pid}`);
    holder.proc.kill('SIGKILL');
    await holder.exited;
    const lock = acquireDataLock(pg);
    expect(JSON.parse(readFileSync(lock.file, 'utf8')).pid).to.equal(process.pid);
    lock.release();
    expect(existsSync(lock.file)).to.equal(false);
  });

  it('does not touch the data when the port cannot be bound', async () => {
    const { server, port } = await busyPort();
    try {
      const child = run(['server/main.ts'], { PORT: String(port), RUNNEL_DATA_DIR: dir });
      expect(await child.exited).to.equal(1);
      expect(child.output()).to.contain(`Cannot listen on 127.0.0.1:${port}`);
      expect(existsSync(join(dir, 'pg')), 'no database folder was created').to.equal(false);
      expect(existsSync(lockFileOf(join(dir, 'pg'))), 'the lock was released').to.equal(false);
    } finally {
      server.close();
    }
  });

  it('refuses a second open in the same process, and never takes over a lock of another host', async () => {
    const pg = join(dir, 'pg');
    const database = await openDatabase({ kind: 'pglite', dir: pg });
    try {
      let refused: unknown;
      await openDatabase({ kind: 'pglite', dir: pg }).catch((err) => {
        refused = err;
      });
      expect(refused).to.be.instanceOf(DataLockError);
    } finally {
      await database.close();
    }
    writeFileSync(lockFileOf(pg), JSON.stringify({ pid: 1, host: 'some-other-host', startedAt: '2026-01-01T00:00:00Z' }));
    expect(() => acquireDataLock(pg)).to.throw(DataLockError, /delete .*pg\.lock/);
    // An unreadable lock (a crash while writing it) counts as stale.
    writeFileSync(lockFileOf(pg), '');
    acquireDataLock(pg).release();
  });
});
