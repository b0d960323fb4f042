import type { QuantityParse } from '../../../../../../engine/quantity-input';
import { fromDisplay, type Quantity, type UnitSystem } from '../../../../../../engine/units';

/**
 * The unit-aware reader for typed values ("150 ft", "3/4 in", "40 psi"), loaded on its own
 * chunk: mathjs's parser and units are about 320 kB, so the Layout opens without waiting for them.
 * Until they arrive (a moment after the panel first shows), a bare number still reads in the
 * field's display unit; a number with a unit asks the user to try again.
 */
let parser: ((text: string, quantity: Quantity, system: UnitSystem) => QuantityParse) | null = null;
let loading: Promise<void> | null = null;

/** Starts loading the reader (idempotent); resolves once it is there. */
export function loadQuantityReader(): Promise<void> {
  loading ??= import('../../../../../../engine/quantity-input').then((m) => {
    parser = m.parseQuantity;
  });
  return loading;
}

export function readQuantity(text: string, quantity: Quantity, system: UnitSystem): QuantityParse {
  if (parser) return parser(text, quantity, system);
  const n = Number(text);
  if (text.trim() !== '' && Number.isFinite(n)) return { ok: true, si: fromDisplay(quantity, n, system) };
  return { ok: false, message: 'still loading the unit reader: try again in a moment' };
}
