import type { SaveStatus, ServerCopy } from './save-controller';
import type { Timers } from './timers';

/** What to do about the server's copy, given the local save state. */
export type FreshnessDecision = 'none' | 'reload' | 'conflict';

/**
 * A newer version on the server: with nothing unsaved here ('saved') it is loaded; with local
 * changes waiting ('dirty', 'offline', 'rejected') the user is asked (the conflict dialog). While
 * a save is in flight its own answer (saved or 409) decides; loading, read-only and an open
 * conflict are left alone.
 */
export function decideOnServerCopy(status: SaveStatus, localVersion: number, server: ServerCopy): FreshnessDecision {
  if (server.version <= localVersion) return 'none';
  if (status === 'saved') return 'reload';
  if (status === 'dirty' || status === 'offline' || status === 'rejected') return 'conflict';
  return 'none';
}

/**
 * Keeps a window from saying "Saved" over a version someone else has replaced: the server's
 * version is checked when the tab becomes visible or regains focus, and every `INTERVAL_MS`
 * while it stays visible (not more often: a check already under way, or one less than
 * `MIN_GAP_MS` ago, is enough).
 *
 * @example
 * const f = new FreshnessCheck(() => api.currentCopy(), realTimers, () => saver, (d, copy) => act(d, copy));
 * f.setVisible(document.visibilityState === 'visible');
 */
export class FreshnessCheck {
  static readonly INTERVAL_MS = 30000;
  static readonly MIN_GAP_MS = 2000;
  private timer: unknown = null;
  private inFlight = false;
  private visible = false;
  private lastCheck = -Infinity;
  private disposed = false;

  constructor(
    private readonly fetchCopy: () => Promise<ServerCopy | null>,
    private readonly timers: Timers,
    private readonly state: () => { status: SaveStatus; version: number },
    private readonly act: (decision: Exclude<FreshnessDecision, 'none'>, copy: ServerCopy) => void,
    private readonly now: () => number = () => Date.now(),
  ) {}

  /** The tab became visible (check now, then every 30 s) or hidden (stop). */
  setVisible(visible: boolean): void {
    this.visible = visible;
    if (visible) void this.check();
    else this.cancel();
  }

  /** The window regained focus. */
  focused(): void {
    if (this.visible) void this.check();
  }

  dispose(): void {
    this.disposed = true;
    this.cancel();
  }

  /** Ask the server now (skipped while one check is running or the last was under MIN_GAP_MS ago). */
  async check(): Promise<void> {
    if (this.disposed || this.inFlight || this.now() - this.lastCheck < FreshnessCheck.MIN_GAP_MS) return;
    this.inFlight = true;
    this.lastCheck = this.now();
    this.cancel();
    let copy: ServerCopy | null = null;
    try {
      copy = await this.fetchCopy();
    } catch {
      copy = null; // offline: autosave reports that; try again on the next tick
    }
    this.inFlight = false;
    if (this.disposed) return;
    if (copy) {
      const { status, version } = this.state();
      const decision = decideOnServerCopy(status, version, copy);
      if (decision !== 'none') this.act(decision, copy);
    }
    if (this.visible)
      this.timer = this.timers.set(() => {
        this.timer = null;
        void this.check();
      }, FreshnessCheck.INTERVAL_MS);
  }

  private cancel(): void {
    if (this.timer !== null) this.timers.clear(this.timer);
    this.timer = null;
  }
}
