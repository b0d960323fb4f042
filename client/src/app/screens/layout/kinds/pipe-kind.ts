import type { PipeLink } from '../../../../../../engine/network-document';
import { catalogueFields } from '../pipe-catalogue';
import { INK, LinkKindDef, nameField, notesField } from './kind-types';

/**
 * A new pipe starts as 1" PE SIDR 9 (a common farm-line choice; trade practice), changed in the
 * panel. The catalogue's sizes are nominal, so this default is the same in both unit systems;
 * the length follows the drawing.
 */
export const DEFAULT_PIPE = { series: 'pe-sidr9', nominal: '1"' };

/** Pipe: a plain polyline; no mid symbol (flow arrows come from the results overlay). */
export const pipeKind: LinkKindDef<PipeLink> = {
  kind: 'pipe',
  label: 'Pipe',
  prefix: 'P',
  create: (id, from, to, vertices) => ({
    id,
    kind: 'pipe',
    name: id,
    from,
    to,
    vertices,
    length_m: 1,
    diameter_m: 0.0266,
    roughness: 140,
    minor_loss: 0,
    ...catalogueFields(DEFAULT_PIPE.series, DEFAULT_PIPE.nominal, 'hazen-williams'),
  }),
  stroke: { colour: INK, widthPx: 2.5 },
  showsVelocity: true,
  resultText: (flow, velocity) => `${flow} · ${velocity}`,
  midSymbol: () => [],
  fields: [
    nameField,
    { key: 'series', label: 'Pipe size', type: 'pipe-size', testid: 'prop-pipe-size' },
    { key: 'diameter_m', label: 'Inside diameter', type: 'number', quantity: 'diameter', required: true, min: 0.003, max: 2, testid: 'prop-diameter' },
    { key: 'roughness', label: 'Roughness (C or mm)', type: 'number', required: true, min: 0, max: 200, testid: 'prop-roughness' },
    { key: 'rating_m', label: 'Pressure rating', type: 'number', quantity: 'pressure', min: 0, max: 2000, testid: 'prop-rating' },
    { key: 'length_m', label: 'Length', type: 'length', quantity: 'length', required: true, min: 0.1, max: 100000, testid: 'prop-length' },
    {
      key: 'minor_loss',
      label: 'Fittings loss allowance',
      type: 'number',
      suffix: 'K',
      min: 0,
      max: 1000,
      testid: 'prop-minor-loss',
      hint: 'Elbows, tees and couplings add up here (Count the fittings)',
    },
    { key: 'closed', label: 'Closed', type: 'checkbox', testid: 'prop-closed' },
    notesField,
  ],
};
