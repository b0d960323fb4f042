import type { NetworkLink, NetworkNode, OutletNode, PumpLink } from '../../../../../../engine/network-document';
import { dripTapeFlow, dripTapeProblem } from '../../../../../../engine/drip-tape/index';
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
    key: 'refill_m3',
    label: 'Refills',
    type: 'number',
    quantity: 'volume',
    min: 0.001,
    max: 100,
    testid: 'prop-refill-volume',
    when: isType('trough'),
    hint: 'Water the float valve lets in after the stock drink it down',
    write: (e, v) => {
      const o = asOutlet(e);
      const secs = refillSeconds(o) ?? 30 * 60;
      return v === undefined ? { refill_m3: undefined } : { refill_m3: v, demand_m3s: v / secs };
    },
  },
  {
    key: 'refill_minutes',
    label: 'in',
    type: 'number',
    suffix: 'min',
    min: 0.5,
    max: 24 * 60,
    testid: 'prop-refill-minutes',
    when: isType('trough'),
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

type Tape = NonNullable<OutletNode['drip_tape']>;
const isDrip = isType('drip-zone');
const byTape = (e: NetworkNode | NetworkLink) => isDrip(e) && !!asOutlet(e).drip_tape;
const byCount = (e: NetworkNode | NetworkLink) => isDrip(e) && !asOutlet(e).drip_tape;
/** 1.6 L/h, a common small dripper (trade practice, from memory), when nothing says otherwise. */
const DEFAULT_EMITTER_M3S = 1.6e-3 / 3600;

/** Each emitter's flow: the zone's flow shared over its emitters, or over the tape at its spacing. */
function emitterFlow(o: OutletNode): number | undefined {
  const t = o.drip_tape;
  if (t) return (o.demand_m3s * t.spacing_m) / (t.rows * t.row_length_m);
  return o.emitters ? o.demand_m3s / o.emitters : undefined;
}

/** The tape's emitters and design flow (engine/drip-tape) for a changed tape or emitter flow. */
function tapePatch(o: OutletNode, tape: Tape, each = emitterFlow(o) ?? DEFAULT_EMITTER_M3S): Record<string, unknown> {
  const input = { ...tape, emitter_flow_m3s: each };
  if (dripTapeProblem(input)) return { drip_tape: tape };
  const r = dripTapeFlow(input);
  return { drip_tape: tape, emitters: r.emitters, demand_m3s: r.flow_m3s };
}

function tapeField(key: keyof Tape, spec: Omit<FieldSpec, 'key' | 'type'> & { type?: FieldSpec['type'] }): FieldSpec {
  return {
    type: 'number',
    ...spec,
    key: `drip_tape.${key}`,
    when: byTape,
    write: (e, v) => {
      const o = asOutlet(e);
      return v === undefined || !o.drip_tape ? {} : tapePatch(o, { ...o.drip_tape, [key]: key === 'rows' ? Math.round(v) : v });
    },
  };
}

/**
 * A drip zone: "N emitters × X L/h at Y kPa", or laid as tape, "rows × row length at a spacing,
 * X L/h each" (engine/drip-tape); either sets its design flow and the pressure it needs Y.
 */
export const dripFields: FieldSpec[] = [
  {
    key: 'drip_entry',
    label: 'Described as',
    type: 'select',
    testid: 'prop-drip-entry',
    when: isDrip,
    fallback: 'emitters',
    options: [
      { value: 'emitters', label: 'A count of emitters' },
      { value: 'tape', label: 'Rows of drip tape' },
    ],
    read: (e) => (asOutlet(e).drip_tape ? 'tape' : 'emitters'),
    choose: (e, value) => {
      const o = asOutlet(e);
      if (value !== 'tape') return o.drip_tape ? { drip_tape: undefined } : {};
      if (o.drip_tape) return {};
      // One row as long as the emitters already there at 30 cm: the zone keeps its flow until edited.
      const spacing = 0.3;
      return tapePatch(o, { rows: 1, row_length_m: Math.max(1, (o.emitters ?? 10) * spacing), spacing_m: spacing });
    },
  },
  tapeField('rows', { label: 'Rows of tape', suffix: 'rows', min: 1, max: 10000, testid: 'prop-tape-rows' }),
  tapeField('row_length_m', { label: 'each', quantity: 'length', min: 0.1, max: 100000, testid: 'prop-tape-row-length' }),
  tapeField('spacing_m', { label: 'Emitters every', quantity: 'diameter', min: 0.02, max: 10, testid: 'prop-tape-spacing' }),
  {
    key: 'emitters',
    label: 'Emitters',
    type: 'number',
    suffix: 'emitters',
    min: 1,
    max: 100000,
    testid: 'prop-emitters',
    when: byCount,
    write: (e, n) => {
      const o = asOutlet(e);
      if (n === undefined) return { emitters: undefined };
      const each = o.emitters ? o.demand_m3s / o.emitters : 2 / 3.6e6;
      return { emitters: Math.round(n), demand_m3s: Math.round(n) * each };
    },
  },
  {
    key: 'emitter_flow',
    label: '× each',
    type: 'number',
    quantity: 'emitter-flow',
    min: 1e-8,
    max: 1e-3,
    testid: 'prop-emitter-flow',
    when: isDrip,
    labelFor: (e) => (byTape(e) ? 'Each emitter gives' : '× each'),
    hintFor: (e) => {
      const t = asOutlet(e).drip_tape;
      return t ? `${Math.round((t.rows * t.row_length_m) / t.spacing_m).toLocaleString('en')} emitters in the zone` : undefined;
    },
    read: (e) => emitterFlow(asOutlet(e)),
    write: (e, q) => {
      const o = asOutlet(e);
      if (q === undefined) return {};
      if (o.drip_tape) return tapePatch(o, o.drip_tape, q);
      return !o.emitters ? {} : { demand_m3s: o.emitters * q };
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
    key: 'sun_hours',
    label: 'Sun hours',
    type: 'number',
    suffix: 'h/day',
    min: 0.5,
    max: 24,
    testid: 'prop-sun-hours',
    hint: 'Full-sun hours a day at the site; the daylight curve below follows',
    read: (e) => sunHours((e as PumpLink).schedule),
    write: (e, h) =>
      h === undefined ? {} : { schedule: curveForSunHours((e as PumpLink).schedule?.some((v) => v > 0) ? (e as PumpLink).schedule! : shape, h) },
  };
}
