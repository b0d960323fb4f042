import { defaultRoughness, findPipeSize, pipeSeries } from '../pipe-catalogue';

/**
 * A priced pipe catalogue for sizing: which pipes may be chosen and what each costs per metre.
 * Format (JSON, documented in engine/README.md "Sizing"):
 *   { "currency": "USD", "items": [
 *       { "series": "pe-sidr9", "nominal": "1\"", "price_per_m": 1.9 },          // from ../pipe-catalogue
 *       { "id": "D18", "label": "18 in", "diameter_m": 0.4572, "price_per_m": 130,  // a custom item
 *         "roughness": 130, "rating_m": 100 } ] }
 * Catalogue items take inside diameter, rating and material from ../pipe-catalogue (the one
 * catalogue); custom items carry their own inside diameter (and optionally roughness, rating).
 * Prices are per metre of pipe in the catalogue's currency.
 *
 * @example
 * const { candidates, errors } = parsePriceCatalogue({ items: [{ series: 'pvc-sch40', nominal: '1"', price_per_m: 2.4 }] });
 * candidates[0].diameter_m // 0.02664 m
 */

export interface SizingCandidate {
  /** Stable key: `series/nominal` for catalogue items, the id for custom items. */
  key: string;
  label: string;
  /** Inside diameter, m. */
  diameter_m: number;
  /** Price per metre of pipe. */
  price_per_m: number;
  /** Hazen-Williams C or ε in mm; absent = keep the pipe's own roughness. */
  roughness?: number;
  /** Pressure rating, m of water; absent = unrated (no rating check). */
  rating_m?: number;
  series?: string;
  nominal?: string;
  material?: string;
}

export interface ParsedCatalogue {
  currency: string;
  candidates: SizingCandidate[];
  /** One message per bad item, naming `items[i].field`; empty when the catalogue is usable. */
  errors: string[];
}

/** Key of a catalogue pipe item (also the price-list item code of that pipe). @example pipeKey('pvc-sch40', '1"') // 'pvc-sch40/1"' */
export function pipeKey(series: string, nominal: string): string {
  return `${series}/${nominal}`;
}

/**
 * Candidate from one catalogue series and size at a price (undefined for an unknown size).
 * @example catalogueCandidate('pe-sidr9', '1"', 1.9, 'hazen-williams')?.roughness // 140
 */
export function catalogueCandidate(
  series: string,
  nominal: string,
  price_per_m: number,
  headloss: 'hazen-williams' | 'darcy-weisbach' = 'hazen-williams',
): SizingCandidate | undefined {
  const s = pipeSeries.find((p) => p.id === series);
  const size = findPipeSize(series, nominal);
  if (!s || !size) return undefined;
  return {
    key: pipeKey(series, nominal),
    label: `${s.label} ${nominal}`,
    diameter_m: size.id_m,
    price_per_m,
    roughness: defaultRoughness(s.material, headloss),
    rating_m: size.rating_m,
    series,
    nominal,
    material: s.material,
  };
}

function num(v: unknown): v is number {
  return typeof v === 'number' && Number.isFinite(v);
}

/**
 * Parse and check a priced catalogue (untrusted JSON). Bad items are reported, not guessed.
 * @param raw the parsed JSON
 * @param headloss the document's headloss law (picks the default roughness of catalogue items)
 */
export function parsePriceCatalogue(raw: unknown, headloss: 'hazen-williams' | 'darcy-weisbach' = 'hazen-williams'): ParsedCatalogue {
  const errors: string[] = [];
  const candidates: SizingCandidate[] = [];
  if (typeof raw !== 'object' || raw === null || !Array.isArray((raw as { items?: unknown }).items)) {
    return { currency: 'USD', candidates, errors: ['items: must be a list of priced pipe items'] };
  }
  const obj = raw as { currency?: unknown; items: unknown[] };
  const currency = typeof obj.currency === 'string' && obj.currency.trim() ? obj.currency.trim() : 'USD';
  const seen = new Set<string>();
  obj.items.forEach((item, i) => {
    const at = `items[${i}]`;
    if (typeof item !== 'object' || item === null) {
      errors.push(`${at}: must be an object`);
      return;
    }
    const it = item as Record<string, unknown>;
    if (!num(it['price_per_m']) || (it['price_per_m'] as number) < 0) {
      errors.push(`${at}.price_per_m: must be a non-negative number (got ${JSON.stringify(it['price_per_m'])})`);
      return;
    }
    const price = it['price_per_m'] as number;
    let cand: SizingCandidate | undefined;
    if (it['series'] !== undefined || it['nominal'] !== undefined) {
      if (typeof it['series'] !== 'string' || !pipeSeries.some((s) => s.id === it['series'])) {
        errors.push(`${at}.series: unknown pipe series ${JSON.stringify(it['series'])} (see engine/pipe-catalogue.ts)`);
        return;
      }
      cand = catalogueCandidate(it['series'], String(it['nominal']), price, headloss);
      if (!cand) {
        errors.push(`${at}.nominal: ${JSON.stringify(it['nominal'])} is not a size of ${it['series']}`);
        return;
      }
    } else {
      if (typeof it['id'] !== 'string' || !it['id'].trim()) {
        errors.push(`${at}.id: a custom item needs an id (or give series and nominal)`);
        return;
      }
      if (!num(it['diameter_m']) || (it['diameter_m'] as number) <= 0) {
        errors.push(`${at}.diameter_m: must be a positive number (got ${JSON.stringify(it['diameter_m'])})`);
        return;
      }
      for (const f of ['roughness', 'rating_m'] as const) {
        if (it[f] !== undefined && (!num(it[f]) || (it[f] as number) <= 0)) {
          errors.push(`${at}.${f}: must be a positive number (got ${JSON.stringify(it[f])})`);
          return;
        }
      }
      cand = {
        key: it['id'],
        label: typeof it['label'] === 'string' ? it['label'] : it['id'],
        diameter_m: it['diameter_m'] as number,
        price_per_m: price,
        roughness: it['roughness'] as number | undefined,
        rating_m: it['rating_m'] as number | undefined,
        material: typeof it['material'] === 'string' ? it['material'] : undefined,
      };
    }
    if (seen.has(cand.key)) {
      errors.push(`${at}: ${cand.key} is listed twice`);
      return;
    }
    seen.add(cand.key);
    candidates.push(cand);
  });
  if (errors.length === 0 && candidates.length === 0) errors.push('items: the catalogue has no priced pipe');
  return { currency, candidates, errors };
}
