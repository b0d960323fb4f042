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

/** Valve: two triangles meeting at their tips; a mark on top tells the type apart. */
function body(v: ValveLink): ShapeSpec[] {
  const closed = v.valve_type === 'shutoff' && v.open === false;
  const base: ShapeSpec[] = [
    { t: 'poly', points: [-10, -7, 0, 0, -10, 7], closed: true, fill: closed ? INK : PAPER, stroke: INK, sw: 2 },
    { t: 'poly', points: [10, -7, 0, 0, 10, 7], closed: true, fill: v.valve_type === 'check' || closed ? INK : PAPER, stroke: INK, sw: 2 },
  ];
  if (v.valve_type === 'prv') base.push({ t: 'rect', x: -4, y: -15, w: 8, h: 7, fill: PAPER, stroke: INK, sw: 1.5 });
  if (v.valve_type === 'float') base.push({ t: 'circle', y: -12, r: 4, fill: PAPER, stroke: INK, sw: 1.5 });
  return base;
}

export const valveKind: LinkKindDef<ValveLink> = {
  kind: 'valve',
  label: 'Valve',
  prefix: 'V',
  create: (id, from, to, vertices, units = 'si') => ({ id, kind: 'valve', name: id, from, to, vertices, valve_type: 'shutoff', ...siDefaults(VALVE_DEFAULTS, units), open: true }),
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
      key: 'setting_m', label: 'Downstream pressure setting', type: 'number', quantity: 'pressure', min: 0, max: 500,
      testid: 'prop-valve-setting', when: (v) => (v as ValveLink).valve_type === 'prv',
    },
    { key: 'tank', label: 'Tank it fills (id)', type: 'text', testid: 'prop-valve-tank', when: (v) => (v as ValveLink).valve_type === 'float' },
    { key: 'minor_loss', label: 'Minor loss K', type: 'number', suffix: 'K', min: 0, max: 1000, testid: 'prop-minor-loss' },
    notesField,
  ],
  check: (v, doc) => {
    if (v.valve_type === 'prv' && v.setting_m === undefined) return ['A pressure-reducing valve needs a downstream setting.'];
    if (v.valve_type === 'float' && v.tank && !doc.nodes.some((n) => n.id === v.tank && n.kind === 'tank')) return [`Float valve: "${v.tank}" is not a tank.`];
    return [];
  },
};
