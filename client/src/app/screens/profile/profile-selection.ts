import { Injectable, signal } from '@angular/core';

export interface ProfileEnds {
  from: string;
  to: string;
}

/**
 * The route chosen on the Profile tab, per project, remembered for this visit so the Layout's
 * profile markers (and a return to the tab) show the same route. No route chosen: the longest
 * supply route.
 */
@Injectable({ providedIn: 'root' })
export class ProfileSelection {
  private readonly ends = signal<ReadonlyMap<string, ProfileEnds>>(new Map());

  get(projectId: string): ProfileEnds | undefined {
    return this.ends().get(projectId);
  }

  set(projectId: string, ends: ProfileEnds): void {
    this.ends.update((m) => new Map(m).set(projectId, ends));
  }

  clear(projectId: string): void {
    this.ends.update((m) => {
      const next = new Map(m);
      next.delete(projectId);
      return next;
    });
  }
}
