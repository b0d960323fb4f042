import type { PumpLink } from '../../../../../../engine/network-document';
import { sunHoursField } from './farm-terms';
import { DefaultTable, INK, LinkKindDef, nameField, notesField, PAPER, ShapeSpec, siDefaults } from './kind-types';

/** A new pump: a small solar fill pump's delivered flow, round in each system. */
export const PUMP_DEFAULTS: DefaultTable<'flow_m3s'> = {
  us: { flow_m3s: ['flow', 3] },
  si: { flow_m3s: ['flow', 0.2] },
};

/**
 * Hourly availability of a solar pump on a clear day: off at night, ramping up through the
 * morning, full from 10:00 to 14:59. Our own rounded approximation, about 8.7 full-sun-equivalent
 * hours (trade practice often sizes solar pumps on 5–6 peak-sun hours — from memory); adjust to the site.
 */
export const DAYLIGHT_SCHEDULE: readonly number[] = [0, 0, 0, 0, 0, 0, 0.1, 0.3, 0.6, 0.85, 1, 1, 1, 1, 1, 0.85, 0.6, 0.3, 0.1, 0, 0, 0, 0, 0];

/**
 * Pump, drawn from farm hardware: a pump housing on the line with its discharge stub downstream;
 * a pump that runs by daylight (a schedule) wears a small sun above it, a solar pump.
 */
function body(p: PumpLink): ShapeSpec[] {
  const shapes: ShapeSpec[] = [
    { t: 'rect', x: 8, y: -3.5, w: 6, h: 7, fill: INK },
    { t: 'rect', x: -10, y: -8, w: 19, h: 16, fill: PAPER, stroke: INK, sw: 2, corner: 4 },
    { t: 'circle', x: -0.5, r: 4.5, fill: PAPER, stroke: INK, sw: 1.5 },
    { t: 'poly', points: [-0.5, -4.5, -0.5, 4.5], stroke: INK, sw: 1.2 },
    { t: 'poly', points: [-5, 0, 4, 0], stroke: INK, sw: 1.2 },
  ];
  if (p.schedule?.length) {
    shapes.push({ t: 'circle', x: -0.5, y: -15, r: 3.2, fill: '#f2c14e', stroke: INK, sw: 1.2 });
    for (let i = 0; i < 6; i++) {
      const a = (i * Math.PI) / 3;
      shapes.push({
        t: 'poly',
        points: [-0.5 + Math.cos(a) * 4.8, -15 + Math.sin(a) * 4.8, -0.5 + Math.cos(a) * 6.8, -15 + Math.sin(a) * 6.8],
        stroke: INK,
        sw: 1.1,
      });
    }
  }
  return shapes;
}

export const pumpKind: LinkKindDef<PumpLink> = {
  kind: 'pump',
  label: 'Pump',
  prefix: 'Pu',
  create: (id, from, to, vertices, units = 'si') => ({
    id,
    kind: 'pump',
    name: id,
    from,
    to,
    vertices,
    ...siDefaults(PUMP_DEFAULTS, units),
    schedule: [...DAYLIGHT_SCHEDULE],
  }),
  stroke: { colour: INK, widthPx: 3 },
  showsVelocity: false,
  // A pump has no bore of its own: the results list shows the head it adds instead of a velocity.
  resultText: (flow, _velocity, addedHead) => `${flow} · +${addedHead} head`,
  midSymbol: body,
  fields: [
    nameField,
    {
      key: 'flow_m3s',
      label: 'Pumps in full sun',
      type: 'number',
      quantity: 'flow',
      required: true,
      min: 0,
      max: 1,
      testid: 'prop-pump-flow',
      when: (p) => !(p as PumpLink).curve?.length,
    },
    { key: 'curve', label: "Head–flow curve from the maker's chart", type: 'curve', testid: 'prop-pump-curve' },
    sunHoursField(DAYLIGHT_SCHEDULE),
    { key: 'schedule', label: 'Daylight curve', type: 'schedule', testid: 'prop-schedule' },
    notesField,
  ],
};
