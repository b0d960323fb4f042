/**
 * A pump's head–flow curve fitted through the points a designer reads off the maker's chart:
 * least squares (ml-matrix `solve`, QR for an over-determined system) for
 *   H(Q) = c0 + c1·Q + c2·Q²   (three or more points), or
 *   H(Q) = c0 + c2·Q²          (two points: shut-off head and the fall with flow),
 * the usual quadratic form of a centrifugal pump's characteristic (common practice; Karassik, Pump
 * Handbook, from memory). SI inside: Q in m³/s, H in m. The engine solves with the fitted curve
 * sampled at `CURVE_SAMPLES` flows from zero to run-out (its curve table interpolates between them).
 *
 * @example fitPumpCurve([[0, 60], [0.0005, 52], [0.001, 30]]).shutoff_m // 60
 */
import { Matrix, solve } from 'ml-matrix';

export interface PumpCurveFit {
  /** Coefficients of H = c0 + c1·Q + c2·Q². */
  c: [number, number, number];
  shutoff_m: number;
  /** Flow where the fitted head falls to zero, m³/s (Infinity when it never does). */
  runout_m3s: number;
  /** Root-mean-square difference between the typed heads and the fit, m. */
  rms_m: number;
  /** Largest |typed − fitted| head, m. */
  worst_m: number;
  /** The fit sampled for the engine: [[flow_m3s, head_m], …] from 0 to run-out. */
  samples: [number, number][];
  /** Plain-words problems ("head rises with flow…"); empty when the curve is usable. */
  problems: string[];
}

export const CURVE_SAMPLES = 7;

export function fitPumpCurve(points: readonly (readonly [number, number])[]): PumpCurveFit {
  const pts = points.filter(([q, h]) => Number.isFinite(q) && Number.isFinite(h) && q >= 0);
  const problems: string[] = [];
  if (pts.length < 2) throw new Error('a curve needs at least two points (flow, head)');
  const quadOnly = pts.length === 2;
  const A = new Matrix(pts.map(([q]) => (quadOnly ? [1, q * q] : [1, q, q * q])));
  const b = Matrix.columnVector(pts.map(([, h]) => h));
  const x = solve(A, b).to1DArray();
  const c: [number, number, number] = quadOnly ? [x[0], 0, x[1]] : [x[0], x[1], x[2]];
  const head = (q: number) => c[0] + c[1] * q + c[2] * q * q;
  const errs = pts.map(([q, h]) => h - head(q));
  const rms_m = Math.sqrt(errs.reduce((s, e) => s + e * e, 0) / errs.length);
  const worst_m = Math.max(...errs.map(Math.abs));
  const runout_m3s = runout(c);
  const qMax = Math.max(...pts.map(([q]) => q));
  if (!(c[0] > 0)) problems.push('the fitted shut-off head is not above zero: check the points');
  // Head must fall as flow rises over the typed range, or the pump has no stable duty point.
  const rising = [0.25, 0.5, 0.75, 1].some((f) => c[1] + 2 * c[2] * f * qMax > 1e-9);
  if (rising) problems.push('head rises with flow somewhere in the typed range: a pump curve falls as flow rises');
  const qEnd = Number.isFinite(runout_m3s) ? runout_m3s : qMax * 1.5;
  const samples: [number, number][] = [];
  for (let i = 0; i < CURVE_SAMPLES; i++) {
    const q = (qEnd * i) / (CURVE_SAMPLES - 1);
    samples.push([q, Math.max(0, head(q))]);
  }
  return { c, shutoff_m: c[0], runout_m3s, rms_m, worst_m, samples, problems };
}

/** Smallest positive flow where c0 + c1·Q + c2·Q² = 0. */
function runout([c0, c1, c2]: [number, number, number]): number {
  if (Math.abs(c2) < 1e-12) return c1 < 0 ? -c0 / c1 : Infinity;
  const disc = c1 * c1 - 4 * c2 * c0;
  if (disc < 0) return Infinity;
  const r = [(-c1 + Math.sqrt(disc)) / (2 * c2), (-c1 - Math.sqrt(disc)) / (2 * c2)].filter((q) => q > 0);
  return r.length ? Math.min(...r) : Infinity;
}
