/**
 * The app-wide half of walk syncing (core/walk-autosync.ts loads this file lazily): every walk on
 * this phone with points, track or photos not yet on the server is sent, whichever screen is open.
 * The Walk screen syncs its own open walk as well; WalkSync shares a sync under way between them.
 */
import type { Injector } from '@angular/core';
import { WalkDb } from './walk-db';
import { noSignal, WalkSync, type SyncResult } from './walk-sync';
import type { Walk } from './walk-types';

export interface PendingOutcome {
  synced: { walk: Walk; result: SyncResult }[];
  /** Walks that could not be sent (no signal, or the server refused); they stay on the phone. */
  failed: { walk: Walk; error: unknown; noSignal: boolean }[];
}

export async function syncPendingWalks(injector: Injector): Promise<PendingOutcome> {
  const db = injector.get(WalkDb);
  const syncer = injector.get(WalkSync);
  const outcome: PendingOutcome = { synced: [], failed: [] };
  for (const walk of await db.allWalks()) {
    const waiting = await db.waiting(walk.id);
    if (waiting.points + waiting.track + waiting.photos === 0) continue;
    try {
      outcome.synced.push({ walk, result: await syncer.sync(walk) });
    } catch (error) {
      outcome.failed.push({ walk, error, noSignal: noSignal(error) });
    }
  }
  return outcome;
}
