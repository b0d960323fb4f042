/**
 * Safety cautions that apply to this design, each deferring to local codes and licensed practice:
 * pressure at the bottom of long drops, heavy tanks, drinking and stock water on one line, trenching
 * and freezing. They are cautions by nature: the review cannot see the site.
 */
import { lowestPoint, nameOf, type ReviewContext } from './review-context';
import { DROP_CAUTION_PRESSURE_M, RULES, type RuleId } from './rules';
import type { CheckRow } from './types';

const DEFER = 'Local codes and a licensed professional govern.';

export function safetyChecks(ctx: ReviewContext): CheckRow[] {
  const rows: CheckRow[] = [];
  const row = (id: RuleId, element: string | null, rest: Partial<CheckRow> & { note: string }): CheckRow => {
    const rule = RULES[id];
    return {
      key: element ? `${rule.id}:${element}` : rule.id,
      group: 'safety',
      rule: rule.id,
      title: rule.title,
      element,
      status: 'caution',
      ruleText: rule.text,
      source: rule.source,
      ...rest,
    };
  };
  const pipes = ctx.doc.links.filter((l) => l.kind === 'pipe');
  // The pipe with the highest static pressure stands for the drop.
  let worst: { id: string; p: number; at_m: number } | null = null;
  for (const p of pipes) {
    const hs = Math.max(ctx.staticHead.get(p.from) ?? -Infinity, ctx.staticHead.get(p.to) ?? -Infinity);
    const low = lowestPoint(ctx, p);
    const ps = hs - low.elevation_m;
    if (Number.isFinite(ps) && (!worst || ps > worst.p)) worst = { id: p.id, p: ps, at_m: low.at_m };
  }
  if (worst && worst.p > DROP_CAUTION_PRESSURE_M) {
    rows.push(
      row('safety-drop-pressure', worst.id, {
        ...nameOf(ctx.link.get(worst.id)),
        measured: { value: worst.p, quantity: 'pressure' },
        limit: { value: DROP_CAUTION_PRESSURE_M, quantity: 'pressure' },
        at_m: worst.at_m,
        note: `The bottom of the drop sees high static pressure: a burst here sprays hard and undermines the trench. Pipe class, thrust restraint and any pressure reducer need checking on site. ${DEFER}`,
      }),
    );
  }
  for (const t of ctx.doc.nodes) {
    if (t.kind !== 'tank') continue;
    const full = (Math.PI / 4) * t.diameter_m ** 2 * t.max_level_m;
    rows.push(
      row('safety-tank-stand', t.id, {
        ...nameOf(t),
        measured: { value: full, quantity: 'volume' },
        note: `Full, this tank holds its volume in water (1 t per m³, 8.3 lb per gallon) on its base. ${DEFER}`,
      }),
    );
  }
  const house = ctx.doc.nodes.some((n) => n.kind === 'outlet' && n.outlet_type === 'house');
  const stock = ctx.doc.nodes.some((n) => n.kind === 'outlet' && (n.outlet_type === 'trough' || n.float_valve));
  if (house && stock) {
    rows.push(
      row('safety-backflow', null, {
        note: `The house and the stock troughs draw from the same line: a backflow preventer on the house service keeps trough water out of drinking water. ${DEFER}`,
      }),
    );
  }
  if (pipes.length) {
    rows.push(
      row('safety-trenching', null, {
        note: `Buried lines mean trenches: locate buried services first and never work in an unsupported deep trench. ${DEFER}`,
      }),
    );
    rows.push(row('safety-freezing', null, { note: `Lines that freeze split: bury below frost depth or drain seasonal lines before winter. ${DEFER}` }));
  }
  return rows;
}
