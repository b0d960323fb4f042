import { toDisplay, unitLabel, type UnitSystem } from '../units';

/**
 * A takeoff or estimate row's unit as it is sold in a unit system: the price list keeps pipe by the
 * metre, a US project buys it by the foot. `perSi` converts a quantity (× perSi) and a unit price
 * (÷ perSi); amounts do not change. Other units (each, h) are sold as they are.
 *
 * @example soldUnit('m', 'us') // { unit: 'ft', perSi: 3.2808… }
 */
export function soldUnit(unit: string, system: UnitSystem): { unit: string; perSi: number } {
  if (unit !== 'm' || system === 'si') return { unit, perSi: 1 };
  return { unit: unitLabel('length', system), perSi: toDisplay('length', 1, system) };
}
