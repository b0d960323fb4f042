import { Pipe, PipeTransform } from '@angular/core';
import { Quantity, UnitSystem, formatQuantity } from '../../../../engine/units';

/**
 * An SI value shown in the project's unit system with its unit, through engine/units.ts
 * (the one place for conversion factors).
 *
 * @example
 * {{ node.elevation_m | quantity: 'elevation' : context.units() }}  → "134.5 ft"
 */
@Pipe({ name: 'quantity' })
export class QuantityPipe implements PipeTransform {
  transform(si: number | null | undefined, quantity: Quantity, system: UnitSystem = 'us', digits?: number): string {
    return si === null || si === undefined ? '—' : formatQuantity(quantity, si, system, digits);
  }
}
