import type { TankNode } from '../../../../../../engine/network-document';
import { DefaultTable, elevationField, INK, nameField, NodeKindDef, notesField, PAPER, siDefaults, WATER } from './kind-types';

/** A new tank: a small farm poly tank (about 2.5–3 m³), round in each system. */
export const TANK_DEFAULTS: DefaultTable<'diameter_m' | 'level_m' | 'min_level_m' | 'max_level_m'> = {
  us: { diameter_m: ['length', 5], level_m: ['head', 4], min_level_m: ['head', 0.5], max_level_m: ['head', 5] },
  si: { diameter_m: ['length', 1.6], level_m: ['head', 1.2], min_level_m: ['head', 0.1], max_level_m: ['head', 1.5] },
};

/**
 * Tank: an upright cylinder seen from the side (a rounded body with a lid band) filled to its
 * current level. Tanks sharing `bank` are joined by a header line drawn by the canvas view.
 */
export const tankKind: NodeKindDef<TankNode> = {
  kind: 'tank',
  label: 'Tank',
  prefix: 'T',
  hitRadiusPx: 16,
  labelRank: 2,
  showsPressure: false,
  symbolKey: (t) => `${t.level_m}|${t.max_level_m}`,
  create: (id, x_m, y_m, units = 'si') => ({ id, kind: 'tank', name: id, elevation_m: 0, ...siDefaults(TANK_DEFAULTS, units), x_m, y_m }),
  symbol: (t) => {
    const fillFrac = t.max_level_m > 0 ? Math.max(0, Math.min(1, t.level_m / t.max_level_m)) : 0;
    const h = 24 * fillFrac;
    return [
      { t: 'rect', x: -12, y: -12, w: 24, h: 26, fill: PAPER, stroke: INK, sw: 2, corner: 3 },
      { t: 'rect', x: -11, y: 13 - h, w: 22, h, fill: WATER },
      { t: 'rect', x: -14, y: -15, w: 28, h: 4, fill: INK, corner: 1 },
    ];
  },
  fields: [
    nameField,
    { ...elevationField, label: 'Floor elevation' },
    { key: 'diameter_m', label: 'Diameter', type: 'number', quantity: 'length', required: true, min: 0.1, max: 30, testid: 'prop-diameter' },
    { key: 'level_m', label: 'Water level now', type: 'number', quantity: 'head', required: true, min: 0, max: 30, testid: 'prop-level' },
    { key: 'min_level_m', label: 'Lowest usable level', type: 'number', quantity: 'head', required: true, min: 0, max: 30, testid: 'prop-min-level' },
    { key: 'max_level_m', label: 'Full at', type: 'number', quantity: 'head', required: true, min: 0.05, max: 30, testid: 'prop-max-level' },
    { key: 'bank', label: 'Tank bank', type: 'text', testid: 'prop-bank', hint: 'Tanks with the same bank id are joined by a header' },
    notesField,
  ],
  check: (t) => {
    const out: string[] = [];
    if (t.min_level_m >= t.max_level_m) out.push('Minimum level must be below the maximum level.');
    if (t.level_m < t.min_level_m || t.level_m > t.max_level_m) out.push('Starting level must lie between the minimum and maximum levels.');
    return out;
  },
};
