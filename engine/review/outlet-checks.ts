/**
 * Outlet checks: pressure against the device's requirement (with margin), delivered against design
 * flow (pressure-driven solve), and static pressure at houses and float valves. Rules in ./rules.
 */
import type { OutletNode } from '../network-document';
import { DELIVERY_SHARE, HIGH_STATIC_PRESSURE_M, OUTLET_MARGIN_SHARE, RULES } from './rules';
import { nameOf, type ReviewContext } from './review-context';
import type { CheckRow, CheckStatus } from './types';

/** Pressure verdict: below `required` fails; under the margin share above it is a caution. */
export function outletPressureStatus(pressure_m: number, required_m: number): CheckStatus {
  if (!(pressure_m >= required_m)) return 'fail';
  return pressure_m < required_m * (1 + OUTLET_MARGIN_SHARE) ? 'caution' : 'pass';
}

/** Delivery verdict: at least 99 % of the design flow passes. */
export function deliveryStatus(delivered_m3s: number, design_m3s: number): CheckStatus {
  return delivered_m3s >= DELIVERY_SHARE * design_m3s ? 'pass' : 'fail';
}

/** The pressure an outlet's device needs, m: its minimum, else a pressure-dependent model's full-demand pressure. */
export function requiredPressure(o: OutletNode): number | undefined {
  if (o.min_pressure_m !== undefined) return o.min_pressure_m;
  return o.demand_model?.type === 'pressure-dependent' ? o.demand_model.required_pressure_m : undefined;
}

export function outletChecks(ctx: ReviewContext): CheckRow[] {
  const rows: CheckRow[] = [];
  for (const node of ctx.doc.nodes) {
    if (node.kind !== 'outlet') continue;
    const base = { group: 'outlets' as const, element: node.id, ...nameOf(node) };
    const r = ctx.result.nodes[node.id];
    const required = requiredPressure(node);
    const rule = RULES['outlet-pressure'];
    if (!r) {
      rows.push({
        ...base,
        key: `${rule.id}:${node.id}`,
        rule: rule.id,
        title: rule.title,
        status: 'fail',
        note: "The network did not solve, so this outlet's pressure is unknown",
        ruleText: rule.text,
        source: rule.source,
      });
    } else if (required === undefined) {
      rows.push({
        ...base,
        key: `${rule.id}:${node.id}`,
        rule: rule.id,
        title: rule.title,
        status: 'caution',
        measured: { value: r.pressure_m, quantity: 'pressure' },
        note: 'No required pressure is set for this device, so its margin cannot be judged',
        ruleText: rule.text,
        source: rule.source,
      });
    } else {
      const status = outletPressureStatus(r.pressure_m, required);
      rows.push({
        ...base,
        key: `${rule.id}:${node.id}`,
        rule: rule.id,
        title: rule.title,
        status,
        measured: { value: r.pressure_m, quantity: 'pressure' },
        limit: { value: required, quantity: 'pressure' },
        margin: { value: r.pressure_m - required, quantity: 'pressure' },
        note:
          status === 'fail'
            ? 'Below what the device needs: it will run weak or not at all'
            : status === 'caution'
              ? "Meets the device's need with little to spare"
              : "Meets the device's need with margin",
        ruleText: rule.text,
        source: rule.source,
      });
    }
    const d = RULES['outlet-delivery'];
    if (r && node.demand_m3s > 0) {
      const status = deliveryStatus(r.demand_m3s, node.demand_m3s);
      rows.push({
        ...base,
        key: `${d.id}:${node.id}`,
        rule: d.id,
        title: d.title,
        status,
        measured: { value: r.demand_m3s, quantity: 'flow' },
        limit: { value: node.demand_m3s, quantity: 'flow' },
        margin: { value: r.demand_m3s - node.demand_m3s, quantity: 'flow' },
        note: status === 'pass' ? 'Delivers its design flow' : 'Delivers less than its design flow at the pressure it gets',
        ruleText: d.text,
        source: d.source,
      });
    }
    const sensitive = node.outlet_type === 'house' || node.float_valve === true;
    const hs = ctx.staticHead.get(node.id);
    const s = RULES['outlet-static-high'];
    if (sensitive && hs !== undefined && Number.isFinite(hs)) {
      const ps = hs - node.elevation_m;
      const status: CheckStatus = ps > HIGH_STATIC_PRESSURE_M ? 'caution' : 'pass';
      rows.push({
        ...base,
        key: `${s.id}:${node.id}`,
        rule: s.id,
        title: s.title,
        status,
        measured: { value: ps, quantity: 'pressure' },
        limit: { value: HIGH_STATIC_PRESSURE_M, quantity: 'pressure' },
        margin: { value: HIGH_STATIC_PRESSURE_M - ps, quantity: 'pressure' },
        note:
          status === 'caution'
            ? 'Fit a pressure-reducing valve ahead of this device; local plumbing code governs'
            : 'Within what the device is usually rated for',
        ruleText: s.text,
        source: s.source,
      });
    }
  }
  return rows;
}
