/**
 * What a user types into a quantity field, as an SI number: "150 ft", "3/4 in", "2 gpm",
 * "40 psi", "1.5 m" or a bare number (read in the field's display unit for the unit system).
 * mathjs does the arithmetic and the unit algebra; the SI unit of each quantity is fixed here.
 * Pressure is kept in metres of water (1 m H2O = 9806.65 Pa, as engine/units.ts).
 *
 * @example
 * parseQuantity('3/4 in', 'diameter', 'us') // { ok: true, si: 0.01905 }
 * parseQuantity('2 gpm', 'flow', 'si')      // { ok: true, si: 1.2618e-4 }
 * parseQuantity('12 kg', 'length', 'us')    // { ok: false, message: '"12 kg" is not a length (try ft or m)' }
 */
import {
  addDependencies,
  create,
  createUnitDependencies,
  divideDependencies,
  evaluateDependencies,
  multiplyDependencies,
  powDependencies,
  subtractDependencies,
  unaryMinusDependencies,
  unaryPlusDependencies,
  unitDependencies,
  type Unit,
} from 'mathjs';
import { fromDisplay, unitLabel, type Quantity, type UnitSystem } from './units';

// Only the parser, units and arithmetic: the Layout's properties panel loads this, and all of
// mathjs would add most of a megabyte to it.
const math = create({
  evaluateDependencies,
  createUnitDependencies,
  unitDependencies,
  addDependencies,
  subtractDependencies,
  multiplyDependencies,
  divideDependencies,
  unaryMinusDependencies,
  unaryPlusDependencies,
  powDependencies,
});
math.createUnit('gpm', '1 gallon/minute');
math.createUnit('gph', '1 gallon/hour');
math.createUnit('lps', '1 liter/second');

/** Metres of water per pascal (1 m H2O = 9806.65 Pa, as engine/units.ts). */
const M_WATER_PER_PA = 1 / 9806.65;

/** The SI unit each quantity is stored in (mathjs syntax), and a hint for the error message. */
const SI_UNIT: Partial<Record<Quantity, { unit: string; scale?: number; hint: string }>> = {
  length: { unit: 'm', hint: 'a length (try ft or m)' },
  elevation: { unit: 'm', hint: 'an elevation (try ft or m)' },
  head: { unit: 'm', hint: 'a head (try ft or m)' },
  diameter: { unit: 'm', hint: 'a diameter (try in or mm)' },
  flow: { unit: 'm^3/s', hint: 'a flow (try gpm or L/s)' },
  pressure: { unit: 'Pa', scale: M_WATER_PER_PA, hint: 'a pressure (try psi or kPa)' },
  velocity: { unit: 'm/s', hint: 'a speed (try ft/s or m/s)' },
  volume: { unit: 'm^3', hint: 'a volume (try gal or L)' },
  area: { unit: 'm^2', hint: 'an area (try ft^2 or m^2)' },
  duration: { unit: 's', hint: 'a duration (try min or h)' },
  'emitter-flow': { unit: 'm^3/s', hint: 'an emitter flow (try gph or L/h)' },
};

/**
 * Head and pressure are one thing to a farmer: "20 m" or "60 ft" in a pressure field means that
 * much water column, and "40 psi" in a head field means the column that pressure holds up.
 */
function waterColumn(unit: Unit, quantity: Quantity): number | null {
  if (quantity === 'pressure' && unit.equalBase(math.unit('m'))) return unit.toNumber('m');
  if (quantity === 'head' && unit.equalBase(math.unit('Pa'))) return unit.toNumber('Pa') * M_WATER_PER_PA;
  return null;
}

/** Only numbers, unit names and arithmetic: no assignments, functions or matrices. */
const ALLOWED = /^[0-9a-zA-Z\s.,/*+\-()^²³µ]*$/;

export type QuantityParse = { ok: true; si: number } | { ok: false; message: string };

export function parseQuantity(text: string, quantity: Quantity, system: UnitSystem): QuantityParse {
  // "1 1/2 in" is a mixed number to a farmer (mathjs would read 1 × 1/2).
  const t = text
    .trim()
    .replace(/²/g, '^2')
    .replace(/³/g, '^3')
    .replace(/(\d+)\s+(\d+)\s*\/\s*(\d+)/g, '($1 + $2/$3)');
  const target = SI_UNIT[quantity];
  if (!t) return { ok: false, message: 'enter a number' };
  if (!ALLOWED.test(t) || t.length > 60) return { ok: false, message: `"${text}" is not a number with a unit` };
  let value: unknown;
  try {
    value = math.evaluate(t);
  } catch {
    return { ok: false, message: `"${text}" is not a number with a unit` };
  }
  if (typeof value === 'number') {
    return Number.isFinite(value) ? { ok: true, si: fromDisplay(quantity, value, system) } : { ok: false, message: `"${text}" is not a finite number` };
  }
  if (!target || !math.isUnit(value)) return { ok: false, message: `"${text}" is not a number in ${unitLabel(quantity, system)}` };
  const unit = value as Unit;
  const column = waterColumn(unit, quantity);
  if (column !== null) return Number.isFinite(column) ? { ok: true, si: column } : { ok: false, message: `"${text}" is not a finite number` };
  if (!unit.equalBase(math.unit(target.unit))) return { ok: false, message: `"${text}" is not ${target.hint}` };
  const si = unit.toNumber(target.unit) * (target.scale ?? 1);
  return Number.isFinite(si) ? { ok: true, si } : { ok: false, message: `"${text}" is not a finite number` };
}
