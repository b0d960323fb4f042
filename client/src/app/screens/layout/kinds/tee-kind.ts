import type { TeeNode } from '../../../../../../engine/network-document';
import { elevationField, INK, nameField, NodeKindDef, notesField } from './kind-types';

/** Tee: a small solid diamond where lines branch. */
export const teeKind: NodeKindDef<TeeNode> = {
  kind: 'tee',
  label: 'Tee',
  prefix: 'J',
  hitRadiusPx: 10,
  labelRank: 3,
  showsPressure: true,
  create: (id, x_m, y_m) => ({ id, kind: 'tee', name: id, elevation_m: 0, demand_m3s: 0, x_m, y_m }),
  symbol: () => [{ t: 'poly', points: [0, -7, 7, 0, 0, 7, -7, 0], closed: true, fill: INK, stroke: INK, sw: 1 }],
  fields: [
    nameField,
    elevationField,
    { key: 'demand_m3s', label: 'Demand', type: 'number', quantity: 'flow', required: true, min: 0, max: 1, testid: 'prop-demand' },
    notesField,
  ],
};
