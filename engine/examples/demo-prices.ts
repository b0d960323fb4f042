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

export interface DemoPipePrice {
  series: string;
  nominal: string;
  price_per_m: number;
}

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

/** One row of a team price list: an item code, what it is, its unit and unit price (null = not priced yet). */
export interface PriceListRow {
  code: string;
  description: string;
  unit: string;
  price: number | null;
}

const FITTING_BASE: Record<string, number> = {
  tee: 2.1,
  'elbow-90': 1.6,
  'elbow-45': 1.7,
  coupling: 1.1,
  'tank-adapter': 9.5,
  'pump-adapter': 3.2,
  'valve-shutoff': 14,
  'valve-check': 22,
  'valve-prv': 95,
  'valve-float': 38,
  'air-release-valve': 45,
  'drain-valve': 12,
};

/**
 * The invented demo team's price list: every pipe of the catalogue (per metre), every fitting and
 * valve in every size (each), reducers between sizes, the demo's tanks and pump, and trenching;
 * "other/thrust-block" is left unpriced so the takeoff shows a row without a price.
 */
export function demoPriceList(): PriceListRow[] {
  const rows: PriceListRow[] = demoPipePrices().map((p) => ({
    code: `${p.series}/${p.nominal}`,
    description: `${pipeSeries.find((s) => s.id === p.series)?.label ?? p.series} ${p.nominal}`,
    unit: 'm',
    price: p.price_per_m,
  }));
  const sizes = pipeSizes('pvc-sch40').map((s) => s.nominal);
  const od = new Map(pipeSizes('pvc-sch40').map((s) => [s.nominal, s.od_in]));
  for (const [kind, base] of Object.entries(FITTING_BASE)) {
    for (const size of sizes)
      rows.push({ code: `${kind}/${size}`, description: `${kind} ${size}`, unit: 'each', price: Math.round(base * (0.6 + (od.get(size) ?? 1)) * 100) / 100 });
  }
  for (let i = 1; i < sizes.length; i++)
    for (let j = 0; j < i; j++) {
      rows.push({
        code: `reducer/${sizes[i]}x${sizes[j]}`,
        description: `reducer ${sizes[i]} × ${sizes[j]}`,
        unit: 'each',
        price: Math.round(1.8 * (0.6 + (od.get(sizes[i]) ?? 1)) * 100) / 100,
      });
    }
  rows.push({ code: 'tank/8651 L', description: 'Poly tank 8,650 L with lid', unit: 'each', price: 1890 });
  rows.push({ code: 'pump/0.75 L/s', description: 'Solar well pump kit 0.75 L/s with panels', unit: 'each', price: 2650 });
  rows.push({ code: 'other/trenching', description: 'Trenching and backfill', unit: 'm', price: 3.4 });
  rows.push({ code: 'other/thrust-block', description: 'Thrust blocks at tees and bends', unit: 'each', price: null });
  return rows;
}
