import type { NetworkDocument } from '../../../../../../engine/network-document';
import type { Timers } from './timers';

export type SaveStatus = 'loading' | 'saved' | 'dirty' | 'saving' | 'offline' | 'conflict' | 'rejected' | 'read-only';

/** The server's copy when a save hits a newer version (409 body `current`). */
export interface ServerCopy {
  version: number;
  document: NetworkDocument;
  updatedAt?: string;
  updatedBy?: string | null;
}

export type PutOutcome =
  { kind: 'saved'; version: number } | { kind: 'conflict'; current: ServerCopy } | { kind: 'offline' } | { kind: 'rejected'; message: string };

/**
 * Autosave: a save is sent `debounceMs` after the last edit with the version last loaded or
 * saved. A 409 stops autosaving and keeps the local document until the user chooses
 * `keepMine()` (save over the newer version) or `takeTheirs()`; a network failure retries with
 * doubling back-off. Local work is never dropped: the document being edited is only replaced
 * by the caller, on the user's word.
 *
 * @example
 * const c = new SaveController(backend, realTimers, () => store.doc, (s) => chip.set(s));
 * c.loaded(3); store.subscribe(() => c.changed());
 */
export class SaveController {
  status: SaveStatus = 'loading';
  version = 0;
  conflict: ServerCopy | null = null;
  /** The document as last loaded or saved (the server's copy then): what both sides of a conflict started from. */
  base: NetworkDocument | null = null;
  message = '';
  private timer: unknown = null;
  private inFlight = false;
  private editsSinceSend = false;
  private retryMs = 0;
  /** Bumped by loaded(): an answer to a save sent before it belongs to another document. */
  private epoch = 0;
  static readonly DEBOUNCE_MS = 1500;
  static readonly RETRY_START_MS = 2000;
  static readonly RETRY_MAX_MS = 30000;

  constructor(
    private readonly backend: { put(version: number, doc: NetworkDocument): Promise<PutOutcome> },
    private readonly timers: Timers,
    private readonly currentDoc: () => NetworkDocument,
    private readonly onStatus: (status: SaveStatus) => void = () => undefined,
  ) {}

  /** The document in the editor now matches the server's `version`. */
  loaded(version: number): void {
    this.epoch++;
    this.inFlight = false;
    this.version = version;
    this.conflict = null;
    this.base = this.currentDoc();
    this.editsSinceSend = false;
    this.retryMs = 0;
    this.cancelTimer();
    this.setStatus('saved');
  }

  setReadOnly(): void {
    this.cancelTimer();
    this.setStatus('read-only');
  }

  /** Call after every document change. */
  changed(): void {
    if (this.status === 'read-only' || this.status === 'loading') return;
    this.editsSinceSend = true;
    if (this.status === 'conflict') return;
    if (!this.inFlight) this.setStatus(this.status === 'offline' ? 'offline' : 'dirty');
    if (this.status !== 'offline') this.schedule(SaveController.DEBOUNCE_MS);
  }

  /** Save now (e.g. on leaving the page or Ctrl+S). */
  flush(): void {
    if (this.status === 'dirty' || this.status === 'offline' || this.status === 'rejected') {
      this.cancelTimer();
      void this.send();
    }
  }

  /**
   * A newer server version found while local changes wait unsaved (the freshness check): the
   * same state as a 409, so the user chooses. Ignored while a save is in flight (its answer decides).
   */
  raiseConflict(current: ServerCopy): void {
    if (this.inFlight || this.status === 'read-only' || this.status === 'loading' || this.status === 'conflict') return;
    this.cancelTimer();
    this.conflict = current;
    this.editsSinceSend = true;
    this.setStatus('conflict');
  }

  /** Conflict resolved by re-saving the local document over the server's newer version. */
  keepMine(): void {
    if (!this.conflict) return;
    this.version = this.conflict.version;
    this.base = this.conflict.document;
    this.conflict = null;
    this.editsSinceSend = true;
    this.setStatus('dirty');
    void this.send();
  }

  /** Conflict resolved by taking the server's copy: returns it for the caller to load. */
  takeTheirs(): ServerCopy | null {
    const theirs = this.conflict;
    if (theirs) {
      this.loaded(theirs.version);
      this.base = theirs.document;
    }
    return theirs;
  }

  dispose(): void {
    this.cancelTimer();
  }

  private schedule(ms: number): void {
    this.cancelTimer();
    this.timer = this.timers.set(() => {
      this.timer = null;
      void this.send();
    }, ms);
  }

  private cancelTimer(): void {
    if (this.timer !== null) this.timers.clear(this.timer);
    this.timer = null;
  }

  private async send(): Promise<void> {
    if (this.inFlight) return;
    this.inFlight = true;
    this.editsSinceSend = false;
    const epoch = this.epoch;
    const doc = this.currentDoc();
    this.setStatus('saving');
    let outcome: PutOutcome;
    try {
      outcome = await this.backend.put(this.version, doc);
    } catch {
      outcome = { kind: 'offline' };
    }
    if (epoch !== this.epoch) return;
    this.inFlight = false;
    switch (outcome.kind) {
      case 'saved':
        this.version = outcome.version;
        this.base = doc;
        this.retryMs = 0;
        this.message = '';
        if (this.editsSinceSend || this.currentDoc() !== doc) {
          this.setStatus('dirty');
          this.schedule(SaveController.DEBOUNCE_MS);
        } else this.setStatus('saved');
        return;
      case 'conflict':
        this.conflict = outcome.current;
        this.editsSinceSend = true;
        this.setStatus('conflict');
        return;
      case 'offline':
        this.editsSinceSend = true;
        this.retryMs = Math.min(SaveController.RETRY_MAX_MS, this.retryMs ? this.retryMs * 2 : SaveController.RETRY_START_MS);
        this.setStatus('offline');
        this.schedule(this.retryMs);
        return;
      case 'rejected':
        this.message = outcome.message;
        this.editsSinceSend = true;
        this.setStatus('rejected');
        return;
    }
  }

  private setStatus(s: SaveStatus): void {
    this.status = s;
    this.onStatus(s);
  }
}
