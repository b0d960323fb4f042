import type { OutletNode, OutletType } from '../../../../../../engine/network-document';
import { dripFields, troughFields } from './farm-terms';
import { DefaultTable, elevationField, INK, nameField, NodeKindDef, notesField, PAPER, ShapeSpec, siDefaults, WATER } from './kind-types';

/**
 * A new outlet: a garden hose bib's flow and a minimum pressure of about 7 m of water (common
 * trade practice for a hose bib, from memory), as round numbers in each system.
 */
export const OUTLET_DEFAULTS: DefaultTable<'demand_m3s' | 'min_pressure_m'> = {
  us: { demand_m3s: ['flow', 5], min_pressure_m: ['pressure', 10] },
  si: { demand_m3s: ['flow', 0.3], min_pressure_m: ['pressure', 70] },
};

const OUTLET_TYPES: { value: OutletType; label: string }[] = [
  { value: 'hose-bib', label: 'Hose bib' },
  { value: 'trough', label: 'Stock trough' },
  { value: 'drip-zone', label: 'Drip zone' },
  { value: 'sprinkler', label: 'Sprinkler' },
  { value: 'house', label: 'House' },
  { value: 'other', label: 'Other' },
];

/** What an outlet's design flow is called, by type: a hose bib gives 5 gpm at 8 psi. */
const FLOW_WORDS: Record<OutletType, string> = {
  'hose-bib': 'Gives',
  trough: 'Fills at',
  'drip-zone': 'Whole zone draws',
  sprinkler: 'Gives',
  house: 'Draws at peak',
  other: 'Draws',
};
const PRESSURE_WORDS: Record<OutletType, string> = {
  'hose-bib': 'at',
  trough: 'Float valve needs',
  'drip-zone': 'Emitters rated at',
  sprinkler: 'at',
  house: 'Needs at the taps',
  other: 'Needs at least',
};

/** One glyph per outlet type, all about 24 px across, white body with dark outline. */
function glyph(type: OutletType): ShapeSpec[] {
  switch (type) {
    case 'hose-bib': // a downward spout
      return [
        { t: 'poly', points: [-10, -9, 10, -9, 0, 10], closed: true, fill: PAPER, stroke: INK, sw: 2 },
        { t: 'circle', y: -3, r: 2.5, fill: INK },
      ];
    case 'trough': // a long basin with water
      return [
        { t: 'poly', points: [-13, -6, 13, -6, 9, 7, -9, 7], closed: true, fill: PAPER, stroke: INK, sw: 2 },
        { t: 'poly', points: [-11, -2, 11, -2, 8.5, 5, -8.5, 5], closed: true, fill: WATER },
      ];
    case 'drip-zone': // a square bed with emitter dots
      return [
        { t: 'rect', x: -10, y: -10, w: 20, h: 20, fill: PAPER, stroke: INK, sw: 2, corner: 2 },
        ...[-5, 0, 5].flatMap((x) => [-5, 5].map((y) => ({ t: 'circle' as const, x, y, r: 1.6, fill: INK }))),
      ];
    case 'sprinkler': // a ring with spray spokes
      return [
        { t: 'circle', r: 10, fill: PAPER, stroke: INK, sw: 2 },
        { t: 'poly', points: [-6, -6, 6, 6], stroke: INK, sw: 1.5 },
        { t: 'poly', points: [-6, 6, 6, -6], stroke: INK, sw: 1.5 },
        { t: 'circle', r: 2.5, fill: INK },
      ];
    case 'house': // a gabled outline
      return [{ t: 'poly', points: [-10, 10, -10, -2, 0, -11, 10, -2, 10, 10], closed: true, fill: PAPER, stroke: INK, sw: 2 }];
    default:
      return [
        { t: 'circle', r: 9, fill: PAPER, stroke: INK, sw: 2 },
        { t: 'circle', r: 3, fill: INK },
      ];
  }
}

