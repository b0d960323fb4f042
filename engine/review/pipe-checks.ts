/**
 * Pipe checks: velocity, working pressure against the rating and its 72 % working share, static plus
 * Joukowsky surge of a sudden stop against the rating, and the HGL against the pipe along its ground
 * profile. Working pressure is taken at the pipe's lowest point from the larger of the static head
 * (tanks full, no flow) and the steady head at either end (a pumped main runs above static).
 */
import { DEFAULT_COVER_M } from '../checks';
import type { PipeLink } from '../network-document';
import { joukowskyHead } from './joukowsky';
import { lowestPoint, nameOf, type ReviewContext } from './review-context';
import { RULES, VELOCITY_LIMIT_MS, WORKING_SHARE } from './rules';
import type { CheckRow, CheckStatus } from './types';
import { pipeWaveSpeed } from './wave-speed';

export const velocityStatus = (v_ms: number): CheckStatus => (Math.abs(v_ms) <= VELOCITY_LIMIT_MS ? 'pass' : 'caution');
export const ratingStatus = (pressure_m: number, rating_m: number): CheckStatus => (pressure_m <= rating_m ? 'pass' : 'fail');
export const workingShareStatus = (pressure_m: number, rating_m: number): CheckStatus => (pressure_m <= WORKING_SHARE * rating_m ? 'pass' : 'caution');
export const surgeStatus = (static_m: number, surge_m: number, rating_m: number): CheckStatus => (static_m + surge_m <= rating_m ? 'pass' : 'fail');

/**
 * Smallest clearance of the HGL above the pipe (ground less cover) along its profile, m, and where:
 * the HGL runs straight between the end heads (common practice); without a profile, the ends' own pressures.
 */
export function hglClearance(pipe: PipeLink, headFrom: number, headTo: number, elevFrom: number, elevTo: number): { clearance_m: number; at_m: number } {
  let worst = { clearance_m: headFrom - elevFrom, at_m: 0 };
  if (headTo - elevTo < worst.clearance_m) worst = { clearance_m: headTo - elevTo, at_m: pipe.length_m };
  const profile = pipe.profile ?? [];
  if (profile.length === 0) return worst;
  const cover = pipe.cover_m ?? DEFAULT_COVER_M;
  const span = profile[profile.length - 1][0] > 0 ? profile[profile.length - 1][0] : pipe.length_m;
  for (const [dist, ground] of profile) {
    const hgl = headFrom + (headTo - headFrom) * Math.min(Math.max(dist / span, 0), 1);
    const c = hgl - (ground - cover);
    if (c < worst.clearance_m) worst = { clearance_m: c, at_m: dist };
  }
  return worst;
}

