import type { Takeoff, TakeoffGroup } from './takeoff';

/**
 * The estimate: takeoff quantities × unit prices from the team's price list, then labour, markup
 * and tax. Money is rounded to cents per line (ROUND(quantity × price, 2), as the workbook's
 * formulas do), so the sums here and in the exported spreadsheet agree to the cent.
 *   materials = Σ line amounts (lines without a price count 0 and are listed in `missing`)
 *   labour    = labour_hours × labour_rate
 *   markup    = ROUND((materials + labour) × markup_fraction, 2)
 *   tax       = ROUND((materials + labour + markup) × tax_fraction, 2)
 *   total     = materials + labour + markup + tax
 *
 * @example estimate(takeoff(doc), new Map([['pe-sidr9/1"', 1.9]]), { labour_hours: 16, labour_rate: 45, markup_fraction: 0.15, tax_fraction: 0.07 }).total
 */

export interface EstimateSettings {
  labour_hours: number;
  labour_rate: number;
  markup_fraction: number;
  tax_fraction: number;
  currency?: string;
}

export interface EstimateLine {
  code: string;
  group: TakeoffGroup;
  description: string;
  quantity: number;
  unit: string;
  unit_price: number | null;
  amount: number;
}

export interface Estimate {
  lines: EstimateLine[];
  /** Codes with no price in the list. */
  missing: string[];
  materials: number;
  labour: number;
  markup: number;
  tax: number;
  total: number;
  settings: Required<EstimateSettings>;
}

export const DEFAULT_ESTIMATE_SETTINGS: Required<EstimateSettings> = { labour_hours: 0, labour_rate: 0, markup_fraction: 0, tax_fraction: 0, currency: 'USD' };

/** Round to cents (half away from zero, as a spreadsheet's ROUND). */
export function cents(v: number): number {
  return (Math.sign(v) * Math.round(Math.abs(v) * 100 + 1e-9)) / 100;
}

export function estimate(t: Takeoff, prices: Map<string, number | null>, settings: Partial<EstimateSettings> = {}): Estimate {
  const s = { ...DEFAULT_ESTIMATE_SETTINGS };
  for (const [k, v] of Object.entries(settings)) if (v !== undefined) (s as Record<string, unknown>)[k] = v;
  const missing: string[] = [];
  const lines = t.rows.map((r) => {
    const price = prices.get(r.code);
    const unitPrice = price === undefined || price === null ? null : price;
    if (unitPrice === null && r.quantity > 0) missing.push(r.code);
    return {
      code: r.code,
      group: r.group,
      description: r.description,
      quantity: r.quantity,
      unit: r.unit,
      unit_price: unitPrice,
      amount: unitPrice === null ? 0 : cents(r.quantity * unitPrice),
    };
  });
  const materials = cents(lines.reduce((sum, l) => sum + l.amount, 0));
  const labour = cents(s.labour_hours * s.labour_rate);
  const markup = cents((materials + labour) * s.markup_fraction);
  const tax = cents((materials + labour + markup) * s.tax_fraction);
  const total = cents(materials + labour + markup + tax);
  return { lines, missing, materials, labour, markup, tax, total, settings: s };
}
