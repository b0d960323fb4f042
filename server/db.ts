/**
 * Opening the database: PGlite on disk (default), in memory (tests) or a PostgreSQL server
 * (DATABASE_URL). Migrations from drizzle/migrations are applied through Drizzle's migrator.
 */
import { mkdirSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { PGlite } from '@electric-sql/pglite';
import type { ExtractTablesWithRelations } from 'drizzle-orm';
import type { PgDatabase, PgQueryResultHKT, PgTransaction } from 'drizzle-orm/pg-core';
import { drizzle as drizzlePglite } from 'drizzle-orm/pglite';
import { migrate as migratePglite } from 'drizzle-orm/pglite/migrator';
import { drizzle as drizzlePg } from 'drizzle-orm/node-postgres';
import { migrate as migratePg } from 'drizzle-orm/node-postgres/migrator';
import pg from 'pg';
import * as schema from '../drizzle/schema';
import { acquireDataLock, type DataLock } from './data-lock';

export type Schema = typeof schema;
/** The database handle every module uses, whichever driver is underneath. */
export type Db = PgDatabase<PgQueryResultHKT, Schema>;
export type Tx = PgTransaction<PgQueryResultHKT, Schema, ExtractTablesWithRelations<Schema>>;
/** A database or an open transaction: helpers that write take this so callers choose. */
export type DbOrTx = Db | Tx;

export const MIGRATIONS_DIR = resolve(import.meta.dirname, '../drizzle/migrations');

export type DatabaseTarget =
  /** dir undefined → in memory. `lock`: the folder's lock, already taken by the caller (server/main.ts). */
  { kind: 'pglite'; dir?: string; lock?: DataLock } | { kind: 'postgres'; url: string };

export interface Database {
  db: Db;
  target: DatabaseTarget;
  /**
   * Runs `fn` while no other instance on the same database runs its own (a PostgreSQL advisory
   * lock; PGlite has one process per folder anyway): migrations and the demo seed, so instances
   * started together behind a load balancer do not race each other.
   */
  exclusive<T>(fn: () => Promise<T>): Promise<T>;
  close(): Promise<void>;
}

/** Our advisory lock key ("runnel" in ASCII, fits an int8). */
const STARTUP_LOCK = 0x72756e6e656c;

const direct = <T>(fn: () => Promise<T>) => fn();

/** Opens the database and applies pending migrations. */
export async function openDatabase(target: DatabaseTarget): Promise<Database> {
  if (target.kind === 'postgres') {
    const pool = new pg.Pool({ connectionString: target.url, max: 10 });
    // An idle pooled connection the server drops (restart, failover, an administrator) errors on the
    // pool; without a listener that error would end the process. The pool replaces the connection.
    pool.on('error', (err) => console.error(`PostgreSQL dropped an idle connection: ${err.message}`));
    const db = drizzlePg(pool, { schema });
    const exclusive = async <T>(fn: () => Promise<T>): Promise<T> => {
      const holder = await pool.connect();
      try {
        await holder.query('select pg_advisory_lock($1)', [STARTUP_LOCK]);
        try {
          return await fn();
        } finally {
          await holder.query('select pg_advisory_unlock($1)', [STARTUP_LOCK]);
        }
      } finally {
        holder.release();
      }
    };
    try {
      await exclusive(() => migratePg(db, { migrationsFolder: MIGRATIONS_DIR }));
    } catch (err) {
      await pool.end();
      throw err;
    }
    return { db, target, exclusive, close: () => pool.end() };
  }
  if (!target.dir) {
    const client = new PGlite();
    const db = drizzlePglite(client, { schema });
    await migratePglite(db, { migrationsFolder: MIGRATIONS_DIR });
    return { db, target, exclusive: direct, close: () => client.close() };
  }
  // One process per folder (server/data-lock.ts), taken before PGlite reads a byte of it.
  mkdirSync(dirname(target.dir), { recursive: true });
  const lock = target.lock ?? acquireDataLock(target.dir);
  try {
    mkdirSync(target.dir, { recursive: true });
    const client = new PGlite(target.dir);
    const db = drizzlePglite(client, { schema });
    await migratePglite(db, { migrationsFolder: MIGRATIONS_DIR });
    return { db, target, exclusive: direct, close: () => client.close().finally(() => lock.release()) };
  } catch (err) {
    lock.release();
    throw err;
  }
}

/** The default store for a data dir: RUNNEL_DATA_DIR/pg. */
export function pgliteDir(dataDir: string): string {
  return join(dataDir, 'pg');
}
