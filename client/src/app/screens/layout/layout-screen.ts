import { CdkDrag, CdkDragEnd } from '@angular/cdk/drag-drop';
import {
  afterNextRender, ChangeDetectionStrategy, Component, computed, DestroyRef, effect, ElementRef, inject, input, signal, untracked, viewChild,
} from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatDialog } from '@angular/material/dialog';
import { MatMenuModule } from '@angular/material/menu';
import { MatSliderModule } from '@angular/material/slider';
import { MatSnackBar } from '@angular/material/snack-bar';
import { MatTooltipModule } from '@angular/material/tooltip';
import { firstValueFrom } from 'rxjs';
import type { LinkKind, NetworkDocument, NodeKind } from '../../../../../engine/network-document';
import { NETWORK_SCHEMA } from '../../../../../engine/network-document';
import { validateDocument } from '../../../../../engine/index';
import type { SteadyResult } from '../../../../../engine/index';
import { formatQuantity, UnitSystem } from '../../../../../engine/units';
import { SessionService } from '../../core/session.service';
import { CanvasView, scaleBar } from './canvas-view';
import { legendStops } from './editor/colour-scale';
import { conflictSummary } from './editor/document-diff';
import { emptyDocument, markTypedLengths } from './editor/document-store';
import type { Backdrop } from './editor/editor';
import { createEditor } from './create-editor';
import { toGeoJson } from './editor/geojson-export';
import { resultWarnings } from './editor/result-checks';
import { FreshnessCheck } from './editor/freshness-check';
import { SaveController, SaveStatus, ServerCopy } from './editor/save-controller';
import { nearestSurveyPoint, profileAlong, SurveyPoint, toLocalPoints } from './editor/survey';
import { realTimers } from './editor/timers';
import type { PointerInput, ToolId } from './tools/tool';
import { NODE_KINDS, ShapeSpec } from './kinds';
import { CalibrateDialog, MessagesDialog, SaveConflictDialog, ShortcutsDialog } from './layout-dialogs';
import { LayoutApi, LayoutApiError } from './layout-api.service';
import { ElementPatch, PropertiesPanel } from './properties-panel';
import { ResultsList } from './results-list';
import { SolverClient } from './solver-client';

/** The browser-test hook, present only while the Layout screen is open. */
export interface RunnelEditorHook {
  getDocument(): NetworkDocument;
  getSelection(): string[];
  lastSolveMs(): number;
  frameTimes(): number[];
  /** Page (client) coordinates of a site point, for driving the canvas with a real mouse. */
  worldToClient(x_m: number, y_m: number): { x: number; y: number };
  /** Labels shown on the canvas now (element id, or bank:<id>), as page (client) boxes. */
  labelBoxes(): { id: string; x: number; y: number; w: number; h: number }[];
}

declare global {
  interface Window { __runnelEditor?: RunnelEditorHook }
}

const STATUS_TEXT: Record<SaveStatus, string> = {
  loading: 'Loading…', saved: 'Saved', dirty: 'Unsaved changes', saving: 'Saving…', offline: 'Offline — retrying',
  conflict: 'Conflict', rejected: 'Not saved', 'read-only': 'View only',
};

interface PaletteItem { kind: NodeKind; label: string; testid: string; shapes: ShapeSpec[] }
interface ToolButton { id: ToolId; option?: LinkKind; label: string; testid: string; key: string }

/**
 * Layout: the canvas editor where a designer draws the network over the site and sees the
 * hydraulics live. The document (in `Editor.store`) is the truth; the Konva canvas, the panels
 * and the results are views of it. See README.md in this folder for the scenarios.
 */
@Component({
  selector: 'rn-layout-screen',
  imports: [CdkDrag, MatButtonModule, MatButtonToggleModule, MatMenuModule, MatSliderModule, MatTooltipModule, PropertiesPanel, ResultsList],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './layout-screen.html',
  styleUrl: './layout-screen.scss',
  host: {
    '(document:keydown)': 'onKeyDown($event)',
    '(document:keyup)': 'onKeyUp($event)',
    '(window:beforeunload)': 'onBeforeUnload($event)',
    '(document:visibilitychange)': 'onVisibilityChange()',
    '(window:focus)': 'freshness.focused()',
  },
})
export class LayoutScreen {
  readonly projectId = input.required<string>();

