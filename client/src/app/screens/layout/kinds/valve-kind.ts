import type { ValveLink, ValveType } from '../../../../../../engine/network-document';
import { DefaultTable, INK, LinkKindDef, nameField, notesField, PAPER, ShapeSpec, siDefaults } from './kind-types';

/** A new valve's bore, round in each system. */
export const VALVE_DEFAULTS: DefaultTable<'diameter_m'> = {
  us: { diameter_m: ['diameter', 1] },
  si: { diameter_m: ['diameter', 25] },
};

const VALVE_TYPES: { value: ValveType; label: string }[] = [
  { value: 'shutoff', label: 'Shut-off' },
  { value: 'check', label: 'Check (one-way)' },
  { value: 'prv', label: 'Pressure-reducing' },
  { value: 'float', label: 'Float (fills a tank)' },
];

const FLOAT = '#cfe6f3';

/**
 * Valves drawn from the hardware on a farm line (the line runs along x, downstream to the right):
 * - shut-off: a ball valve, its lever along the pipe when open and across it when shut;
 * - check: a body with the hinged flap inside, hanging from its pin, that lets water one way;
 * - pressure reducer: a body with the adjusting spring on top;
 * - float: a body with the lever arm out to a ball float.
 */
function body(v: ValveLink): ShapeSpec[] {
  switch (v.valve_type) {
    case 'check':
      return [
        { t: 'rect', x: -9, y: -6.5, w: 18, h: 13, fill: PAPER, stroke: INK, sw: 2, corner: 2 },
        { t: 'poly', points: [-3.5, -4.5, 3.5, 4], stroke: INK, sw: 2.2 },
        { t: 'circle', x: -3.5, y: -4.5, r: 1.6, fill: INK },
        { t: 'poly', points: [4.5, -4.5, 4.5, 1], stroke: INK, sw: 1 },
      ];
    case 'prv':
      return [
        { t: 'rect', x: -8, y: -6, w: 16, h: 12, fill: PAPER, stroke: INK, sw: 2, corner: 2 },
        { t: 'poly', points: [0, -6, -3, -8, 3, -10, -3, -12, 3, -14, 0, -16], stroke: INK, sw: 1.3 },
        { t: 'rect', x: -4, y: -19, w: 8, h: 3, fill: INK },
        { t: 'poly', points: [-4, 2, 4, 2], stroke: INK, sw: 1.2 },
      ];
    case 'float':
      return [
        { t: 'rect', x: -7, y: -6, w: 14, h: 12, fill: PAPER, stroke: INK, sw: 2, corner: 2 },
        { t: 'poly', points: [0, -6, 9, -13], stroke: INK, sw: 1.6 },
        { t: 'circle', x: 12, y: -14, r: 4.5, fill: FLOAT, stroke: INK, sw: 1.5 },
      ];
    default: {
      const shut = v.open === false;
      return [
        { t: 'circle', r: 7, fill: shut ? INK : PAPER, stroke: INK, sw: 2 },
        { t: 'poly', points: shut ? [0, -4, 0, 4] : [-4, 0, 4, 0], stroke: shut ? PAPER : INK, sw: 2 },
        { t: 'poly', points: shut ? [0, -7, 0, -17] : [-1, -9.5, 12, -9.5], stroke: INK, sw: 2.6 },
        { t: 'circle', x: 0, y: -8.5, r: 1.8, fill: INK },
      ];
    }
  }
}

export const valveKind: LinkKindDef<ValveLink> = {
  kind: 'valve',
  label: 'Valve',
  prefix: 'V',
  create: (id, from, to, vertices, units = 'si') => ({
    id,
    kind: 'valve',
    name: id,
    from,
    to,
    vertices,
    valve_type: 'shutoff',
    ...siDefaults(VALVE_DEFAULTS, units),
    open: true,
  }),
  stroke: { colour: INK, widthPx: 2.5 },
  showsVelocity: false,
  resultText: (flow, velocity) => `${flow} · ${velocity}`,
  midSymbol: body,
  fields: [
    nameField,
    { key: 'valve_type', label: 'Valve type', type: 'select', options: VALVE_TYPES, testid: 'prop-valve-type' },
    { key: 'diameter_m', label: 'Diameter', type: 'number', quantity: 'diameter', required: true, min: 0.003, max: 2, testid: 'prop-diameter' },
    { key: 'open', label: 'Open', type: 'checkbox', testid: 'prop-open', when: (v) => (v as ValveLink).valve_type === 'shutoff' },
    {
      key: 'setting_m',
      label: 'Downstream pressure setting',
      type: 'number',
      quantity: 'pressure',
      min: 0,
      max: 500,
      testid: 'prop-valve-setting',
      when: (v) => (v as ValveLink).valve_type === 'prv',
    },
    { key: 'tank', label: 'Tank it fills (id)', type: 'text', testid: 'prop-valve-tank', when: (v) => (v as ValveLink).valve_type === 'float' },
    { key: 'minor_loss', label: 'Loss through it', type: 'number', suffix: 'K', min: 0, max: 1000, testid: 'prop-minor-loss' },
    notesField,
  ],
  check: (v, doc) => {
    if (v.valve_type === 'prv' && v.setting_m === undefined) return ['A pressure-reducing valve needs a downstream setting.'];
    if (v.valve_type === 'float' && v.tank && !doc.nodes.some((n) => n.id === v.tank && n.kind === 'tank')) return [`Float valve: "${v.tank}" is not a tank.`];
    return [];
  },
};
