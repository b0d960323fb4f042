import type { CdkDragEnd } from '@angular/cdk/drag-drop';
import {
  afterNextRender,
  ChangeDetectionStrategy,
  Component,
  computed,
  DestroyRef,
  effect,
  ElementRef,
  inject,
  input,
  signal,
  untracked,
  viewChild,
} from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatDialog } from '@angular/material/dialog';
import { MatMenuModule } from '@angular/material/menu';
import { MatSliderModule } from '@angular/material/slider';
import { MatSnackBar } from '@angular/material/snack-bar';
import { MatTooltipModule } from '@angular/material/tooltip';
import type { LinkKind, NetworkDocument, NodeKind } from '../../../../../engine/network-document';
import type { SteadyResult } from '../../../../../engine/index';
import { ProjectContext } from '../../core/project-context';
import { profileMarkers } from '../profile/profile-markers';
import { ProfileSelection } from '../profile/profile-selection';
import { ProfileSettings } from '../profile/profile-settings';
import { serviceStates } from '../../../../../engine/service-state';
import type { UnitSystem } from '../../../../../engine/units';
import { SessionService } from '../../core/session.service';
import { Router } from '@angular/router';
import { LayoutReview } from '../review/layout-review';
import { ReviewApi } from '../review/review-api.service';
import { VersionBanner } from '../review/version-banner';
import { CanvasView, scaleBar } from './canvas/canvas-view';
import { PlanMarkers } from './canvas/markers';
import { createEditor } from './create-editor';
import { backdropOf } from './editor/calibration';
import { markTypedLengths } from './editor/document-store';
import { resultWarnings } from './editor/result-checks';
import type { SaveStatus } from './editor/save-controller';
import { surveyPointsOf, unsetElevations } from './editor/survey';
import type { ToolId } from './tools/tool';
import { MessagesDialog, ShortcutsDialog } from './layout-dialogs';
import { LayoutApi } from './layout-api.service';
import { ElementPatch, PropertiesPanel } from './properties-panel';
import { ResultsList } from './results-list';
import { attachCanvasInput, isTyping } from './screen/canvas-input';
import { PhoneSheet } from './screen/phone-sheet';
import { attachTouchGestures } from './screen/touch-gestures';
import { exportGeoJson, exportJson, readImport } from './screen/import-export';
import { NetworkSync } from './screen/network-sync';
import { SiteFiles } from './screen/site-files';
import { SolverClient } from './solver-client';
import { ElementPalette } from './palette/element-palette';
import { paletteItems } from './palette/palette-symbol';

const STATUS_TEXT: Record<SaveStatus, string> = {
  loading: 'Loading…',
  saved: 'Saved',
  dirty: 'Unsaved changes',
  saving: 'Saving…',
  offline: 'Offline — retrying',
  conflict: 'Conflict',
  rejected: 'Not saved',
  'read-only': 'View only',
};

interface ToolButton {
  id: ToolId;
  option?: LinkKind;
  label: string;
  testid: string;
  key: string;
}

/**
 * Layout: the canvas editor where a designer draws the network over the site and sees the
 * hydraulics live. The document (in `Editor.store`) is the truth; the Konva canvas, the panels
 * and the results are views of it. This component wires them; the jobs live in screen/
 * (pointer input, server sync, site files, import/export). See README.md for the scenarios.
 */
