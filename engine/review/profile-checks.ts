/**
 * Profile checks: each high point wants an air-release valve, each low point a drain. The points
 * come from engine/profile (networkTurningPoints: the Profile screen's own turning points along the
 * supply routes, with the document's fittings), so the review and the Profile agree.
 */
import { networkTurningPoints } from '../profile/network-points';
import { nameOf, type ReviewContext } from './review-context';
import { RULES } from './rules';
import type { CheckRow } from './types';

export function profileChecks(ctx: ReviewContext): CheckRow[] {
  return networkTurningPoints(ctx.doc, ctx.result).map((p) => {
    const high = p.kind === 'high-point';
    const rule = high ? RULES['profile-high-point'] : RULES['profile-low-point'];
    const id = p.node ?? p.link;
    const element = ctx.link.get(id) ?? ctx.node.get(id);
    const fitting = high ? 'an air-release valve' : 'a drain';
    const word = high ? 'high' : 'low';
    return {
      key: `${rule.id}:${id}${p.node ? '' : `@${p.along_m}`}`,
      group: 'profile',
      rule: rule.id,
      title: rule.title,
      element: id,
      ...nameOf(element),
      status: p.fitted ? 'pass' : 'caution',
      measured: { value: p.elevation_m, quantity: 'elevation' },
      ...(p.node ? {} : { at_m: p.along_m }),
      note: p.fitted
        ? `${fitting[0].toUpperCase()}${fitting.slice(1)} serves this ${word} point`
        : `${high ? 'High' : 'Low'} point without ${fitting}${high ? ': air gathers here and can block the line' : ': the line cannot be emptied for winter or repairs'}`,
      ruleText: rule.text,
      source: rule.source,
    };
  });
}
