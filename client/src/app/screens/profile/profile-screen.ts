import { Component, computed, inject, input, signal, viewChild } from '@angular/core';
import { rxResource } from '@angular/core/rxjs-interop';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { solve } from '../../../../../engine/steady';
import {
  findRoutes,
  longestSupplyRoute,
  pressureText,
  profileRoute,
  RouteError,
  WORKING_SHARE,
  type ProfileFinding,
  type Route,
  type RouteProfile,
} from '../../../../../engine/profile';
import { formatQuantity, fromDisplay, toDisplay, unitLabel, type Quantity } from '../../../../../engine/units';
import { apiErrorMessage } from '../../core/api-errors';
import { loadErrorText, valueOr } from '../../core/resource-state';
import { BudgetService } from '../../core/budget.service';
import { ProjectContext } from '../../core/project-context';
import { downloadDataUrl, downloadText } from '../../shared/chart/download';
import { LineChart, type ChartSpec } from '../../shared/chart/line-chart';
import { QuantityPipe } from '../../shared/quantity.pipe';
import { SessionService } from '../../core/session.service';
import { ProfileSelection } from './profile-selection';
import { ProfileSettings } from './profile-settings';

/** Deepest default cover the server accepts, m (server/routes/profile.ts MAX_COVER_M). */
const MAX_COVER_M = 3;

const BAND: Record<ProfileFinding['kind'], string> = {
  'hgl-below-pipe': 'rgba(179, 38, 30, 0.22)',
  'over-rating': 'rgba(120, 20, 20, 0.28)',
  'over-working': 'rgba(224, 160, 0, 0.22)',
  'high-point': '#3d5a80',
  'low-point': '#6b4f2a',
};
export const FINDING_LABELS: Record<ProfileFinding['kind'], string> = {
  'hgl-below-pipe': 'HGL below the pipe',
  'over-rating': 'Static over the rating',
  'over-working': `Static over ${Math.round(WORKING_SHARE * 100)} % of the rating`,
  'high-point': 'High point: air-release valve',
  'low-point': 'Low point: drain',
};

/**
 * Profile tab: a route along the pipes (the shortest by length between two elements, or another
 * of the alternatives; by default the longest supply route), plotted against distance: ground,
 * pipe, HGL at design flow and the static line from full tanks; stretches where the HGL is under
 * the pipe or static pressure passes the rating or its working share are shaded; high and low
 * points are marked; each finding lists its caution and source (engine/profile).
 */
@Component({
  selector: 'rn-profile-screen',
  imports: [FormsModule, MatButtonModule, MatButtonToggleModule, MatFormFieldModule, MatInputModule, MatSelectModule, LineChart, QuantityPipe],
  templateUrl: './profile-screen.html',
  styleUrl: './profile-screen.scss',
})
export class ProfileScreen {
  private readonly api = inject(BudgetService);
  private readonly selection = inject(ProfileSelection);
  private readonly settings = inject(ProfileSettings);
  private readonly session = inject(SessionService);
  protected readonly context = inject(ProjectContext);
  readonly projectId = input.required<string>();

  protected readonly units = this.context.units;
  protected readonly network = rxResource({ params: () => this.projectId(), stream: ({ params }) => this.api.network(params) });
  protected readonly loadError = loadErrorText([this.network]);
  protected readonly labels = FINDING_LABELS;
  private readonly chart = viewChild(LineChart);

  protected readonly from = signal<string | null>(null);
  protected readonly to = signal<string | null>(null);
  protected readonly routeIndex = signal(0);
  /** The project's saved settings (default cover), shared with the Layout's profile marks. */
  protected readonly saved = computed(() => this.settings.get(this.projectId()));
  /** Cover for pipes without their own, m (undefined: the engine's default). */
  private readonly coverM = computed(() => this.saved()?.cover_m ?? undefined);
  /** The saved cover in display units, for the field ('' when the default applies). */
  protected readonly coverShown = computed(() => {
    const c = this.coverM();
    return c === undefined ? '' : String(Math.round(toDisplay('length', c, this.units()) * 100) / 100);
  });
  protected readonly defaultCoverText = computed(() => this.coverText(this.saved()?.default_cover_m ?? 0.45));
  protected readonly canSetCover = computed(() => this.session.can('profile.write'));
  protected readonly coverError = signal<string | null>(null);
  protected readonly coverSaving = signal(false);

  private readonly savedNetwork = valueOr(this.network, null);
  protected readonly doc = computed(() => this.savedNetwork()?.document ?? null);
  protected readonly elements = computed(() => (this.doc()?.nodes ?? []).map((n) => ({ id: n.id, name: `${n.name || n.id} (${n.kind})` })));
  private readonly names = computed(() => new Map((this.doc()?.nodes ?? []).map((n) => [n.id, n.name || n.id])));
  protected readonly steady = computed(() => {
    const d = this.doc();
    return d ? solve(d) : null;
  });

  /** The routes for the chosen ends (the remembered or longest supply route when none chosen). */
  protected readonly routes = computed<{ routes: Route[]; error: string | null }>(() => {
    const doc = this.doc();
    if (!doc) return { routes: [], error: null };
    const from = this.from() ?? this.selection.get(this.projectId())?.from ?? null;
    const to = this.to() ?? this.selection.get(this.projectId())?.to ?? null;
    try {
      if (from && to) return { routes: findRoutes(doc, from, to, 4), error: null };
      const longest = longestSupplyRoute(doc);
      return longest
        ? { routes: [longest], error: null }
        : { routes: [], error: 'No outlet is connected to a tank or source yet: draw the network on the Layout first.' };
    } catch (e) {
      return { routes: [], error: e instanceof RouteError ? e.message : String(e) };
    }
  });