@Component({
  selector: 'rn-layout-screen',
  imports: [
    ElementPalette,
    MatButtonModule,
    MatButtonToggleModule,
    MatMenuModule,
    MatSliderModule,
    MatTooltipModule,
    PropertiesPanel,
    ResultsList,
    VersionBanner,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './layout-screen.html',
  styleUrls: ['./layout-screen.scss', './layout-phone.scss'],
  host: {
    '(document:keydown)': 'onKeyDown($event)',
    '(document:keyup)': 'onKeyUp($event)',
    '(window:beforeunload)': 'onBeforeUnload($event)',
    '(document:visibilitychange)': 'sync.visibilityChanged()',
    '(window:focus)': 'sync.freshness.focused()',
  },
})
export class LayoutScreen {
  readonly projectId = input.required<string>();
  /** Review links: `?version=N` shows that saved version read-only; `?select=ID` selects an element. */
  // The router binds query parameters by name; the alias keeps `version` free of the class's own meaning.
  // eslint-disable-next-line @angular-eslint/no-input-rename
  readonly versionParam = input<string | undefined>(undefined, { alias: 'version' });
  // eslint-disable-next-line @angular-eslint/no-input-rename
  readonly selectParam = input<string | undefined>(undefined, { alias: 'select' });

  private readonly api = inject(LayoutApi);
  private readonly session = inject(SessionService);
  private readonly dialog = inject(MatDialog);
  private readonly snack = inject(MatSnackBar);
  private readonly destroyRef = inject(DestroyRef);
  /** The project page's unit switch (absent when the screen runs outside the project shell). */
  private readonly projectContext = inject(ProjectContext, { optional: true });
  private readonly profileSelection = inject(ProfileSelection);
  private readonly profileSettings = inject(ProfileSettings);
  private readonly canvasRef = viewChild.required<ElementRef<HTMLDivElement>>('canvas');

  readonly editor = createEditor();
  /** Marks other features draw over the plan (comment pins, findings…): see README "Markers". */
  readonly markers = new PlanMarkers();
  private view: CanvasView | null = null;
  private readonly solver = new SolverClient();
  /** The project whose answers the solver worker starts from. */
  private solvedProject: string | null = null;

  /** The earlier version shown read-only (review link), or null for the current network. */
  readonly shownVersion = signal<number | null>(null);
  private readonly wantedVersion = computed(() => {
    const n = Number(this.versionParam());
    return Number.isInteger(n) && n > 0 ? n : null;
  });
  readonly canRestore = computed(() => this.session.can('network.write'));
  readonly canEdit = computed(() => this.session.can('network.write') && this.wantedVersion() === null);
  private readonly review = new LayoutReview({
    editor: this.editor,
    markers: this.markers,
    router: inject(Router),
    api: inject(ReviewApi),
    shown: (v) => this.shownVersion.set(v),
  });
  readonly doc = signal<NetworkDocument>(this.editor.store.doc);
  readonly selection = signal<string[]>([]);
  /** Phones: the side panel as a bottom sheet (screen/phone-sheet.ts, layout-phone.scss). */
  protected readonly sheet = new PhoneSheet(this.selection);
  readonly tool = signal<{ id: ToolId; option?: string }>({ id: 'select' });
  readonly status = signal<SaveStatus>('loading');
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

  readonly sync = new NetworkSync({
    api: this.api,
    dialog: this.dialog,
    snack: this.snack,
    editor: this.editor,
    canEdit: () => this.canEdit(),
    status: (s) => this.status.set(s),
    project: (p) => {
      this.units.set(this.projectContext?.project() ? this.projectContext.units() : p.units);
      this.projectName.set(p.name);
    },
    serverResults: (r) => this.serverResults.set(r),
    loadError: (m) => this.loadError.set(m),
    loaded: (id) => void this.review.afterLoad(id, this.wantedVersion(), this.selectParam() ?? null),
  });
  readonly site = new SiteFiles({
    api: this.api,
    dialog: this.dialog,
    snack: this.snack,
    editor: this.editor,
    projectId: () => this.projectId(),
    units: () => this.units(),
    say: (m) => this.message.set(m),
  });

  readonly statusText = computed(() => (this.status() === 'rejected' ? `Not saved: ${this.sync.saver.message}` : STATUS_TEXT[this.status()]));
  readonly results = computed(() => this.solver.result() ?? this.serverResults());
  readonly solveMs = computed(() => this.solver.lastMs());
  readonly solveError = computed(() => this.solver.error());
  readonly warnings = computed(() => resultWarnings(this.doc(), this.results(), this.units()));
  /** What the results mean per element: outlet verdicts, rating shares, tank water, pipe work. */
  /** Elements whose elevation nobody has given: asked for, and no pressures shown until then. */
  readonly unset = computed(() => unsetElevations(this.doc()));
  readonly unsetNames = computed(() => {
    const ids = new Set(this.unset());
    return this.doc()
      .nodes.filter((n) => ids.has(n.id))
      .map((n) => n.name || n.id);
  });
  readonly service = computed(() => {
    const r = this.results();
    return r && !this.unset().length ? serviceStates(this.doc(), r) : null;
  });
  readonly selectedElement = computed(() => {
    const sel = this.selection();
    if (sel.length !== 1) return null;
    const d = this.doc();
    return d.nodes.find((n) => n.id === sel[0]) ?? d.links.find((l) => l.id === sel[0]) ?? null;
  });
  readonly backdrop = computed(() => backdropOf(this.doc()));
  readonly survey = computed(() => surveyPointsOf(this.doc()));
  readonly scaleBar = computed(() => {
    this.viewTick();
    return scaleBar(1 / this.editor.viewport.scale, this.units());
  });
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

  readonly palette = paletteItems();
  readonly tools: ToolButton[] = [
    { id: 'select', label: 'Select', testid: 'tool-select', key: 'V' },
    { id: 'pan', label: 'Pan', testid: 'tool-pan', key: 'H' },
    { id: 'link', option: 'pipe', label: 'Pipe', testid: 'tool-pipe', key: 'P' },
    { id: 'link', option: 'pump', label: 'Pump', testid: 'tool-pump', key: 'U' },
    { id: 'link', option: 'valve', label: 'Valve', testid: 'tool-valve', key: 'L' },
    { id: 'calibrate', label: 'Scale', testid: 'tool-calibrate', key: '' },
  ];

  /** Set while a properties-panel edit is applied: its solve skips most of the debounce. */
  private quickSolve = false;

  constructor() {
    // the Profile tab's findings as marks on the plan (screens/profile/profile-markers.ts)
    effect(() =>
      this.markers.set(
        'profile',
        profileMarkers(this.doc(), this.results(), this.profileSelection.get(this.projectId()), this.profileSettings.cover(this.projectId())),
      ),
    );
    effect(() => {
      const ctx = this.projectContext;
      if (ctx?.project()) this.units.set(ctx.units());
    });
    const ed = this.editor;
    const off = ed.subscribe((what) => {
      if (what === 'document') {
        this.solver.request(ed.store.doc, this.quickSolve);
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
    ed.onCalibrationRequest = (a, b) => this.site.askCalibration(a, b);

    effect(() => {
      const id = this.projectId();
      this.wantedVersion(); // a review link's version change reloads, then the review shows that version
      untracked(() => {
        if (id !== this.solvedProject) this.solver.forget();
        this.solvedProject = id;
        this.sync.load(id);
      });
    });
    effect(() => {
      const ro = !this.canEdit();
      untracked(() => {
        ed.readOnly = ro;
        if (ro) {
          ed.setTool('select');
          this.sync.saver.setReadOnly();
        }
      });
    });
    effect(() => {
      const o = this.overlayInput();
      untracked(() => this.view?.setOverlay(o));
    });
    // A solve result goes to the canvas straight from the worker's message, without waiting for
    // change detection to run the effect above (which then finds nothing new).
    this.solver.onResult = () => this.view?.setOverlay(this.overlayInput());
    effect(() => {
      const pts = this.survey();
      untracked(() => this.view?.setSurvey(pts));
    });
    effect(() => {
      if (this.status() === 'conflict') untracked(() => this.sync.askAboutConflict());
    });
    // Review: comment pins; a review link's version and element are applied when the network has loaded (sync `loaded`).
    effect(() => {
      const id = this.projectId();
      untracked(() => void this.review.loadPins(id));
    });
    effect(() => {
      const select = this.selectParam();
      untracked(() => {
        if (select && this.sync.project === this.projectId()) this.editor.reveal(select);
      });
    });

    afterNextRender(() => this.attachCanvas());

    this.destroyRef.onDestroy(() => {
      off();
      this.review.dispose();
      this.sync.dispose();
      this.solver.dispose();
      this.view?.dispose();
    });
  }

  private overlayInput() {
    return { results: this.results(), service: this.service(), units: this.units(), warnings: this.warnings(), show: this.showResults() };
  }

  /** Hand the committed document to the panels and autosave. */
  private publishDocument(): void {
    const store = this.editor.store;
    if (store.inGesture) return;
    this.doc.set(store.doc);
    this.canUndo.set(store.canUndo());
    this.canRedo.set(store.canRedo());
    this.sync.noteEdit();
  }

  // ---- canvas wiring ----
  private attachCanvas(): void {
    const el = this.canvasRef().nativeElement;
    const view = new CanvasView(el, this.editor, (fileId) => this.api.fileUrl(this.projectId(), fileId), this.markers);
    this.view = view;
    view.setOverlay(this.overlayInput());
    view.setSurvey(this.survey());
    // Labels keep clear of the scale bar drawn over the canvas corner.
    view.setReservedAreas(() => {
      const r = el.getBoundingClientRect();
      return Array.from(el.parentElement?.querySelectorAll('.scale-bar') ?? []).map((e) => {
        const b = e.getBoundingClientRect();
        return { x: b.left - r.left - 4, y: b.top - r.top - 4, w: b.width + 8, h: b.height + 8 };
      });
    });
    this.editor.fitToView();
    const detach = attachCanvasInput(el, this.editor, {
      committed: () => this.publishDocument(),
      markerAt: (p) => view.markerAt(p),
      resized: (w, h) => view.resize(w, h),
    });
    this.destroyRef.onDestroy(detach);
    this.destroyRef.onDestroy(attachTouchGestures(el, this.editor));
    // Browser tests only: the hook is a lazy chunk fetched when the test page asks for it.
    if (window.__runnelTestHooks) {
      void import('./screen/test-hook').then(({ installTestHook }) => {
        if (this.view !== view) return;
        const remove = installTestHook({
          editor: this.editor,
          canvas: el,
          lastSolveMs: () => this.solver.lastMs(),
          placedLabels: () => view.placedLabels(),
          markers: this.markers,
        });
        this.destroyRef.onDestroy(remove);
      });
    }
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
      this.sync.saver.flush();
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
      this.sync.saver.flush();
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

  openShortcuts(): void {
    this.dialog.open(ShortcutsDialog, { width: '520px' });
  }

  // ---- palette (CDK drag onto the canvas) ----
  onPaletteDrop(e: CdkDragEnd, kind: NodeKind): void {
    const r = this.canvasRef().nativeElement.getBoundingClientRect();
    const p = e.dropPoint;
    e.source.reset();
    if (p.x < r.left || p.x > r.right || p.y < r.top || p.y > r.bottom) return;
    this.editor.placeNode(kind, this.editor.viewport.toWorld({ x: p.x - r.left, y: p.y - r.top }));
  }

  /** Keyboard and click alternative to dragging: the place tool, then a click on the site. */
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

  // ---- import ----
  exportJson(): void {
    exportJson(this.projectName(), this.editor.store.doc);
  }

  exportGeoJson(): void {
    const problem = exportGeoJson(this.projectName(), this.editor.store.doc, this.results());
    if (problem) this.message.set(problem);
  }

  async importJson(input: HTMLInputElement): Promise<void> {
    const file = input.files?.[0];
    input.value = '';
    if (!file) return;
    const read = await readImport(file);
    if ('problems' in read) {
      this.dialog.open(MessagesDialog, { data: { title: 'Import failed', messages: read.problems } });
      return;
    }
    const doc = read.doc;
    this.editor.store.update('import', () => markTypedLengths(doc));
    this.editor.fitToView();
    this.snack.open(`Imported ${doc.nodes.length} nodes and ${doc.links.length} links. Undo restores the previous network.`, 'OK', { duration: 6000 });
  }
}