  private readonly api = inject(LayoutApi);
  private readonly session = inject(SessionService);
  private readonly dialog = inject(MatDialog);
  private readonly snack = inject(MatSnackBar);
  private readonly destroyRef = inject(DestroyRef);
  private readonly canvasRef = viewChild.required<ElementRef<HTMLDivElement>>('canvas');

  readonly editor = createEditor();
  private view: CanvasView | null = null;
  private readonly solver = new SolverClient();
  private readonly saver = new SaveController(
    // Saves go to the project whose network was loaded, even while the route moves on.
    { put: (version, doc) => this.api.saveNetwork(this.loadedProject, version, doc) },
    realTimers,
    () => this.editor.store.doc,
    (s) => this.status.set(s),
  );

  /** Notices a version saved elsewhere when the tab comes back (and every 30 s while visible). */
  readonly freshness = new FreshnessCheck(
    () => this.fetchServerCopy(),
    realTimers,
    () => this.saver,
    (decision, copy) => (decision === 'reload' ? this.reloadFromServer(copy) : this.saver.raiseConflict(copy)),
  );

  readonly canEdit = computed(() => this.session.can('network.write'));
  readonly doc = signal<NetworkDocument>(this.editor.store.doc);
  readonly selection = signal<string[]>([]);
  readonly tool = signal<{ id: ToolId; option?: string }>({ id: 'select' });
  readonly status = signal<SaveStatus>('loading');
  readonly statusText = computed(() => (this.status() === 'rejected' ? `Not saved: ${this.saver.message}` : STATUS_TEXT[this.status()]));
  readonly units = signal<UnitSystem>('us');
  readonly projectName = signal('');
  readonly canUndo = signal(false);
  readonly canRedo = signal(false);
  readonly snapOn = signal(true);
  readonly showResults = signal(true);
  readonly message = signal('');
  readonly loadError = signal('');
  private readonly viewTick = signal(0);
  private readonly serverResults = signal<SteadyResult | null>(null);

  readonly results = computed(() => this.solver.result() ?? this.serverResults());
  readonly solveMs = computed(() => this.solver.lastMs());
  readonly solveError = computed(() => this.solver.error());
  readonly warnings = computed(() => resultWarnings(this.doc(), this.results(), this.units()));
  readonly selectedElement = computed(() => {
    const sel = this.selection();
    if (sel.length !== 1) return null;
    const d = this.doc();
    return d.nodes.find((n) => n.id === sel[0]) ?? d.links.find((l) => l.id === sel[0]) ?? null;
  });
  readonly backdrop = computed(() => (this.doc().layout?.['backdrop'] as Backdrop | undefined) ?? null);
  readonly survey = computed(() => {
    const s = this.doc().layout?.['survey'] as { points?: SurveyPoint[] } | undefined;
    return s?.points ?? [];
  });
  readonly scaleBar = computed(() => {
    this.viewTick();
    return scaleBar(1 / this.editor.viewport.scale, this.units());
  });
  readonly legend = computed(() =>
    legendStops(6).map((s) => ({ colour: s.colour, label: formatQuantity('pressure', s.margin_m, this.units(), 0) })),
  );
  readonly toolHint = computed(() => {
    const t = this.tool();
    if (t.id === 'link') return `Click the start element, click for bends, click the end element. Esc cancels, Backspace removes a bend.`;
    if (t.id === 'calibrate') return 'Click two points a known distance apart.';
    if (t.id === 'place') return 'Click to place. Shift-click to place another.';
    if (t.id === 'pan') return 'Drag to move the view.';
    if (t.id === 'backdrop') return 'Drag to slide the backdrop under the network. Esc when done.';
    const el = this.selectedElement();
    if (t.id === 'select' && el && 'from' in el && this.canEdit()) {
      return 'Add a bend: drag a + or double-click the line. Remove: double-click the bend, or click it and press Delete.';
    }
    return '';
  });

