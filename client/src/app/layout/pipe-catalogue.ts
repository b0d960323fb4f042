import * as engine from '../../../../engine/index';

/** A pipe series as the Properties panel lists it. */
export interface SeriesOption { id: string; label: string; material?: string }
/** A nominal size in a series: what choosing it writes onto the pipe (SI). */
export interface SizeOption { nominal: string; label: string; diameter_m: number; roughness?: number; rating_m?: number }

/** The catalogue functions the engine exports (engine/pipe-catalogue.ts). */
interface CatalogueApi {
  pipeSeries: unknown;
  pipeSizes: (seriesId: string) => unknown;
  defaultRoughness: (material: string, headloss?: string) => unknown;
}

const api = engine as unknown as Partial<CatalogueApi>;

function str(o: Record<string, unknown>, ...keys: string[]): string | undefined {
  for (const k of keys) if (typeof o[k] === 'string') return o[k] as string;
  return undefined;
}

function num(o: Record<string, unknown>, ...keys: string[]): number | undefined {
  for (const k of keys) if (typeof o[k] === 'number' && Number.isFinite(o[k])) return o[k] as number;
  return undefined;
}

/**
 * The engine's pipe catalogue, read through its documented names, or null while the engine does
 * not provide one (the panel then offers the inside diameter only). The data lives in the engine
 * only; this file adapts its shape for the form.
 */
export function catalogueSeries(): SeriesOption[] | null {
  const raw = typeof api.pipeSeries === 'function' ? (api.pipeSeries as () => unknown)() : api.pipeSeries;
  if (!Array.isArray(raw)) return null;
  return raw
    .filter((s): s is Record<string, unknown> => !!s && typeof s === 'object')
    .map((s) => {
      const id = str(s, 'id', 'seriesId') ?? '';
      return { id, label: str(s, 'label', 'name', 'title') ?? id, material: str(s, 'material') };
    })
    .filter((s) => s.id);
}

export function catalogueSizes(seriesId: string, headloss: string): SizeOption[] {
  if (typeof api.pipeSizes !== 'function') return [];
  const raw = api.pipeSizes(seriesId);
  if (!Array.isArray(raw)) return [];
  const series = catalogueSeries()?.find((s) => s.id === seriesId);
  return raw
    .filter((s): s is Record<string, unknown> => !!s && typeof s === 'object')
    .map((s) => {
      const nominal = str(s, 'nominal', 'size', 'id') ?? '';
      const diameter = num(s, 'inside_diameter_m', 'id_m', 'diameter_m', 'insideDiameter_m') ?? 0;
      let roughness = headloss === 'darcy-weisbach' ? num(s, 'roughness_mm', 'epsilon_mm') : num(s, 'hazen_c', 'c', 'C', 'hazenWilliamsC');
      if (roughness === undefined && typeof api.defaultRoughness === 'function') {
        const r = api.defaultRoughness(str(s, 'material') ?? series?.material ?? seriesId, headloss);
        if (typeof r === 'number') roughness = r;
      }
      return { nominal, label: str(s, 'label', 'name') ?? nominal, diameter_m: diameter, roughness, rating_m: num(s, 'rating_m', 'pressureRating_m') };
    })
    .filter((s) => s.nominal && s.diameter_m > 0);
}
