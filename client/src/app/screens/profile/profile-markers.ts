import type { NetworkDocument } from '../../../../../engine/network-document';
import { findRoutes, longestSupplyRoute, profileRoute, type ProfileFinding, type Route } from '../../../../../engine/profile';
import type { SteadyResult } from '../../../../../engine/steady';
import type { PlanMarker } from '../layout/canvas/markers';
import { linkPoints } from '../layout/editor/document-store';
import type { Point } from '../layout/editor/geometry';
import type { ProfileEnds } from './profile-selection';

const LABEL: Record<ProfileFinding['kind'], string> = {
  'hgl-below-pipe': 'HGL',
  'over-rating': 'rating',
  'over-working': '72 %',
  'high-point': 'air',
  'low-point': 'drain',
};
const KIND: Record<ProfileFinding['kind'], string> = {
  'hgl-below-pipe': 'flag',
  'over-rating': 'flag',
  'over-working': 'flag',
  'high-point': 'pin',
  'low-point': 'dot',
};

/**
 * The Profile tab's findings as marks on the Layout plan (source 'profile'): each finding sits on
 * its pipe at its distance along the route (the drawn line, bends included, walked in the route's
 * direction). The route is the one chosen on the Profile tab, else the longest supply route.
 *
 * @example
 * screen.markers.set('profile', profileMarkers(doc, results, selection.get(projectId), settings.cover(projectId)))
 */
export function profileMarkers(doc: NetworkDocument, steady: SteadyResult | null, ends: ProfileEnds | undefined, cover_m?: number): PlanMarker[] {
  let route: Route | null;
  try {
    route = ends ? findRoutes(doc, ends.from, ends.to, 1)[0] : longestSupplyRoute(doc);
  } catch {
    route = null;
  }
  if (!route || !steady || Object.keys(steady.nodes).length === 0) return [];
  const profile = profileRoute(doc, route, { steady, cover_m });
  const segments = new Map(profile.segments.map((s) => [s.link, s]));
  const marks = profile.findings.map((f, i): PlanMarker => {
    const seg = segments.get(f.link);
    const link = doc.links.find((l) => l.id === f.link);
    let at: PlanMarker['at'] = { element: f.link };
    if (seg && link && seg.to_m > seg.from_m) {
      const j = route.links.indexOf(f.link);
      const forward = route.nodes[j] === link.from;
      const pts = linkPoints(link, doc);
      const point = along(forward ? pts : [...pts].reverse(), (f.at_m - seg.from_m) / (seg.to_m - seg.from_m));
      if (point) at = { point };
    }
    return { id: `profile-${i}`, at, kind: KIND[f.kind], label: LABEL[f.kind] };
  });
  return mergeSamePlace(marks);
}

/** Findings at the same spot (a low point that is also the worst static pressure) share one mark. */
function mergeSamePlace(marks: PlanMarker[]): PlanMarker[] {
  const out: PlanMarker[] = [];
  for (const m of marks) {
    const same = out.find((o) => 'point' in o.at && 'point' in m.at && Math.hypot(o.at.point.x - m.at.point.x, o.at.point.y - m.at.point.y) < 1);
    if (same) same.label = `${same.label} · ${m.label}`;
    else out.push({ ...m });
  }
  return out;
}

/** The point at `fraction` (0–1) of a polyline's length. */
function along(pts: Point[], fraction: number): Point | null {
  if (pts.length < 2) return pts[0] ?? null;
  const lengths = pts.slice(1).map((p, i) => Math.hypot(p.x - pts[i].x, p.y - pts[i].y));
  let left = Math.min(Math.max(fraction, 0), 1) * lengths.reduce((a, b) => a + b, 0);
  for (let i = 0; i < lengths.length; i++) {
    if (left <= lengths[i] || i === lengths.length - 1) {
      const t = lengths[i] > 0 ? Math.min(left / lengths[i], 1) : 0;
      return { x: pts[i].x + (pts[i + 1].x - pts[i].x) * t, y: pts[i].y + (pts[i + 1].y - pts[i].y) * t };
    }
    left -= lengths[i];
  }
  return null;
}