  readonly palette: PaletteItem[] = (['source', 'tank', 'tee', 'outlet'] as NodeKind[]).map((kind) => {
    const def = NODE_KINDS[kind];
    return { kind, label: def.label, testid: 'palette-' + kind, shapes: def.symbol(def.create('p', 0, 0)) };
  });
  readonly tools: ToolButton[] = [
    { id: 'select', label: 'Select', testid: 'tool-select', key: 'V' },
    { id: 'pan', label: 'Pan', testid: 'tool-pan', key: 'H' },
    { id: 'link', option: 'pipe', label: 'Pipe', testid: 'tool-pipe', key: 'P' },
    { id: 'link', option: 'pump', label: 'Pump', testid: 'tool-pump', key: 'U' },
    { id: 'link', option: 'valve', label: 'Valve', testid: 'tool-valve', key: 'L' },
    { id: 'calibrate', label: 'Scale', testid: 'tool-calibrate', key: '' },
  ];

  private frameLog: number[] = [];
  private lastFrame = 0;
  private frameLoop = 0;
  private pointerActive = false;
  private conflictOpen = false;
  private notifiedRevision = 0;
  private loadedProject = '';
  /** Set while a properties-panel edit is applied: its solve skips most of the debounce. */
  private quickSolve = false;

  constructor() {
    const ed = this.editor;
    const off = ed.subscribe((what) => {
      if (what === 'document') {
        const d = ed.store.doc;
        this.solver.request(d, this.quickSolve);
        // During a drag only the canvas follows every frame; panels catch up when it ends.
        if (!ed.store.inGesture) this.publishDocument();
      } else if (what === 'selection') this.selection.set([...ed.selection]);
      else if (what === 'tool') {
        const t = ed.activeTool;
        this.tool.set({ id: t.id, option: 'kind' in t ? String((t as { kind: string }).kind) : undefined });
      } else if (what === 'view') {
        this.viewTick.update((v) => v + 1);
        this.snapOn.set(ed.grid.snap);
      } else if (what === 'message') this.message.set(ed.message);
    });
    ed.onCalibrationRequest = (a, b) => this.askCalibration(a, b);

    effect(() => {
      const id = this.projectId();
      untracked(() => this.load(id));
    });
    effect(() => {
      const ro = !this.canEdit();
      untracked(() => {
        ed.readOnly = ro;
        if (ro) {
          ed.setTool('select');
          this.saver.setReadOnly();
        }
      });
    });
    effect(() => {
      const o = { results: this.results(), units: this.units(), warnings: this.warnings(), show: this.showResults() };
      untracked(() => this.view?.setOverlay(o));
    });
    // A solve result goes to the canvas straight from the worker's message, without waiting for
    // change detection to run the effect above (which then finds nothing new).
    this.solver.onResult = () => this.view?.setOverlay({ results: this.results(), units: this.units(), warnings: this.warnings(), show: this.showResults() });
    effect(() => {
      const pts = this.survey();
      untracked(() => this.view?.setSurvey(pts));
    });

    effect(() => {
      if (this.status() === 'conflict') untracked(() => this.askAboutConflict());
    });

    afterNextRender(() => this.attachCanvas());

    window.__runnelEditor = {
      getDocument: () => structuredClone(ed.store.doc),
      getSelection: () => [...ed.selection],
      lastSolveMs: () => this.solver.lastMs(),
      frameTimes: () => [...this.frameLog],
      worldToClient: (x_m, y_m) => {
        const r = this.canvasRef().nativeElement.getBoundingClientRect();
        const p = ed.viewport.toScreen({ x: x_m, y: y_m });
        return { x: r.left + p.x, y: r.top + p.y };
      },
      labelBoxes: () => {
        const r = this.canvasRef().nativeElement.getBoundingClientRect();
        return [...(this.view?.placedLabels().values() ?? [])].map((p) => ({ id: p.id, x: r.left + p.box.x, y: r.top + p.box.y, w: p.box.w, h: p.box.h }));
      },
    };

    this.destroyRef.onDestroy(() => {
      off();
      this.saver.flush();
      this.saver.dispose();
      this.freshness.dispose();
      this.solver.dispose();
      this.view?.dispose();
      cancelAnimationFrame(this.frameLoop);
      delete window.__runnelEditor;
    });
  }

  /** Hand the committed document to the panels and autosave. */
  private publishDocument(): void {
    const store = this.editor.store;
    if (store.inGesture) return;
    this.doc.set(store.doc);
    this.canUndo.set(store.canUndo());
    this.canRedo.set(store.canRedo());
    this.noteEdit();
  }

