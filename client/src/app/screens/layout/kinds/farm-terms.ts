import type { NetworkLink, NetworkNode, OutletNode, PumpLink } from '../../../../../../engine/network-document';
import type { FieldSpec } from './kind-types';

/**
 * Properties in the farm's words over the stored physics. The document keeps its physical fields
 * (demand_m3s, min_pressure_m, schedule…); a few editor-only helpers are stored beside them so the
 * words read back the same (`refill_m3` on a trough, `emitters` on a drip zone), and the engine
 * ignores them. Each helper field writes the physical fields it stands for.
 */

/** The drip and trough fields show only on outlets (`when`), so the element is one. */
const asOutlet = (e: NetworkNode | NetworkLink) => e as OutletNode;
const isType = (t: string) => (e: NetworkNode | NetworkLink) => asOutlet(e).outlet_type === t;

/** Seconds a trough takes to refill at its design flow (its float valve open). */
function refillSeconds(o: OutletNode): number | undefined {
  return o.refill_m3 && o.demand_m3s > 0 ? o.refill_m3 / o.demand_m3s : undefined;
}

/** A trough: "refill N gal in M min with a float valve" sets its design flow N / M. */
export const troughFields: FieldSpec[] = [
  {
    key: 'refill_m3', label: 'Refills', type: 'number', quantity: 'volume', min: 0.001, max: 100, testid: 'prop-refill-volume', when: isType('trough'),
    hint: 'Water the float valve lets in after the stock drink it down',
    write: (e, v) => {
      const o = asOutlet(e);
      const secs = refillSeconds(o) ?? 30 * 60;
      return v === undefined ? { refill_m3: undefined } : { refill_m3: v, demand_m3s: v / secs };
    },
  },
  {
    key: 'refill_minutes', label: 'in', type: 'number', suffix: 'min', min: 0.5, max: 24 * 60, testid: 'prop-refill-minutes', when: isType('trough'),
    read: (e) => {
      const secs = refillSeconds(asOutlet(e));
      return secs === undefined ? undefined : secs / 60;
    },
    write: (e, minutes) => {
      const o = asOutlet(e);
      if (minutes === undefined || !o.refill_m3) return {};
      return { demand_m3s: o.refill_m3 / (minutes * 60) };
    },
  },
];

/** A drip zone: "N emitters × X L/h at Y kPa" sets its design flow N·X and the pressure it needs Y. */
export const dripFields: FieldSpec[] = [
  {
    key: 'emitters', label: 'Emitters', type: 'number', suffix: 'emitters', min: 1, max: 100000, testid: 'prop-emitters', when: isType('drip-zone'),
    write: (e, n) => {
      const o = asOutlet(e);
      if (n === undefined) return { emitters: undefined };
      const each = o.emitters ? o.demand_m3s / o.emitters : 2 / 3.6e6;
      return { emitters: Math.round(n), demand_m3s: Math.round(n) * each };
    },
  },
  {
    key: 'emitter_flow', label: '× each', type: 'number', quantity: 'emitter-flow', min: 1e-8, max: 1e-3, testid: 'prop-emitter-flow', when: isType('drip-zone'),
    read: (e) => {
      const o = asOutlet(e);
      return o.emitters ? o.demand_m3s / o.emitters : undefined;
    },
    write: (e, q) => {
      const o = asOutlet(e);
      return q === undefined || !o.emitters ? {} : { demand_m3s: o.emitters * q };
    },
  },
];

/** Full-sun-equivalent hours of a daylight curve: the sum of its 24 hourly shares. */
export function sunHours(schedule: readonly number[] | undefined): number | undefined {
  return schedule?.length === 24 ? schedule.reduce((a, b) => a + b, 0) : undefined;
}

/**
 * The curve's shape stretched or squeezed so its shares add up to `hours` (no hour above full
 * sun). Scaling the shares, then capping at 1 and spreading what the cap cut over the hours
 * still below 1, keeps the morning and evening ramps.
 */
export function curveForSunHours(shape: readonly number[], hours: number): number[] {
  const total = shape.reduce((a, b) => a + b, 0);
  if (!(total > 0)) return [...shape];
  let out = shape.map((v) => (v * hours) / total);
  for (let pass = 0; pass < 24; pass++) {
    const over = out.reduce((a, v) => a + Math.max(0, v - 1), 0);
    out = out.map((v) => Math.min(1, v));
    if (over < 1e-9) break;
    const room = out.reduce((a, v) => a + (v > 0 && v < 1 ? v : 0), 0);
    if (room <= 0) break;
    out = out.map((v) => (v > 0 && v < 1 ? v + (over * v) / room : v));
  }
  return out.map((v) => Math.round(v * 1000) / 1000);
}

/** A solar pump's sun hours: typed hours reshape its daylight curve. */
export function sunHoursField(shape: readonly number[]): FieldSpec {
  return {
    key: 'sun_hours', label: 'Sun hours', type: 'number', suffix: 'h/day', min: 0.5, max: 24, testid: 'prop-sun-hours',
    hint: 'Full-sun hours a day at the site; the daylight curve below follows',
    read: (e) => sunHours((e as PumpLink).schedule),
    write: (e, h) => (h === undefined ? {} : { schedule: curveForSunHours((e as PumpLink).schedule?.some((v) => v > 0) ? (e as PumpLink).schedule! : shape, h) }),
  };
}
