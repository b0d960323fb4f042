import type { ProfilePoint, ProfileSegment } from './profile-line';

/**
 * Findings along a route's profile, each with the caution shown to the user and the published
 * rule it comes from (REFERENCES.md, "Review criteria"):
 * - hgl-below-pipe: the HGL at design flow under the pipe (suction: air-lock, siphon, negative
 *   pressure); the stretch is found by linear interpolation between profile points;
 * - over-rating: static pressure (tanks full, no flow) above the pipe's rating (NRCS Standard 430, V2);
 * - over-working: static pressure above the working share of the rating, 72 % (ASAE S376.1, V2);
 * - high-point / low-point: turning points of the pipe line that rise or fall by at least
 *   min_relief_m on both sides (air-release valve / drain; NRCS WA Eng. Tech. Note 16, V2).
 *   The relief filter is ours, so survey noise does not mark every bump.
 *
 * @example
 * profileFindings(points, segments, { working_share: 0.72, min_relief_m: 0.3 })
 */

export type FindingKind = 'hgl-below-pipe' | 'over-rating' | 'over-working' | 'high-point' | 'low-point';

export interface ProfileFinding {
  kind: FindingKind;
  /** Stretch along the route, m (from = to for a point finding). */
  from_m: number;
  to_m: number;
  /** Where the finding is worst (or the point itself), m from the route's start. */
  at_m: number;
  /** Pipe it lies on. */
  link: string;
  /** Elevation of the pipe at at_m, m. */
  elevation_m: number;
  /** Worst value: HGL deficit (m) for hgl-below-pipe, static pressure (m of water) for the rating findings. */
  value_m?: number;
  /** The limit crossed, m of water (rating, or share × rating). */
  limit_m?: number;
  caution: string;
  source: string;
  /** High and low points: an air valve (drain) within reach is already in the document. */
  fitted?: boolean;
}

/** Working share of a pipe's rating when surge is not analysed (ASAE S376.1, V2). */
export const WORKING_SHARE = 0.72;

const AIR_SOURCE = 'NRCS Washington Eng. Tech. Note 16 (2009); NRCS Missouri, Watering Systems for Serious Graziers (V2)';
export const FINDING_TEXT: Record<FindingKind, { caution: string; source: string }> = {
  'hgl-below-pipe': {
    caution:
      'The hydraulic grade line is below the pipe: the water here is under suction. Air gathers and the line can air-lock or siphon, and dirty water can be drawn in at a leak. Lower the pipe, enlarge it upstream or feed this stretch from higher storage; an air valve here would let air in.',
    source: `HGL above the pipe at design flow: common practice (hydraulics texts); air at high points: ${AIR_SOURCE}`,
  },
  'over-rating': {
    caution:
      "Static pressure (tanks full, no flow) is above the pipe's pressure rating: the pipe can burst when the line is shut off. Use a higher pressure class, or a pressure-reducing valve or break tank upstream, and have the design checked against local codes.",
    source: 'NRCS Conservation Practice Standard 430: internal pressure including transients below the rating (V2)',
  },
  'over-working': {
    caution:
      "Static pressure is above 72 % of the pipe's rating: without a surge analysis that leaves too little room for water hammer from a closing valve or float. Use the next pressure class or reduce the pressure.",
    source: 'ASAE S376.1 as quoted by the Missouri Livestock Watering Systems Handbook ch. 5 (1997), V2; some NRCS state guidance uses 70 % (M)',
  },
  'high-point': {
    caution: 'High point: air gathers here and can block the flow. Fit an air-release (air-vacuum) valve at this point.',
    source: AIR_SOURCE,
  },
  'low-point': {
    caution: 'Low point: fit a drain so the line can be emptied for repair and before frost; sediment settles here too.',
    source: `${AIR_SOURCE}; seasonal lines drained in autumn (Alberta, V2)`,
  },
};

export interface FindingOptions {
  working_share: number;
  min_relief_m: number;
}

