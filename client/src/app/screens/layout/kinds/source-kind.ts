import type { SourceNode } from '../../../../../../engine/network-document';
import { DefaultTable, elevationField, INK, nameField, NodeKindDef, notesField, siDefaults, WATER } from './kind-types';

/** A new source's water surface stands this far above its elevation (set as head_m = elevation + this). */
export const SOURCE_DEFAULTS: DefaultTable<'head_m'> = {
  us: { head_m: ['elevation', 1] },
  si: { head_m: ['elevation', 0.3] },
};

/** Source: a circle of water with two ripple lines — spring box, creek intake or well. */
export const sourceKind: NodeKindDef<SourceNode> = {
  kind: 'source',
  label: 'Source',
  prefix: 'S',
  hitRadiusPx: 14,
  labelRank: 2,
  showsPressure: false,
  create: (id, x_m, y_m, units = 'si') => ({
    id,
    kind: 'source',
    name: id,
    elevation_m: 0,
    ...siDefaults(SOURCE_DEFAULTS, units),
    source_type: 'spring',
    x_m,
    y_m,
  }),
  symbol: () => [
    { t: 'circle', r: 12, fill: WATER, stroke: INK, sw: 2 },
    { t: 'poly', points: [-7, -2, -3.5, -5, 0, -2, 3.5, -5, 7, -2], stroke: INK, sw: 1.5 },
    { t: 'poly', points: [-7, 4, -3.5, 1, 0, 4, 3.5, 1, 7, 4], stroke: INK, sw: 1.5 },
  ],
  fields: [
    nameField,
    elevationField,
    { key: 'head_m', label: 'Water surface elevation', type: 'number', quantity: 'elevation', required: true, min: -500, max: 9000, testid: 'prop-head' },
    {
      key: 'source_type',
      label: 'Source type',
      type: 'select',
      testid: 'prop-source-type',
      options: [
        { value: 'spring', label: 'Spring box' },
        { value: 'creek', label: 'Creek intake' },
        { value: 'well', label: 'Well' },
      ],
    },
    notesField,
  ],
  check: (n) => (n.head_m < n.elevation_m - 50 ? ['Water surface is far below the source elevation; check the two values.'] : []),
};
