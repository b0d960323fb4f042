import { geoReferenceOf, referenceAt, toLocal } from '../../../../../../engine/geo-reference';
import type { MatDialog } from '@angular/material/dialog';
import type { MatSnackBar } from '@angular/material/snack-bar';
import { firstValueFrom } from 'rxjs';
import { formatQuantity, UnitSystem } from '../../../../../../engine/units';
import type { Backdrop } from '../editor/calibration';
import type { Editor } from '../editor/editor';
import type { Point } from '../editor/geometry';
import { nearestSurveyPoint, profileAlong, surveyElevationChanges, surveyPointsOf, toLocalPoints, withSurveyElevations } from '../editor/survey';
import { CalibrateDialog, MessagesDialog, SurveyApplyDialog } from '../layout-dialogs';
import { LayoutApi, LayoutApiError } from '../layout-api.service';
import { countOf } from '../../../shared/count';

/** What the site tools need from the screen. */
export interface SiteHost {
  api: LayoutApi;
  dialog: MatDialog;
  snack: MatSnackBar;
  editor: Editor;
  projectId(): string;
  units(): UnitSystem;
  say(message: string): void;
}

/**
 * The Site menu's work: the backdrop image (upload, opacity, scale from two points, removal) and
 * survey points (upload, elevation of the nearest point, ground profile along a pipe).
 */
export class SiteFiles {
  constructor(private readonly host: SiteHost) {}

  async uploadBackdrop(input: HTMLInputElement): Promise<void> {
    const file = input.files?.[0];
    input.value = '';
    if (!file) return;
    const { api, editor, snack } = this.host;
    try {
      const rec = await firstValueFrom(api.uploadBackdrop(this.host.projectId(), file));
      const img = await loadImage(api.fileUrl(this.host.projectId(), rec.id));
      const visible = editor.viewport.visibleWorld();
      // Start at a scale that fits the view; the Scale tool then sets it properly.
      const m_per_px = (visible.width * 0.8) / img.naturalWidth;
      const centre = { x: visible.x + visible.width / 2, y: visible.y + visible.height / 2 };
      const backdrop: Backdrop = {
        fileId: rec.id,
        opacity: 0.6,
        m_per_px,
        width_px: img.naturalWidth,
        height_px: img.naturalHeight,
        x_m: centre.x - (img.naturalWidth * m_per_px) / 2,
        y_m: centre.y + (img.naturalHeight * m_per_px) / 2,
      };
      editor.store.patchLayout({ backdrop });
      snack.open('Backdrop added. Use the Scale tool to set its scale from two points a known distance apart.', 'OK', { duration: 8000 });
    } catch (err) {
      const msg = err instanceof LayoutApiError ? err.message : 'The image could not be loaded.';
      snack.open(`Backdrop not added: ${msg}`, 'OK', { duration: 10000 });
    }
  }

  setBackdropOpacity(value: number): void {
    const b = this.host.editor.backdrop();
    if (b) this.host.editor.store.patchLayout({ backdrop: { ...b, opacity: value } });
  }

  removeBackdrop(): void {
    this.host.editor.store.patchLayout({ backdrop: undefined });
  }

  /** The Scale tool's two clicks: ask their real distance, then rescale (or cancel). */
  askCalibration(a: Point, b: Point): void {
    const ed = this.host.editor;
    const backdrop = ed.backdrop();
    this.host.dialog
      .open(CalibrateDialog, {
        width: '420px',
        data: { units: this.host.units(), hasBackdrop: !!backdrop, hasNetwork: ed.store.doc.nodes.length > 0, backdropScaled: !!backdrop?.scale },
      })
      .afterClosed()
      .subscribe((answer: { metres: number; network: boolean } | undefined) => {
        if (answer && answer.metres > 0) {
          ed.applyCalibration(a, b, answer.metres, { network: answer.network });
          ed.fitToView();
        } else ed.cancelCalibration();
      });
  }