  /** Tell autosave about committed edits only: a drag saves once, when it ends. */
  private noteEdit(): void {
    const store = this.editor.store;
    if (store.inGesture || store.revision === this.notifiedRevision) return;
    this.notifiedRevision = store.revision;
    this.saver.changed();
  }

  // ---- loading ----
  private load(projectId: string): void {
    // Same screen, another project: send what is pending for the previous one first.
    if (this.loadedProject && this.loadedProject !== projectId) this.saver.flush();
    this.status.set('loading');
    this.api.project(projectId).subscribe({
      next: (p) => {
        this.units.set(p.units);
        this.editor.units = p.units;
        this.projectName.set(p.name);
      },
      error: () => undefined,
    });
    this.api.network(projectId).subscribe({
      next: (rec) => {
        const doc = rec.document && Array.isArray(rec.document.nodes) ? markTypedLengths(rec.document) : emptyDocument();
        this.loadedProject = projectId;
        this.editor.store.replace(doc);
        this.notifiedRevision = this.editor.store.revision;
        this.serverResults.set(rec.results ?? null);
        if (this.canEdit()) {
          this.saver.loaded(rec.version);
          this.freshness.setVisible(document.visibilityState === 'visible');
        } else this.saver.setReadOnly();
        this.editor.fitToView();
      },
      error: () => this.loadError.set('The network could not be loaded. Reload the page to try again.'),
    });
  }

  // ---- versions saved elsewhere ----
  onVisibilityChange(): void {
    this.freshness.setVisible(document.visibilityState === 'visible' && this.canEdit() && !!this.loadedProject);
  }

  private async fetchServerCopy(): Promise<ServerCopy | null> {
    const project = this.loadedProject;
    if (!project) return null;
    const rec = await firstValueFrom(this.api.network(project, true));
    // Another project opened meanwhile: this answer is about the old one.
    if (project !== this.loadedProject || !rec.document || !Array.isArray(rec.document.nodes)) return null;
    return { version: rec.version, document: rec.document, updatedAt: rec.updatedAt ?? undefined, updatedBy: rec.updatedBy };
  }

  /** Nothing unsaved here and a newer version on the server: show that one, and say so. */
  private reloadFromServer(copy: ServerCopy): void {
    this.editor.store.replace(markTypedLengths(copy.document));
    this.notifiedRevision = this.editor.store.revision;
    this.saver.loaded(copy.version);
    this.serverResults.set(null);
    const by = copy.updatedBy ? ` saved by ${copy.updatedBy}` : ' saved elsewhere';
    this.snack.open(`Reloaded version ${copy.version}${by}.`, 'OK', { duration: 6000 });
  }

  // ---- canvas wiring ----
  private attachCanvas(): void {
    const el = this.canvasRef().nativeElement;
    const view = new CanvasView(el, this.editor, (fileId) => this.api.fileUrl(this.projectId(), fileId));
    this.view = view;
    view.setOverlay({ results: this.results(), units: this.units(), warnings: this.warnings(), show: this.showResults() });
    view.setSurvey(this.survey());
    // Labels keep clear of the legend and the scale bar drawn over the canvas corners.
    view.setReservedAreas(() => {
      const r = el.getBoundingClientRect();
      return Array.from(el.parentElement?.querySelectorAll('.scale-bar, .legend') ?? []).map((e) => {
        const b = e.getBoundingClientRect();
        return { x: b.left - r.left - 4, y: b.top - r.top - 4, w: b.width + 8, h: b.height + 8 };
      });
    });
    this.editor.fitToView();
    const toInput = (e: PointerEvent | MouseEvent): PointerInput => {
      const r = el.getBoundingClientRect();
      const screen = { x: e.clientX - r.left, y: e.clientY - r.top };
      return { screen, world: this.editor.viewport.toWorld(screen), button: e.button, shift: e.shiftKey, mod: e.ctrlKey || e.metaKey };
    };
    const down = (e: PointerEvent) => {
      el.focus({ preventScroll: true });
      el.setPointerCapture(e.pointerId);
      if (e.button === 1) e.preventDefault();
      this.pointerActive = true;
      this.startFrameLog();
      this.editor.pointerDown(toInput(e));
    };
    const move = (e: PointerEvent) => this.editor.pointerMove(toInput(e));
    const up = (e: PointerEvent) => {
      this.pointerActive = false;
      if (el.hasPointerCapture(e.pointerId)) el.releasePointerCapture(e.pointerId);
      this.editor.pointerUp(toInput(e));
      this.publishDocument();
    };
    const wheel = (e: WheelEvent) => {
      e.preventDefault();
      const r = el.getBoundingClientRect();
      this.editor.zoomAt({ x: e.clientX - r.left, y: e.clientY - r.top }, Math.exp(-e.deltaY * (e.deltaMode === 1 ? 0.05 : 0.0015)));
    };
    const dbl = (e: MouseEvent) => {
      if (e.button !== 0) return;
      if (this.editor.doubleClick(toInput(e))) this.publishDocument();
    };
    const noMenu = (e: Event) => e.preventDefault();
    el.addEventListener('pointerdown', down);
    el.addEventListener('pointermove', move);
    el.addEventListener('pointerup', up);
    el.addEventListener('pointercancel', up);
    el.addEventListener('wheel', wheel, { passive: false });
    el.addEventListener('dblclick', dbl);
    el.addEventListener('contextmenu', noMenu);
    const ro = new ResizeObserver(() => view.resize(el.clientWidth, el.clientHeight));
    ro.observe(el);
    this.destroyRef.onDestroy(() => {
      ro.disconnect();
      el.removeEventListener('pointerdown', down);
      el.removeEventListener('pointermove', move);
      el.removeEventListener('pointerup', up);
      el.removeEventListener('pointercancel', up);
      el.removeEventListener('wheel', wheel);
      el.removeEventListener('dblclick', dbl);
      el.removeEventListener('contextmenu', noMenu);
    });
  }