/** Outlet: where water is used; the glyph shows its type. */
export const outletKind: NodeKindDef<OutletNode> = {
  kind: 'outlet',
  label: 'Outlet',
  prefix: 'O',
  hitRadiusPx: 14,
  labelRank: 1,
  showsPressure: true,
  requiredPressure_m: (o) => o.min_pressure_m ?? 0,
  symbolKey: (o) => o.outlet_type ?? '',
  create: (id, x_m, y_m, units = 'si') => ({
    id,
    kind: 'outlet',
    name: id,
    elevation_m: 0,
    ...siDefaults(OUTLET_DEFAULTS, units),
    outlet_type: 'hose-bib',
    demand_model: { type: 'fixed' },
    x_m,
    y_m,
  }),
  symbol: (o) => glyph(o.outlet_type ?? 'other'),
  fields: [
    nameField,
    elevationField,
    { key: 'outlet_type', label: 'Outlet type', type: 'select', options: OUTLET_TYPES, fallback: 'other', testid: 'prop-outlet-type' },
    ...troughFields,
    ...dripFields,
    {
      key: 'demand_m3s',
      label: 'Design flow',
      type: 'number',
      quantity: 'flow',
      required: true,
      min: 0,
      max: 1,
      testid: 'prop-demand',
      labelFor: (o) => FLOW_WORDS[(o as OutletNode).outlet_type ?? 'other'],
    },
    {
      key: 'min_pressure_m',
      label: 'Needs at least',
      type: 'number',
      quantity: 'pressure',
      min: 0,
      max: 200,
      testid: 'prop-min-pressure',
      labelFor: (o) => PRESSURE_WORDS[(o as OutletNode).outlet_type ?? 'other'],
    },
    {
      key: 'demand_model.type',
      label: 'When pressure drops',
      type: 'select',
      testid: 'prop-demand-model',
      fallback: 'fixed',
      options: [
        { value: 'fixed', label: 'Still draws its flow (tap, float valve)' },
        { value: 'pressure-dependent', label: 'Weakens below full-flow pressure' },
        { value: 'emitter', label: 'Flows like emitters (with the square root of pressure)' },
      ],
    },
    {
      key: 'demand_model.required_pressure_m',
      label: 'Full flow from',
      type: 'number',
      quantity: 'pressure',
      min: 0,
      max: 200,
      testid: 'prop-required-pressure',
      when: (o) => (o as OutletNode).demand_model?.type === 'pressure-dependent',
    },
    {
      key: 'demand_model.k',
      label: 'Flow at 1 m of water (law constant)',
      type: 'number',
      min: 0,
      max: 1,
      testid: 'prop-emitter-k',
      hint: 'm³/s per m^x of pressure',
      when: (o) => (o as OutletNode).demand_model?.type === 'emitter',
    },
    {
      key: 'demand_model.exponent',
      label: 'Pressure exponent (0.5 plain, near 0 compensating)',
      type: 'number',
      min: 0,
      max: 2,
      testid: 'prop-emitter-exponent',
      when: (o) => (o as OutletNode).demand_model?.type === 'emitter',
    },
    {
      key: 'float_valve',
      label: 'Float valve (stops when full)',
      type: 'checkbox',
      testid: 'prop-float-valve',
      when: (o) => (o as OutletNode).outlet_type === 'trough',
    },
    notesField,
  ],
};

/** Defaults used when the demand model type changes in the panel (SI). */
export function defaultDemandModel(type: string, outlet: OutletNode): OutletNode['demand_model'] {
  if (type === 'pressure-dependent') return { type, required_pressure_m: Math.max(outlet.min_pressure_m ?? 7, 1) * 1.5 };
  if (type === 'emitter') return { type, k: outlet.demand_m3s / Math.sqrt(Math.max(outlet.min_pressure_m ?? 7, 1)), exponent: 0.5 };
  return { type: 'fixed' };
}
