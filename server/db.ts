/**
 * Opening the database: PGlite on disk (default), in memory (tests) or a PostgreSQL server
 * (DATABASE_URL). Migrations from drizzle/migrations are applied through Drizzle's migrator.
 */
import { mkdirSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { PGlite } from '@electric-sql/pglite';
import type { ExtractTablesWithRelations } from 'drizzle-orm';
import type { PgDatabase, PgQueryResultHKT, PgTransaction } from 'drizzle-orm/pg-core';
import { drizzle as drizzlePglite } from 'drizzle-orm/pglite';
import { migrate as migratePglite } from 'drizzle-orm/pglite/migrator';
import { drizzle as drizzlePg } from 'drizzle-orm/node-postgres';
import { migrate as migratePg } from 'drizzle-orm/node-postgres/migrator';
import pg from 'pg';
import * as schema from '../drizzle/schema';

export type Schema = typeof schema;
/** The database handle every module uses, whichever driver is underneath. */
export type Db = PgDatabase<PgQueryResultHKT, Schema>;
export type Tx = PgTransaction<PgQueryResultHKT, Schema, ExtractTablesWithRelations<Schema>>;
/** A database or an open transaction: helpers that write take this so callers choose. */
export type DbOrTx = Db | Tx;

export const MIGRATIONS_DIR = resolve(import.meta.dirname, '../drizzle/migrations');

export type DatabaseTarget =
  | { kind: 'pglite'; dir?: string }   // dir undefined → in memory
  | { kind: 'postgres'; url: string };

export interface Database { db: Db; target: DatabaseTarget; close(): Promise<void> }

/** Opens the database and applies pending migrations. */
export async function openDatabase(target: DatabaseTarget): Promise<Database> {
  if (target.kind === 'postgres') {
    const pool = new pg.Pool({ connectionString: target.url, max: 10 });
    const db = drizzlePg(pool, { schema });
    await migratePg(db, { migrationsFolder: MIGRATIONS_DIR });
    return { db, target, close: () => pool.end() };
  }
  if (target.dir) mkdirSync(target.dir, { recursive: true });
  const client = target.dir ? new PGlite(target.dir) : new PGlite();
  const db = drizzlePglite(client, { schema });
  await migratePglite(db, { migrationsFolder: MIGRATIONS_DIR });
  return { db, target, close: () => client.close() };
}

/** The default store for a data dir: RUNNEL_DATA_DIR/pg. */
export function pgliteDir(dataDir: string): string {
  return join(dataDir, 'pg');
}
