/** What the server benchmarks share: a free loopback port for the server under test, and percentiles. */
import { createServer } from 'node:net';
import { rmSync } from 'node:fs';

/** A port on 127.0.0.1 that is free now (the OS picks it; the probe closes before the server binds). */
export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const probe = createServer();
    probe.once('error', reject);
    probe.listen(0, '127.0.0.1', () => {
      const a = probe.address();
      probe.close(() => resolve(typeof a === 'object' && a ? a.port : 0));
    });
  });
}

/** The p-quantile (0–1) of the samples by nearest rank; NaN without samples. */
export function percentile(xs: number[], p: number): number {
  if (!xs.length) return NaN;
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.min(s.length - 1, Math.floor(p * s.length))];
}

/** Stop the server under test (up to 5 s for it to exit) and remove its data folder. */
export async function stopServer(child: import('node:child_process').ChildProcess, dataDir: string): Promise<void> {
  child.kill('SIGTERM');
  await new Promise((r) => {
    child.once('exit', r);
    setTimeout(r, 5000).unref();
  });
  rmSync(dataDir, { recursive: true, force: true });
}