  async uploadSurvey(input: HTMLInputElement): Promise<void> {
    const file = input.files?.[0];
    input.value = '';
    if (!file) return;
    try {
      const parsed = await firstValueFrom(this.host.api.parseSurvey(this.host.projectId(), file));
      // Geographic points place the plan on the Earth (GeoJSON export, Walk): through the plan's
      // reference when it has one, else the first point becomes the reference's origin.
      const existing = geoReferenceOf(this.host.editor.store.doc.layout);
      const first = parsed.points.find((p) => p.lat !== undefined && p.lon !== undefined);
      const geo = existing ?? (first ? referenceAt(first.lat!, first.lon!, 'gpx') : null);
      const points = existing
        ? parsed.points.flatMap((p) =>
            p.x_m !== undefined && p.y_m !== undefined
              ? [{ label: p.label, x_m: p.x_m, y_m: p.y_m, elevation_m: p.elevation_m }]
              : p.lat !== undefined && p.lon !== undefined
                ? [{ label: p.label, ...toLocal(existing, p.lat, p.lon), elevation_m: p.elevation_m }]
                : [],
          )
        : toLocalPoints(parsed.points);
      this.host.editor.store.patchLayout({ survey: { filename: file.name, format: parsed.format, points }, ...(geo && !existing ? { geo } : {}) });
      this.host.snack.open(`${countOf(points.length, 'survey point')} from ${file.name}. Select an element to apply them.`, 'OK', { duration: 6000 });
    } catch (err) {
      const e = err instanceof LayoutApiError ? err : null;
      const where = e?.line !== undefined && !/\b(line|point)\s+\d+/i.test(e.message) ? ` (line/point ${e.line})` : '';
      this.host.dialog.open(MessagesDialog, { data: { title: 'Survey file not read', messages: [(e?.message ?? 'The file could not be read.') + where] } });
    }
  }

  clearSurvey(): void {
    this.host.editor.store.patchLayout({ survey: undefined });
  }

  /** Site ▸ Elevations from survey: preview every change, then apply them as one undo step. */
  applySurveyElevations(): void {
    const store = this.host.editor.store;
    const changes = surveyElevationChanges(store.doc);
    const u = this.host.units();
    const rows = changes.map((c) => ({
      id: c.id,
      name: c.name,
      now: Number.isNaN(c.from_m) ? 'not set' : formatQuantity('elevation', c.from_m, u),
      next: formatQuantity('elevation', c.to_m, u),
      point: `${c.point || 'unnamed'} (${formatQuantity('length', c.distance_m, u)} away)`,
    }));
    this.host.dialog
      .open(SurveyApplyDialog, { data: { rows }, width: '560px' })
      .afterClosed()
      .subscribe((ok?: boolean) => {
        if (!ok) return;
        store.update('elevations from survey', (d) => withSurveyElevations(d, changes));
        this.host.say(`Elevations from the survey applied to ${countOf(changes.length, 'element')}. Undo puts them back.`);
      });
  }

  snapElevation(id: string): void {
    const store = this.host.editor.store;
    const n = store.node(id);
    const near = n ? nearestSurveyPoint(surveyPointsOf(store.doc), { x: n.x_m ?? 0, y: n.y_m ?? 0 }) : null;
    if (!n || !near) return;
    store.patchElement(id, { elevation_m: near.point.elevation_m, elevation_source: 'survey', elevation_from: near.point.label });
    const u = this.host.units();
    this.host.say(
      `Elevation set to ${formatQuantity('elevation', near.point.elevation_m, u)} from survey point ${near.point.label ?? ''} ` +
        `${formatQuantity('length', near.distance_m, u)} away`,
    );
  }

  profileFromSurvey(id: string): void {
    const store = this.host.editor.store;
    const prof = profileAlong(store.doc, id, surveyPointsOf(store.doc), 10);
    if (!prof) return;
    store.patchElement(id, { profile: prof.profile, length_m: prof.groundLength_m, length_source: 'survey' });
    this.host.say(
      `Profile from ${countOf(prof.used, 'survey point')} within 10 m of the line; length along the ground ${formatQuantity('length', prof.groundLength_m, this.host.units())}`,
    );
  }
}

function loadImage(url: string): Promise<HTMLImageElement> {
  return new Promise((resolve, reject) => {
    const img = new Image();
    img.onload = () => resolve(img);
    img.onerror = () => reject(new Error('image'));
    img.src = url;
  });
}
