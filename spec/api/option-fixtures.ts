/** Fixtures for the options, price-list and takeoff routes. */
import { randomUUID } from 'node:crypto';
import { eq } from 'drizzle-orm';
import { designOptions, networks, priceItems } from '../../drizzle/schema';
import type { Db } from '../../server/db';

/** A new option of a saved project, copied from its current network. */
export async function insertOption(db: Db, projectId: string, name = `Option ${randomUUID().slice(0, 6)}`): Promise<string> {
  const [net] = await db.select().from(networks).where(eq(networks.projectId, projectId));
  const [row] = await db
    .insert(designOptions)
    .values({ projectId, name, baseVersion: net.version, document: net.document })
    .returning({ id: designOptions.id });
  return row.id;
}

/** A new priced item in a team's price list. */
export async function insertPrice(db: Db, teamId: string, price: number | null = 1.5): Promise<string> {
  const [row] = await db
    .insert(priceItems)
    .values({ teamId, code: `other/fixture-${randomUUID().slice(0, 8)}`, description: 'Fixture', unit: 'each', price })
    .returning({ id: priceItems.id });
  return row.id;
}

export const PRICE_CSV = 'code,description,unit,price\nother/fence-post,Fence post,each,4.50\nother/gravel,Gravel bedding,m,2.10\n';
