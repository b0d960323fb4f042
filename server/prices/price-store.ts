/** The team price list in the `price_items` table: list, look up as a code → price map, import all-or-nothing. */
import { asc, eq, sql } from 'drizzle-orm';
import { priceItems, users } from '../../drizzle/schema';
import { audit } from '../audit';
import type { Db, DbOrTx } from '../db';
import type { ImportedRow } from './price-import';
import type { PriceItem } from '../../shared/prices-api';

export async function listPrices(db: DbOrTx, teamId: string): Promise<PriceItem[]> {
  const rows = await db
    .select({ row: priceItems, name: users.name })
    .from(priceItems)
    .leftJoin(users, eq(users.id, priceItems.updatedBy))
    .where(eq(priceItems.teamId, teamId))
    .orderBy(asc(priceItems.code));
  return rows.map(({ row, name }) => ({
    id: row.id,
    code: row.code,
    description: row.description,
    unit: row.unit,
    price: row.price,
    updatedAt: row.updatedAt.toISOString(),
    updatedBy: name ?? null,
  }));
}

/** code → unit price (null when the row has no price yet). */
export async function priceMap(db: DbOrTx, teamId: string): Promise<Map<string, number | null>> {
  const rows = await db.select({ code: priceItems.code, price: priceItems.price }).from(priceItems).where(eq(priceItems.teamId, teamId));
  return new Map(rows.map((r) => [r.code, r.price]));
}

/** Upsert every row in one transaction with one audit entry; returns how many were new and how many changed. */
export async function importPrices(
  db: Db,
  teamId: string,
  user: { id: string; email: string },
  rows: ImportedRow[],
  file: string,
): Promise<{ imported: number; created: number; updated: number }> {
  return db.transaction(async (tx) => {
    const existing = new Set((await tx.select({ code: priceItems.code }).from(priceItems).where(eq(priceItems.teamId, teamId))).map((r) => r.code));
    const now = new Date();
    for (let i = 0; i < rows.length; i += 200) {
      const chunk = rows
        .slice(i, i + 200)
        .map((r) => ({ teamId, code: r.code, description: r.description, unit: r.unit, price: r.price, updatedAt: now, updatedBy: user.id }));
      await tx
        .insert(priceItems)
        .values(chunk)
        .onConflictDoUpdate({
          target: [priceItems.teamId, priceItems.code],
          set: { description: sql`excluded.description`, unit: sql`excluded.unit`, price: sql`excluded.price`, updatedAt: now, updatedBy: user.id },
        });
    }
    const created = rows.filter((r) => !existing.has(r.code)).length;
    await audit(tx, { teamId, user, action: 'prices.import', target: file, detail: { rows: rows.length, created, updated: rows.length - created } });
    return { imported: rows.length, created, updated: rows.length - created };
  });
}
