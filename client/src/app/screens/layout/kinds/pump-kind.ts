import type { PumpLink } from '../../../../../../engine/network-document';
import { DefaultTable, INK, LinkKindDef, nameField, notesField, PAPER, siDefaults } from './kind-types';

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
export const DAYLIGHT_SCHEDULE: readonly number[] = [
  0, 0, 0, 0, 0, 0, 0.1, 0.3, 0.6, 0.85, 1, 1, 1, 1, 1, 0.85, 0.6, 0.3, 0.1, 0, 0, 0, 0, 0,
];

/** Pump: a ring on the line with a solid arrowhead pointing downstream. */
export const pumpKind: LinkKindDef<PumpLink> = {
  kind: 'pump',
  label: 'Pump',
  prefix: 'Pu',
  create: (id, from, to, vertices, units = 'si') => ({ id, kind: 'pump', name: id, from, to, vertices, ...siDefaults(PUMP_DEFAULTS, units), schedule: [...DAYLIGHT_SCHEDULE] }),
  stroke: { colour: INK, widthPx: 2.5, dash: [8, 4] },
  showsVelocity: false,
  // A pump has no bore of its own: the results list shows the head it adds instead of a velocity.
  resultText: (flow, _velocity, addedHead) => `${flow} · +${addedHead} head`,
  midSymbol: () => [
    { t: 'circle', r: 11, fill: PAPER, stroke: INK, sw: 2 },
    { t: 'poly', points: [-5, -6, 7, 0, -5, 6], closed: true, fill: INK },
  ],
  fields: [
    nameField,
    { key: 'flow_m3s', label: 'Delivered flow', type: 'number', quantity: 'flow', required: true, min: 0, max: 1, testid: 'prop-pump-flow' },
    { key: 'schedule', label: 'Hourly availability', type: 'schedule', testid: 'prop-schedule' },
    notesField,
  ],
};