export function pipeChecks(ctx: ReviewContext): CheckRow[] {
  const rows: CheckRow[] = [];
  for (const link of ctx.doc.links) {
    if (link.kind !== 'pipe') continue;
    const base = { group: 'pipes' as const, element: link.id, ...nameOf(link) };
    const r = ctx.result.links[link.id];
    const from = ctx.result.nodes[link.from];
    const to = ctx.result.nodes[link.to];
    const row = (ruleId: keyof typeof RULES, status: CheckStatus, rest: Partial<CheckRow> & { note: string }): CheckRow => {
      const rule = RULES[ruleId];
      return { ...base, key: `${rule.id}:${link.id}`, rule: rule.id, title: rule.title, status, ruleText: rule.text, source: rule.source, ...rest };
    };
    const v = r ? Math.abs(r.velocity_ms) : NaN;
    if (r) {
      const status = velocityStatus(v);
      rows.push(
        row('pipe-velocity', status, {
          measured: { value: v, quantity: 'velocity' },
          limit: { value: VELOCITY_LIMIT_MS, quantity: 'velocity' },
          margin: { value: VELOCITY_LIMIT_MS - v, quantity: 'velocity' },
          note: status === 'pass' ? 'Moderate velocity' : 'Fast water: more friction, wear and surge; a size up slows it',
        }),
      );
    }
    const low = lowestPoint(ctx, link);
    const hs = Math.max(ctx.staticHead.get(link.from) ?? -Infinity, ctx.staticHead.get(link.to) ?? -Infinity);
    const running = Math.max(from?.head_m ?? -Infinity, to?.head_m ?? -Infinity);
    const working = Math.max(hs, running) - low.elevation_m;
    const rating = link.rating_m;
    if (rating === undefined) {
      rows.push(
        row('pipe-static-rating', 'caution', {
          measured: Number.isFinite(working) ? { value: working, quantity: 'pressure' } : undefined,
          at_m: low.at_m,
          note: 'No pressure rating is set for this pipe (choose it from the catalogue), so the rating checks cannot be made',
        }),
      );
    } else if (Number.isFinite(working)) {
      const st = ratingStatus(working, rating);
      rows.push(
        row('pipe-static-rating', st, {
          measured: { value: working, quantity: 'pressure' },
          limit: { value: rating, quantity: 'pressure' },
          margin: { value: rating - working, quantity: 'pressure' },
          at_m: low.at_m,
          note:
            st === 'pass'
              ? 'Working pressure at the lowest point is within the rating'
              : "Working pressure at the lowest point is over the pipe's rating: choose a higher class or reduce the pressure",
        }),
      );
      const share = workingShareStatus(working, rating);
      rows.push(
        row('pipe-working-share', share, {
          measured: { value: (100 * working) / rating, quantity: 'percent' },
          limit: { value: 100 * WORKING_SHARE, quantity: 'percent' },
          margin: { value: 100 * (WORKING_SHARE - working / rating), quantity: 'percent' },
          at_m: low.at_m,
          note:
            share === 'pass'
              ? 'Leaves the usual allowance for surge'
              : 'Near its rating at the lowest point: little left for surge; a higher class or a pressure reducer gives room',
        }),
      );
      if (r) {
        const wave = pipeWaveSpeed(link);
        const surge = joukowskyHead(wave.waveSpeed_ms, v);
        const ss = surgeStatus(working, surge, rating);
        rows.push(
          row('pipe-surge', ss, {
            measured: { value: working + surge, quantity: 'pressure' },
            limit: { value: rating, quantity: 'pressure' },
            margin: { value: rating - working - surge, quantity: 'pressure' },
            at_m: low.at_m,
            detail: [
              { label: 'wave speed', amount: { value: wave.waveSpeed_ms, quantity: 'velocity' } },
              { label: 'surge head', amount: { value: surge, quantity: 'head' } },
            ],
            note: `${ss === 'pass' ? 'Stays within the rating' : 'Exceeds the rating: close valves slowly, fit surge relief or choose a higher class'}; wave speed ${wave.basis === 'catalogue' ? "from the pipe's material and dimension ratio" : 'of a rigid pipe (wall unknown), the safe side'}`,
          }),
        );
      }
    }
    if (from && to && r && r.status !== 'closed') {
      const fromElev = ctx.node.get(link.from)?.elevation_m ?? 0;
      const toElev = ctx.node.get(link.to)?.elevation_m ?? 0;
      const h = hglClearance(link, from.head_m, to.head_m, fromElev, toElev);
      const status: CheckStatus = h.clearance_m >= 0 ? 'pass' : 'fail';
      rows.push(
        row('pipe-hgl', status, {
          measured: { value: h.clearance_m, quantity: 'head' },
          limit: { value: 0, quantity: 'head' },
          margin: { value: h.clearance_m, quantity: 'head' },
          at_m: h.at_m,
          note:
            status === 'pass'
              ? `The HGL stays above the pipe${link.profile?.length ? ' along its profile' : ''}`
              : 'The HGL falls below the pipe here: air gathers or the line siphons; lower the line or add head',
        }),
      );
    }
  }
  return rows;
}
