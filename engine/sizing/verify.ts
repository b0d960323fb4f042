import { staticHeads } from '../checks';
import { DEFAULT_VELOCITY_LIMIT_MS } from '../checks';
import { compileNetwork } from '../network-model';
import type { NetworkDocument, PipeLink } from '../network-document';
import type { SteadyResult } from '../steady';
import { DEFAULT_COVER_M } from '../checks';
import { requiredPressure } from './requirements';
import { joukowskyHead } from '../review/joukowsky';
import { pipeWaveSpeed } from '../review/wave-speed';

/**
 * The checks a sized design must pass, read from a real steady solve (../steady) of the design:
 * every tee and outlet at or above its required pressure (./requirements; 1 mm tolerance), every
 * pipe at or below the velocity limit, every pipe's static pressure at or below `ratingFraction`
 * of its rating (as ../checks over-rating), no HGL below a profiled pipe, a converged solve; with
 * `surge`, also static pressure plus the Joukowsky surge of stopping the pipe's solved flow at once
 * (Korteweg wave speed of its material and wall, ../review) within the rating, the review's surge
 * check (NRCS Standard 430: internal pressure including transients below the rating, V2).
 *
 * @example designChecks(doc, solve(doc), {}).failures.length // 0 when the design works
 */

export interface CheckSettings {
  minPressure_m?: number;
  velocityLimit_ms?: number;
  /** Share of the rating static pressure may use (default 1; 0.72 is ASAE S376.1 without surge analysis, V2). */
  ratingFraction?: number;
  /** Also check static + Joukowsky surge of a sudden stop against the rating (default false). */
  surge?: boolean;
}

export interface OutletCheck {
  id: string;
  name?: string;
  pressure_m: number;
  required_m: number;
  margin_m: number;
  passes: boolean;
}

export interface Failure {
  element: string;
  code: string;
  message: string;
}

export interface DesignCheck {
  outlets: OutletCheck[];
  failures: Failure[];
  /** Lowest outlet margin (pressure − required), m. */
  lowestMargin_m: number;
  /** Highest pipe velocity, m/s, and where. */
  worstVelocity: { pipe: string; velocity_ms: number } | null;
  /** Highest static pressure as a share of the pipe's rating, and where. */
  worstRating: { pipe: string; static_m: number; rating_m: number; share: number } | null;
}

const r2 = (v: number): number => Math.round(v * 100) / 100;

/** Static pressure on each pipe (highest connected fixed head minus its lowest point), m. */
export function pipeStaticPressures(doc: NetworkDocument): Map<string, number> {
  const model = compileNetwork(doc);
  const heads = staticHeads(model, { closed: model.closedInDocument });
  const out = new Map<string, number>();
  doc.links.forEach((link, k) => {
    if (link.kind !== 'pipe') return;
    const f = model.from[k];
    const t = model.to[k];
    let lowest = Math.min(model.elevation[f], model.elevation[t]);
    const cover = link.cover_m ?? DEFAULT_COVER_M;
    for (const [, g] of link.profile ?? []) lowest = Math.min(lowest, g - cover);
    const hs = Math.max(heads[f], heads[t]);
    if (Number.isFinite(hs)) out.set(link.id, hs - lowest);
  });
  return out;
}

/** Check a design against its solve; `only` restricts to those element ids (a region). */
export function designChecks(
  doc: NetworkDocument,
  result: SteadyResult,
  s: CheckSettings,
  only?: Set<string>,
  statics: Map<string, number> = pipeStaticPressures(doc),
): DesignCheck {
  const failures: Failure[] = [];
  const outlets: OutletCheck[] = [];
  const limit = s.velocityLimit_ms ?? DEFAULT_VELOCITY_LIMIT_MS;
  const share = s.ratingFraction ?? 1;
  if (!result.converged) failures.push({ element: '', code: 'not-converged', message: 'the hydraulic solve did not converge' });
  let lowestMargin = Infinity;
  for (const node of doc.nodes) {
    if (node.kind !== 'tee' && node.kind !== 'outlet') continue;
    if (only && !only.has(node.id)) continue;
    const r = result.nodes[node.id];
    if (!r) continue;
    const required = requiredPressure(node, s.minPressure_m);
    const margin = r.pressure_m - required;
    const passes = margin >= -1e-3;
    if (node.kind === 'outlet' || required > 0) lowestMargin = Math.min(lowestMargin, margin);
    if (node.kind === 'outlet') outlets.push({ id: node.id, name: node.name, pressure_m: r.pressure_m, required_m: required, margin_m: margin, passes });
    if (!passes)
      failures.push({
        element: node.id,
        code: 'below-required',
        message: `${node.id}: pressure ${r2(r.pressure_m)} m is below the ${r2(required)} m it needs`,
      });
  }
  let worstVelocity: DesignCheck['worstVelocity'] = null;
  let worstRating: DesignCheck['worstRating'] = null;
  for (const link of doc.links) {
    if (link.kind !== 'pipe' || (only && !only.has(link.id))) continue;
    const r = result.links[link.id];
    if (!r) continue;
    const v = Math.abs(r.velocity_ms);
    if (!worstVelocity || v > worstVelocity.velocity_ms) worstVelocity = { pipe: link.id, velocity_ms: v };
    if (v > limit + 1e-9) failures.push({ element: link.id, code: 'velocity-high', message: `${link.id}: velocity ${r2(v)} m/s is above ${r2(limit)} m/s` });
    const ps = statics.get(link.id);
    const pipe = link as PipeLink;
    if (ps !== undefined && pipe.rating_m !== undefined) {
      const sh = ps / pipe.rating_m;
      if (!worstRating || sh > worstRating.share) worstRating = { pipe: link.id, static_m: ps, rating_m: pipe.rating_m, share: sh };
      if (ps > share * pipe.rating_m + 1e-9)
        failures.push({
          element: link.id,
          code: 'over-rating',
          message: `${link.id}: static pressure ${r2(ps)} m is above ${share === 1 ? '' : `${Math.round(share * 100)} % of `}its rating ${r2(pipe.rating_m)} m`,
        });
      if (s.surge) {
        const surge = joukowskyHead(pipeWaveSpeed(pipe).waveSpeed_ms, v);
        if (ps + surge > pipe.rating_m + 1e-9)
          failures.push({
            element: link.id,
            code: 'surge-over-rating',
            message: `${link.id}: static pressure ${r2(ps)} m plus the surge of a sudden stop ${r2(surge)} m is above its rating ${r2(pipe.rating_m)} m`,
          });
      }
    }
  }
  for (const w of result.warnings) {
    const at = w.element ?? '';
    if (w.code === 'negative-pressure' && doc.links.some((l) => l.id === at) && (!only || only.has(at)))
      failures.push({ element: at, code: w.code, message: w.message });
  }
  return { outlets, failures, lowestMargin_m: lowestMargin, worstVelocity, worstRating };
}
