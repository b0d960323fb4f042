/** Profile checks: each high point wants an air-release valve, each low point a drain (./profile-points). */
import { nameOf, type ReviewContext } from './review-context';
import { profilePoints } from './profile-points';
import { RULES } from './rules';
import type { CheckRow } from './types';

export function profileChecks(ctx: ReviewContext): CheckRow[] {
  return profilePoints(ctx.doc).map((p) => {
    const rule = p.kind === 'high' ? RULES['profile-high-point'] : RULES['profile-low-point'];
    const element = ctx.link.get(p.element) ?? ctx.node.get(p.element);
    const fitting = p.kind === 'high' ? 'an air-release valve' : 'a drain';
    return {
      key: `${rule.id}:${p.element}${p.at_m !== undefined ? `@${p.at_m}` : ''}`, group: 'profile', rule: rule.id, title: rule.title,
      element: p.element, ...nameOf(element), status: p.fitted ? 'pass' : 'caution',
      measured: { value: p.elevation_m, quantity: 'elevation' }, ...(p.at_m !== undefined ? { at_m: p.at_m } : {}),
      note: p.fitted ? `${fitting[0].toUpperCase()}${fitting.slice(1)} serves this ${p.kind} point` : `${p.kind === 'high' ? 'High' : 'Low'} point without ${fitting}${p.kind === 'high' ? ': air gathers here and can block the line' : ': the line cannot be emptied for winter or repairs'}`,
      ruleText: rule.text, source: rule.source,
    };
  });
}