  /** Frame-to-frame times while the pointer is down (for the smooth-drag check). */
  private startFrameLog(): void {
    cancelAnimationFrame(this.frameLoop);
    this.lastFrame = performance.now();
    const tick = (t: number) => {
      this.frameLog.push(t - this.lastFrame);
      if (this.frameLog.length > 600) this.frameLog.splice(0, this.frameLog.length - 600);
      this.lastFrame = t;
      if (this.pointerActive) this.frameLoop = requestAnimationFrame(tick);
    };
    this.frameLoop = requestAnimationFrame(tick);
  }

  // ---- keyboard ----
  onKeyDown(e: KeyboardEvent): void {
    if (this.dialog.openDialogs.length || isTyping(e.target)) return;
    const onCanvas = e.target === document.body || e.target === this.canvasRef().nativeElement;
    if (e.key === ' ' && onCanvas) {
      this.editor.spaceHeld = true;
      e.preventDefault();
      return;
    }
    if ((e.ctrlKey || e.metaKey) && e.key.toLowerCase() === 's') {
      this.saver.flush();
      e.preventDefault();
      return;
    }
    if (!onCanvas && (e.key === ' ' || e.key === 'Enter')) return;
    if (e.key === '?') {
      this.openShortcuts();
      e.preventDefault();
      return;
    }
    if (this.editor.handleKey(e.key, { mod: e.ctrlKey || e.metaKey, shift: e.shiftKey })) e.preventDefault();
  }

  onKeyUp(e: KeyboardEvent): void {
    if (e.key === ' ') this.editor.spaceHeld = false;
  }

  onBeforeUnload(e: BeforeUnloadEvent): void {
    const s = this.status();
    if (s === 'dirty' || s === 'saving' || s === 'offline' || s === 'conflict' || s === 'rejected') {
      this.saver.flush();
      e.preventDefault();
    }
  }

  // ---- toolbar ----
  isActive(t: ToolButton): boolean {
    const cur = this.tool();
    return cur.id === t.id && (t.option === undefined || cur.option === t.option);
  }

  chooseTool(t: ToolButton): void {
    this.editor.setTool(t.id, t.option);
  }

  undo(): void {
    this.editor.undo();
  }

  redo(): void {
    this.editor.redo();
  }

  fit(): void {
    this.editor.fitToView();
  }

  toggleSnap(): void {
    this.editor.toggleSnap();
  }

  openShortcuts(): void {
    this.dialog.open(ShortcutsDialog, { width: '520px' });
  }

  // ---- palette (CDK drag onto the canvas) ----
  onPaletteDrop(e: CdkDragEnd, kind: NodeKind): void {
    const el = this.canvasRef().nativeElement;
    const r = el.getBoundingClientRect();
    const p = e.dropPoint;
    e.source.reset();
    if (p.x < r.left || p.x > r.right || p.y < r.top || p.y > r.bottom) return;
    this.editor.placeNode(kind, this.editor.viewport.toWorld({ x: p.x - r.left, y: p.y - r.top }));
  }

