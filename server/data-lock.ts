/**
 * An exclusive lock on a PGlite data folder. PGlite is one embedded PostgreSQL per folder with no
 * locking of its own: two processes on one folder each acknowledge writes and silently lose one
 * side's. The lock is a file `<folder>.lock` created exclusively (O_EXCL) holding the owner's pid,
 * host and start time. A second process is refused with a message naming the owner; a lock left by
 * a process that no longer runs (kill -9, power loss) is recovered on the next start.
 */
import { closeSync, linkSync, openSync, readFileSync, renameSync, unlinkSync, writeSync } from 'node:fs';
import { hostname } from 'node:os';

export interface LockOwner {
  pid: number;
  host: string;
  startedAt: string;
}

export class DataLockError extends Error {
  constructor(
    message: string,
    readonly owner: LockOwner | null,
  ) {
    super(message);
    this.name = 'DataLockError';
  }
}

export interface DataLock {
  readonly file: string;
  /** Removes the lock file if it is still ours. Safe to call twice. */
  release(): void;
}

/** Locks held by this process: opening the same folder twice in one process is refused as well. */
const held = new Set<string>();

export function lockFileOf(pgliteDir: string): string {
  return pgliteDir.replace(/\/+$/, '') + '.lock';
}

/** Takes the lock of `pgliteDir` or throws DataLockError. */
export function acquireDataLock(pgliteDir: string): DataLock {
  const file = lockFileOf(pgliteDir);
  if (held.has(file)) throw new DataLockError(inUseMessage(pgliteDir, { pid: process.pid, host: hostname(), startedAt: '' }, true), null);
  const mine: LockOwner = { pid: process.pid, host: hostname(), startedAt: new Date().toISOString() };
  const content = JSON.stringify(mine) + '\n';
  for (let attempt = 0; attempt < 3; attempt++) {
    if (tryCreate(file, content)) {
      held.add(file);
      return {
        file,
        release() {
          if (!held.delete(file)) return;
          try {
            if (readFileSync(file, 'utf8') === content) unlinkSync(file);
          } catch {
            /* already gone */
          }
        },
      };
    }
    const existing = readOwner(file);
    if (existing === undefined) continue; // vanished between our attempts: try again
    if (existing && !isStale(existing)) throw new DataLockError(inUseMessage(pgliteDir, existing, false), existing);
    removeStale(file, existing);
  }
  throw new DataLockError(`Could not take the lock ${file}: another process keeps taking it. Is a second Runnel starting on ${pgliteDir}?`, null);
}

function tryCreate(file: string, content: string): boolean {
  let fd: number;
  try {
    fd = openSync(file, 'wx', 0o644);
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code === 'EEXIST') return false;
    throw err;
  }
  try {
    writeSync(fd, content);
  } finally {
    closeSync(fd);
  }
  return true;
}

/** The owner in the lock file; null for an unreadable or empty file (a crash while writing it); undefined if gone. */
function readOwner(file: string): LockOwner | null | undefined {
  let text: string;
  try {
    text = readFileSync(file, 'utf8');
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code === 'ENOENT') return undefined;
    throw err;
  }
  try {
    const owner = JSON.parse(text) as LockOwner;
    return Number.isInteger(owner.pid) && typeof owner.host === 'string' ? owner : null;
  } catch {
    return null;
  }
}

/** A lock is stale when its owner on this host no longer runs. A lock of another host is never taken over. */
function isStale(owner: LockOwner): boolean {
  if (owner.host !== hostname()) return false;
  if (owner.pid === process.pid) return false;
  try {
    process.kill(owner.pid, 0);
  } catch (err) {
    return (err as NodeJS.ErrnoException).code === 'ESRCH';
  }
  // The pid runs; on Linux, a pid reused by a program that is not Node is no owner of ours.
  try {
    return !readFileSync(`/proc/${owner.pid}/cmdline`, 'utf8').includes('node');
  } catch {
    return false;
  }
}

/**
 * Moves the stale lock aside, then checks that what was moved is the stale one: if another starter
 * replaced it meanwhile, its fresh lock is put back (link never overwrites) and this start is refused.
 */
function removeStale(file: string, stale: LockOwner | null): void {
  const aside = `${file}.stale-${process.pid}-${Date.now()}`;
  try {
    renameSync(file, aside);
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code === 'ENOENT') return;
    throw err;
  }
  const moved = readOwner(aside);
  if (JSON.stringify(moved) !== JSON.stringify(stale)) {
    try {
      linkSync(aside, file);
    } catch {
      /* someone holds the path again */
    }
    unlinkSync(aside);
    throw new DataLockError(`Another process took the lock ${file} while this one was recovering it; not starting.`, moved ?? null);
  }
  unlinkSync(aside);
}

function inUseMessage(dir: string, owner: LockOwner, sameProcess: boolean): string {
  const who = sameProcess ? 'this same process' : `Runnel process ${owner.pid} on ${owner.host}${owner.startedAt ? ` (started ${owner.startedAt})` : ''}`;
  return [
    `The data folder ${dir} is in use by ${who}.`,
    'Two servers on one PGlite folder would lose saves, so this one does not start.',
    'Stop the other server first, or give this one its own RUNNEL_DATA_DIR; to run several instances, share a PostgreSQL server (DATABASE_URL).',
    ...(owner.host !== hostname() ? [`If no server runs on ${owner.host} any more, delete ${lockFileOf(dir)}.`] : []),
  ].join('\n');
}