  protected readonly profile = computed<RouteProfile | null>(() => {
    const doc = this.doc();
    const routes = this.routes().routes;
    if (!doc || routes.length === 0) return null;
    const route = routes[Math.min(this.routeIndex(), routes.length - 1)];
    return profileRoute(doc, route, { steady: this.steady() ?? undefined, cover_m: this.coverM() });
  });

  protected readonly spec = computed<ChartSpec | null>(() => {
    const p = this.profile();
    if (!p) return null;
    const u = this.units();
    const conv = (q: Quantity, v: number): number | null => (Number.isFinite(v) ? toDisplay(q, v, u) : null);
    const fmt = (q: Quantity) => (v: number) => formatQuantity(q, fromDisplay(q, v, u), u);
    const x = p.points.map((pt) => toDisplay('length', pt.distance_m, u));
    return {
      x,
      xLabel: `distance (${unitLabel('length', u)})`,
      xFormat: (v) => formatQuantity('length', fromDisplay('length', v, u), u),
      yLabel: `elevation (${unitLabel('elevation', u)})`,
      series: [
        {
          label: 'ground',
          values: p.points.map((pt) => conv('elevation', pt.ground_m)),
          colour: '#8d6e4a',
          fill: 'rgba(141, 110, 74, 0.12)',
          format: fmt('elevation'),
        },
        { label: 'pipe', values: p.points.map((pt) => conv('elevation', pt.pipe_m)), colour: '#37474f', width: 2.2, format: fmt('elevation') },
        { label: 'HGL', values: p.points.map((pt) => conv('head', pt.hgl_m)), colour: '#17677a', width: 2, format: fmt('head') },
        { label: 'static', values: p.points.map((pt) => conv('head', pt.static_m)), colour: '#b5485d', dash: [6, 4], format: fmt('head') },
      ],
      bands: p.findings
        .filter((f) => f.to_m > f.from_m)
        .map((f) => ({ from: toDisplay('length', f.from_m, u), to: toDisplay('length', f.to_m, u), colour: BAND[f.kind] })),
      marks: p.findings
        .filter((f) => f.kind === 'high-point' || f.kind === 'low-point')
        .map((f) => ({ x: toDisplay('length', f.at_m, u), colour: BAND[f.kind], label: f.kind === 'high-point' ? 'air valve' : 'drain' })),
    };
  });

  protected readonly elementRows = computed(() => {
    const p = this.profile();
    if (!p) return [];
    const u = this.units();
    return p.elements.map((e) => ({
      ...e,
      label: this.names().get(e.id) ?? e.id,
      pressure: pressureText(e.pressure_m, e.supplied, (v) => formatQuantity('pressure', v, u)),
      staticText: Number.isFinite(e.static_pressure_m) ? formatQuantity('pressure', e.static_pressure_m, u) : 'no supply',
    }));
  });

  protected readonly margin = computed(() => this.profile()?.static_margin ?? null);
  protected readonly workingShare = WORKING_SHARE;

  protected setEnds(from: string | null, to: string | null): void {
    this.from.set(from);
    this.to.set(to);
    this.routeIndex.set(0);
    if (from && to) this.selection.set(this.projectId(), { from, to });
  }

  protected longest(): void {
    this.selection.clear(this.projectId());
    this.setEnds(null, null);
  }

  /** A cover depth to the centimetre or hundredth of a foot (the length format rounds a cover too coarsely). */
  private coverText(m: number): string {
    return `${Math.round(toDisplay('length', m, this.units()) * 100) / 100} ${unitLabel('length', this.units())}`;
  }

  /** Save the project's default cover (typed in display units; empty: back to the default). */
  protected setCover(value: string): void {
    const typed = value.trim() === '' ? null : Number(value);
    if (typed !== null && !Number.isFinite(typed)) {
      this.coverError.set('Cover: give a depth, or leave it empty for the default');
      return;
    }
    const cover = typed === null ? null : fromDisplay('length', typed, this.units());
    // the server's limits (server/routes/profile.ts), said in the project's units
    if (cover !== null && (cover < 0 || cover > MAX_COVER_M)) {
      this.coverError.set(`Cover: give a depth from 0 to ${this.coverText(MAX_COVER_M)}, or leave it empty for the default`);
      return;
    }
    this.coverError.set(null);
    this.coverSaving.set(true);
    this.settings.saveCover(this.projectId(), cover).subscribe({
      next: () => this.coverSaving.set(false),
      error: (err: unknown) => {
        this.coverSaving.set(false);
        this.coverError.set(apiErrorMessage(err));
      },
    });
  }

  protected routeText(r: Route): string {
    return `${this.names().get(r.nodes[0]) ?? r.nodes[0]} → ${this.names().get(r.nodes[r.nodes.length - 1]) ?? r.nodes.at(-1)}, ${formatQuantity('length', r.length_m, this.units())}, via ${
      r.nodes
        .slice(1, -1)
        .map((id) => this.names().get(id) ?? id)
        .join(', ') || 'no tee'
    }`;
  }

  protected exportPng(): void {
    const url = this.chart()?.png();
    if (url) downloadDataUrl(url, 'profile.png');
  }

  protected exportCsv(): void {
    const p = this.profile();
    if (!p) return;
    const rows = ['distance_m,ground_m,pipe_m,hgl_m,static_m,link,element'];
    for (const pt of p.points)
      rows.push(
        [pt.distance_m, pt.ground_m, pt.pipe_m, pt.hgl_m, pt.static_m, pt.link, pt.element ?? '']
          .map((v) => (typeof v === 'number' && !Number.isFinite(v) ? '' : v))
          .join(','),
      );
    downloadText(`${rows.join('\n')}\n`, 'profile.csv', 'text/csv');
  }
}
