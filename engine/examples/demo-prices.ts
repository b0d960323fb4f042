import { pipeSeries, pipeSizes } from '../pipe-catalogue';


/**
 * Invented demo prices (no real supplier): US dollars per metre of pipe for every series and size
 * in ../pipe-catalogue, rising with the plastic in the wall (OD² − ID²) plus a handling part, so
 * thicker classes and larger sizes cost more, as at any supply store.
 *
 * @example demoPipePrices().find((p) => p.series === 'pe-sidr9' && p.nominal === '1"')?.price_per_m
 */

/** Dollars per square inch of wall cross-section per metre, by material (invented). */
const PER_WALL_AREA: Record<string, number> = { pvc: 4.2, pe: 5.1 };

export interface DemoPipePrice { series: string; nominal: string; price_per_m: number }

export function demoPipePrices(): DemoPipePrice[] {
  const out: DemoPipePrice[] = [];
  for (const s of pipeSeries) {
    for (const size of pipeSizes(s.id)) {
      const wall = (Math.PI / 4) * (size.od_in ** 2 - size.id_in ** 2);
      const price = 0.35 + PER_WALL_AREA[s.material] * wall + 0.4 * size.od_in;
      out.push({ series: s.id, nominal: size.nominal, price_per_m: Math.round(price * 100) / 100 });
    }
  }
  return out;
}

/** The demo prices as a sizing catalogue document (the `--catalogue` JSON format). */
export function demoPriceCatalogue(): { currency: string; items: DemoPipePrice[] } {
  return { currency: 'USD', items: demoPipePrices() };
}

