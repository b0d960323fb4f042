/**
 * The phone's own copy of every walk (IndexedDB through Dexie), so a recording survives a closed
 * tab, a flat battery mid-walk and days out of signal. Nothing is deleted when it syncs; it is
 * marked `synced` so a retry can send it again and the server drops what it already has.
 */
import { Injectable } from '@angular/core';
import Dexie, { type EntityTable } from 'dexie';
import type { TrackPoint, Walk, WalkPhoto, WalkPoint } from './walk-types';

class WalkDexie extends Dexie {
  walks!: EntityTable<Walk, 'id'>;
  points!: EntityTable<WalkPoint, 'id'>;
  track!: EntityTable<TrackPoint, 'id'>;
  photos!: EntityTable<WalkPhoto, 'id'>;

  constructor() {
    super('runnel-walk');
    this.version(1).stores({
      walks: 'id, projectId',
      points: 'id, walkId, [walkId+synced]',
      track: 'id, walkId, [walkId+synced]',
      photos: 'id, walkId, [walkId+synced]',
    });
  }
}

@Injectable({ providedIn: 'root' })
export class WalkDb {
  private readonly db = new WalkDexie();

  /** Every walk kept on this phone, whatever its project (the app-wide sync looks for unsent ones). */
  allWalks(): Promise<Walk[]> {
    return this.db.walks.toArray();
  }

  walksOf(projectId: string): Promise<Walk[]> {
    return this.db.walks.where('projectId').equals(projectId).sortBy('startedAt');
  }

  addWalk(walk: Walk): Promise<string> {
    return this.db.walks.add(walk);
  }

  points(walkId: string): Promise<WalkPoint[]> {
    return this.db.points.where('walkId').equals(walkId).sortBy('recordedAt');
  }

  track(walkId: string): Promise<TrackPoint[]> {
    return this.db.track.where('walkId').equals(walkId).sortBy('recordedAt');
  }

  photo(id: string): Promise<WalkPhoto | undefined> {
    return this.db.photos.get(id);
  }

  unsyncedPhotos(walkId: string): Promise<WalkPhoto[]> {
    return this.db.photos.where('[walkId+synced]').equals([walkId, 0]).toArray();
  }

  async waiting(walkId: string): Promise<{ points: number; track: number; photos: number }> {
    const [points, track, photos] = await Promise.all([
      this.db.points.where('[walkId+synced]').equals([walkId, 0]).count(),
      this.db.track.where('[walkId+synced]').equals([walkId, 0]).count(),
      this.db.photos.where('[walkId+synced]').equals([walkId, 0]).count(),
    ]);
    return { points, track, photos };
  }

  /** A point and its photo in one transaction: both are kept or neither. */
  addPoint(point: WalkPoint, photo: WalkPhoto | null): Promise<void> {
    return this.db.transaction('rw', this.db.points, this.db.photos, async () => {
      if (photo) await this.db.photos.add(photo);
      await this.db.points.add(point);
    });
  }

  addTrackPoint(fix: TrackPoint): Promise<string> {
    return this.db.track.add(fix);
  }

  markPhotoSynced(id: string): Promise<number> {
    return this.db.photos.update(id, { synced: 1 });
  }

  /** Marks exactly the rows that were sent (rows recorded while the request was out stay waiting). */
  markSynced(pointIds: string[], trackIds: string[]): Promise<void> {
    return this.db.transaction('rw', this.db.points, this.db.track, async () => {
      await this.db.points.where('id').anyOf(pointIds).modify({ synced: 1 });
      await this.db.track.where('id').anyOf(trackIds).modify({ synced: 1 });
    });
  }
}
