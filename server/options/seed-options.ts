/**
 * Demo data for Options and Takeoff (invented): the team's price list (engine/examples/demo-prices)
 * two options of the demo design with different mainline sizes, so their pressures and costs
 * differ on the Options screen, and the estimator's labour and margin, so the estimate has every line.
 */
import { applyCandidate, catalogueCandidate, demoPriceList, type NetworkDocument, type PipeLink } from '../../engine';
import { designOptions, priceItems, takeoffSettings } from '../../drizzle/schema';
import type { Db } from '../db';
import { loadNetwork } from '../network/network-store';
import { DEFAULT_PROJECT_SETTINGS } from './design-inputs';

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
    // Invented figures: two people for three days to trench, lay and test; a 10 % margin; no sales tax on farm water supply here.
    await tx.insert(takeoffSettings).values({
      projectId: ids.projectId,
      settings: { ...DEFAULT_PROJECT_SETTINGS, labour_hours: 48, labour_rate: 38, markup_fraction: 0.1, tax_fraction: 0 },
      updatedBy: ids.userId,
    });
  });
}