  /** Keyboard and click alternative to dragging: place at the centre of the view. */
  placeFromPalette(kind: NodeKind): void {
    this.editor.setTool('place', kind);
  }

  // ---- properties ----
  applyPatch(p: ElementPatch): void {
    this.quickSolve = true;
    try {
      this.editor.store.patchElement(p.id, p.patch);
    } finally {
      this.quickSolve = false;
    }
  }

  pickResult(id: string): void {
    this.editor.reveal(id);
  }

  deleteSelection(): void {
    this.editor.deleteSelection();
  }

  snapElevation(id: string): void {
    const n = this.editor.store.node(id);
    const near = n ? nearestSurveyPoint(this.survey(), { x: n.x_m ?? 0, y: n.y_m ?? 0 }) : null;
    if (!n || !near) return;
    this.editor.store.patchElement(id, { elevation_m: near.point.elevation_m });
    this.message.set(
      `Elevation set to ${formatQuantity('elevation', near.point.elevation_m, this.units())} from survey point ${near.point.label ?? ''} ` +
        `${formatQuantity('length', near.distance_m, this.units())} away`,
    );
  }

  profileFromSurvey(id: string): void {
    const prof = profileAlong(this.editor.store.doc, id, this.survey(), 10);
    if (!prof) return;
    this.editor.store.patchElement(id, { profile: prof.profile, length_m: prof.groundLength_m, length_source: 'survey' });
    this.message.set(
      `Profile from ${prof.used} survey point(s) within 10 m of the line; length along the ground ${formatQuantity('length', prof.groundLength_m, this.units())}`,
    );
  }

  /** A 409 on save: ask once; never overwrite or drop anything without the user's word. */
  private askAboutConflict(): void {
    if (this.status() !== 'conflict' || this.conflictOpen) return;
    const current = this.saver.conflict;
    if (!current) return;
    this.conflictOpen = true;
    const summary = conflictSummary(this.saver.base, this.editor.store.doc, current.document);
    const ref = this.dialog.open(SaveConflictDialog, { data: { ...current, summary }, disableClose: true, width: '460px' });
    ref.afterClosed().subscribe((choice: 'mine' | 'theirs' | undefined) => {
      this.conflictOpen = false;
      if (choice === 'theirs') {
        const theirs = this.saver.conflict;
        if (theirs) this.editor.store.replace(markTypedLengths(theirs.document));
        this.saver.takeTheirs();
      } else this.saver.keepMine();
    });
  }

  // ---- backdrop ----
  async uploadBackdrop(input: HTMLInputElement): Promise<void> {
    const file = input.files?.[0];
    input.value = '';
    if (!file) return;
    try {
      const rec = await firstValueFrom(this.api.uploadBackdrop(this.projectId(), file));
      const img = await loadImage(this.api.fileUrl(this.projectId(), rec.id));
      const vp = this.editor.viewport;
      const visible = vp.visibleWorld();
      // Start at a scale that fits the view; the Scale tool then sets it properly.
      const m_per_px = (visible.width * 0.8) / img.naturalWidth;
      const centre = { x: visible.x + visible.width / 2, y: visible.y + visible.height / 2 };
      const backdrop: Backdrop = {
        fileId: rec.id, opacity: 0.6, m_per_px, width_px: img.naturalWidth, height_px: img.naturalHeight,
        x_m: centre.x - (img.naturalWidth * m_per_px) / 2, y_m: centre.y + (img.naturalHeight * m_per_px) / 2,
      };
      this.editor.store.patchLayout({ backdrop });
      this.snack.open('Backdrop added. Use the Scale tool to set its scale from two points a known distance apart.', 'OK', { duration: 8000 });
    } catch (err) {
      const msg = err instanceof LayoutApiError ? err.message : 'The image could not be loaded.';
      this.snack.open(`Backdrop not added: ${msg}`, 'OK', { duration: 10000 });
    }
  }

  setBackdropOpacity(value: number): void {
    const b = this.backdrop();
    if (b) this.editor.store.patchLayout({ backdrop: { ...b, opacity: value } });
  }

