/**
 * Demo data for Options and Takeoff (invented): the team's price list (engine/examples/demo-prices)
 * and two options of the demo design with different mainline sizes, so their pressures and costs
 * differ on the Options screen.
 */
import { applyCandidate, catalogueCandidate, demoPriceList, type NetworkDocument, type PipeLink } from '../../engine';
import { designOptions, priceItems } from '../../drizzle/schema';
import type { Db } from '../db';
import { loadNetwork } from '../network/network-store';

const MAINLINE = ['M1', 'M2', 'M3', 'M4'];

/** The design with its mainline (M1–M4) in one PE4710 DR 11 size. */
export function withMainline(doc: NetworkDocument, nominal: string): NetworkDocument {
  const cand = catalogueCandidate('pe-dr11-pe4710', nominal, 0, doc.headloss);
  if (!cand) throw new Error(`demo: no ${nominal} PE4710 DR 11`);
  return { ...doc, links: doc.links.map((l) => (MAINLINE.includes(l.id) && l.kind === 'pipe' ? applyCandidate(l as PipeLink, cand) : l)) };
}

export async function seedPricesAndOptions(db: Db, ids: { teamId: string; projectId: string; userId: string }): Promise<void> {
  const network = await loadNetwork(db, ids.projectId);
  const doc = network.document as NetworkDocument;
  await db.transaction(async (tx) => {
    await tx
      .insert(priceItems)
      .values(
        demoPriceList().map((r) => ({ teamId: ids.teamId, code: r.code, description: r.description, unit: r.unit, price: r.price, updatedBy: ids.userId })),
      );
    await tx.insert(designOptions).values([
      {
        projectId: ids.projectId,
        name: 'Mainline 2 in',
        notes: 'Larger main for more pressure at the far troughs.',
        baseVersion: network.version,
        document: withMainline(doc, '2"'),
        createdBy: ids.userId,
        updatedBy: ids.userId,
      },
      {
        projectId: ids.projectId,
        name: 'Mainline 1 in',
        notes: 'Cheaper main; check the east trough.',
        baseVersion: network.version,
        document: withMainline(doc, '1"'),
        createdBy: ids.userId,
        updatedBy: ids.userId,
      },
    ]);
  });
}