export function profileFindings(points: ProfilePoint[], segments: ProfileSegment[], options: FindingOptions): ProfileFinding[] {
  const out: ProfileFinding[] = [];
  for (const seg of segments) {
    if (seg.kind !== 'pipe') continue;
    const pts = points.filter((p) => p.link === seg.link);
    stretches(
      out,
      pts,
      seg.link,
      'hgl-below-pipe',
      (p) => p.pipe_m - p.hgl_m,
      () => undefined,
    );
    if (seg.rating_m !== undefined) {
      const rating = seg.rating_m;
      stretches(
        out,
        pts,
        seg.link,
        'over-rating',
        (p) => p.static_m - p.pipe_m - rating,
        () => rating,
      );
      stretches(
        out,
        pts,
        seg.link,
        'over-working',
        (p) => p.static_m - p.pipe_m - options.working_share * rating,
        () => options.working_share * rating,
      );
    }
  }
  turningPoints(out, points, options.min_relief_m);
  return out.sort((a, b) => a.at_m - b.at_m);
}

/** Stretches where excess(p) > 0, with crossings interpolated; the worst point carries the value. */
function stretches(
  out: ProfileFinding[],
  pts: ProfilePoint[],
  link: string,
  kind: FindingKind,
  excess: (p: ProfilePoint) => number,
  limit: () => number | undefined,
): void {
  let open: ProfileFinding | null = null;
  let worst = -Infinity;
  const close = (): void => {
    if (open) out.push(open);
    open = null;
    worst = -Infinity;
  };
  for (let i = 0; i < pts.length; i++) {
    const p = pts[i];
    const e = excess(p);
    if (!Number.isFinite(e)) {
      close();
      continue;
    }
    const prev = i > 0 ? pts[i - 1] : null;
    const ePrev = prev ? excess(prev) : Number.NaN;
    if (e > 1e-9) {
      if (!open) {
        const start = prev && Number.isFinite(ePrev) && ePrev <= 1e-9 ? cross(prev.distance_m, ePrev, p.distance_m, e) : p.distance_m;
        open = { kind, from_m: start, to_m: p.distance_m, at_m: p.distance_m, link, elevation_m: p.pipe_m, limit_m: limit(), ...FINDING_TEXT[kind] };
      }
      open.to_m = p.distance_m;
      if (e > worst) {
        worst = e;
        open.at_m = p.distance_m;
        open.elevation_m = p.pipe_m;
        open.value_m = kind === 'hgl-below-pipe' ? e : p.static_m - p.pipe_m;
      }
    } else if (open) {
      if (prev && Number.isFinite(ePrev)) open.to_m = cross(prev.distance_m, ePrev, p.distance_m, e);
      close();
    }
  }
  close();
}

function cross(d0: number, e0: number, d1: number, e1: number): number {
  return e0 === e1 ? d0 : d0 + ((d1 - d0) * e0) / (e0 - e1);
}

/** High and low points of the pipe line by a zig-zag with hysteresis min_relief_m (route ends excluded). */
function turningPoints(out: ProfileFinding[], points: ProfilePoint[], relief: number): void {
  if (points.length < 3) return;
  let dir = 0;
  const ref = 0;
  let ext = 0;
  const record = (i: number, kind: 'high-point' | 'low-point'): void => {
    const p = points[i];
    out.push({ kind, from_m: p.distance_m, to_m: p.distance_m, at_m: p.distance_m, link: p.link, elevation_m: p.pipe_m, ...FINDING_TEXT[kind] });
  };
  for (let i = 1; i < points.length; i++) {
    const v = points[i].pipe_m;
    if (dir === 0) {
      if (v >= points[ref].pipe_m + relief) {
        dir = 1;
        ext = i;
      } else if (v <= points[ref].pipe_m - relief) {
        dir = -1;
        ext = i;
      }
    } else if (dir === 1) {
      if (v > points[ext].pipe_m) ext = i;
      else if (v <= points[ext].pipe_m - relief) {
        record(ext, 'high-point');
        dir = -1;
        ext = i;
      }
    } else {
      if (v < points[ext].pipe_m) ext = i;
      else if (v >= points[ext].pipe_m + relief) {
        record(ext, 'low-point');
        dir = 1;
        ext = i;
      }
    }
  }
}

/** Caution text once the fitting is in the document. */
export const FITTED_TEXT: Record<'high-point' | 'low-point', string> = {
  'high-point': 'High point: an air-release valve is fitted here. Check it is an air-vacuum type where the line drains.',
  'low-point': 'Low point: a drain is fitted here.',
};