  removeBackdrop(): void {
    this.editor.store.patchLayout({ backdrop: undefined });
  }

  private askCalibration(a: { x: number; y: number }, b: { x: number; y: number }): void {
    this.dialog
      .open(CalibrateDialog, {
        width: '420px',
        data: { units: this.units(), hasBackdrop: !!this.backdrop(), hasNetwork: this.doc().nodes.length > 0, backdropScaled: !!this.backdrop()?.scale },
      })
      .afterClosed()
      .subscribe((answer: { metres: number; network: boolean } | undefined) => {
        if (answer && answer.metres > 0) {
          this.editor.applyCalibration(a, b, answer.metres, { network: answer.network });
          this.editor.fitToView();
        } else this.editor.cancelCalibration();
      });
  }

  // ---- survey ----
  async uploadSurvey(input: HTMLInputElement): Promise<void> {
    const file = input.files?.[0];
    input.value = '';
    if (!file) return;
    try {
      const parsed = await firstValueFrom(this.api.parseSurvey(this.projectId(), file));
      const points = toLocalPoints(parsed.points);
      this.editor.store.patchLayout({ survey: { filename: file.name, format: parsed.format, points } });
      this.snack.open(`${points.length} survey point(s) from ${file.name}. Select an element to apply them.`, 'OK', { duration: 6000 });
    } catch (err) {
      const e = err instanceof LayoutApiError ? err : null;
      const where = e?.line !== undefined && !/\b(line|point)\s+\d+/i.test(e.message) ? ` (line/point ${e.line})` : '';
      this.dialog.open(MessagesDialog, { data: { title: 'Survey file not read', messages: [(e?.message ?? 'The file could not be read.') + where] } });
    }
  }

  clearSurvey(): void {
    this.editor.store.patchLayout({ survey: undefined });
  }

  // ---- import / export ----
  exportJson(): void {
    download(`${slug(this.projectName())}-network.json`, JSON.stringify(this.editor.store.doc, null, 2), 'application/json');
  }

  exportGeoJson(): void {
    download(`${slug(this.projectName())}-network.geojson`, JSON.stringify(toGeoJson(this.editor.store.doc), null, 2), 'application/geo+json');
  }

  async importJson(input: HTMLInputElement): Promise<void> {
    const file = input.files?.[0];
    input.value = '';
    if (!file) return;
    let parsed: unknown;
    try {
      parsed = JSON.parse(await file.text());
    } catch {
      this.dialog.open(MessagesDialog, { data: { title: 'Import failed', messages: [`${file.name} is not valid JSON.`] } });
      return;
    }
    const problems = validateDocument(parsed).filter((w) => w.code === 'invalid');
    const doc = parsed as NetworkDocument;
    if (!problems.length && doc?.schema !== NETWORK_SCHEMA) problems.push({ code: 'invalid', element: null, message: `schema: expected "${NETWORK_SCHEMA}"` });
    if (problems.length) {
      this.dialog.open(MessagesDialog, { data: { title: 'Import failed', messages: problems.map((p) => p.message) } });
      return;
    }
    this.editor.store.update('import', () => markTypedLengths(doc));
    this.editor.fitToView();
    this.snack.open(`Imported ${doc.nodes.length} nodes and ${doc.links.length} links. Undo restores the previous network.`, 'OK', { duration: 6000 });
  }

  shapePoints(s: ShapeSpec): string {
    return s.t === 'poly' ? s.points.join(',') : '';
  }
}

function isTyping(target: EventTarget | null): boolean {
  const el = target as HTMLElement | null;
  if (!el || !el.tagName) return false;
  return el.isContentEditable || ['INPUT', 'TEXTAREA', 'SELECT'].includes(el.tagName) || !!el.closest('mat-select, [role="listbox"], .cdk-overlay-container');
}

function loadImage(url: string): Promise<HTMLImageElement> {
  return new Promise((resolve, reject) => {
    const img = new Image();
    img.onload = () => resolve(img);
    img.onerror = () => reject(new Error('image'));
    img.src = url;
  });
}

function download(filename: string, text: string, type: string): void {
  const a = document.createElement('a');
  a.href = `data:${type};charset=utf-8,${encodeURIComponent(text)}`;
  a.download = filename;
  a.click();
}

function slug(name: string): string {
  return name.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '') || 'runnel';
}
