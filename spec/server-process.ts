/**
 * The real server as a child process on 127.0.0.1, for the browser tests (spec/e2e/harness.ts) and
 * the server benchmarks (bench/server-load.ts, bench/save-while-listing.ts): a free port, a
 * throw-away PGlite data folder (or a given one, to test restarts), `tsx server/main.ts`, a bounded
 * wait until /api/csrf answers, and a stop that waits for the exit and removes the folder it made.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

const repoRoot = new URL('..', import.meta.url).pathname;

export interface ServerProcess {
  baseUrl: string;
  dataDir: string;
  child: ChildProcess;
  /** What the server has written to stdout and stderr so far (its JSON log). */
  output(): string;
  stop(): Promise<void>;
}

export interface ServerOptions {
  /** Environment on top of PORT, HOST, RUNNEL_DATA_DIR, NODE_ENV=test and PUBLIC_URL. */
  env?: Record<string, string>;
  /** A data folder to use (kept at stop); by default a fresh one, removed at stop. */
  dataDir?: string;
  /** Node flags before `--import tsx`. */
  nodeArgs?: string[];
  /** Called with every whole line the server writes to stdout. */
  onLine?: (line: string) => void;
}

/** A port on 127.0.0.1 that is free now (the OS picks it; the probe closes before the server binds). */
export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const probe = createServer();
    probe.once('error', reject);
    probe.listen(0, '127.0.0.1', () => {
      const address = probe.address();
      probe.close(() => resolve(typeof address === 'object' && address ? address.port : 0));
    });
  });
}

async function waitForServer(baseUrl: string, child: ChildProcess, output: () => string): Promise<void> {
  for (let attempt = 0; attempt < 240; attempt++) {
    if (child.exitCode !== null) throw new Error(`server exited early:\n${output()}`);
    try {
      if ((await fetch(`${baseUrl}/api/csrf`)).ok) return;
    } catch {
      // not listening yet
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error(`server did not answer within 60 s:\n${output()}`);
}

/** Starts the server and resolves once it answers. */
export async function startServerProcess(options: ServerOptions = {}): Promise<ServerProcess> {
  const dir = options.dataDir ?? mkdtempSync(join(tmpdir(), 'runnel-server-'));
  const port = await freePort();
  const baseUrl = `http://127.0.0.1:${port}`;
  let output = '';
  let partial = '';
  const child = spawn(process.execPath, [...(options.nodeArgs ?? []), '--import', 'tsx', 'server/main.ts'], {
    cwd: repoRoot,
    env: { ...process.env, PORT: String(port), HOST: '127.0.0.1', RUNNEL_DATA_DIR: dir, NODE_ENV: 'test', PUBLIC_URL: baseUrl, ...options.env },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  child.stdout?.on('data', (d: Buffer) => {
    const text = d.toString('utf8');
    output += text;
    if (!options.onLine) return;
    const lines = (partial + text).split('\n');
    partial = lines.pop()!;
    for (const line of lines) options.onLine(line);
  });
  child.stderr?.on('data', (d: Buffer) => (output += d.toString('utf8')));
  const stop = async (): Promise<void> => {
    if (child.exitCode === null) {
      child.kill('SIGTERM');
      await new Promise((r) => {
        child.once('exit', r);
        setTimeout(r, 5000).unref();
      });
    }
    if (!options.dataDir) rmSync(dir, { recursive: true, force: true });
  };
  try {
    await waitForServer(baseUrl, child, () => output);
  } catch (error) {
    await stop();
    throw error;
  }
  return { baseUrl, dataDir: dir, child, output: () => output, stop };
}
