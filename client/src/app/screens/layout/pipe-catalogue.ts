import { defaultRoughness, findPipeSize, pipeSeries, pipeSizes } from '../../../../../engine/index';
import type { HeadlossModel, PipeLink } from '../../../../../engine/network-document';
import { formatQuantity, UnitSystem } from '../../../../../engine/units';

/** A pipe series as the Properties panel lists it. */
export interface SeriesOption {
  id: string;
  label: string;
  material: string;
}
/** A nominal size in a series: what choosing it writes onto the pipe (SI). */
export interface SizeOption {
  nominal: string;
  label: string;
  diameter_m: number;
  roughness: number;
  rating_m: number;
}

/**
 * The engine's pipe catalogue (engine/pipe-catalogue.ts) shaped for the form. The data lives in
 * the engine only.
 */
export function catalogueSeries(): SeriesOption[] {
  return pipeSeries.map((s) => ({ id: s.id, label: s.label, material: s.material }));
}

export function catalogueSizes(seriesId: string, headloss: HeadlossModel, units: UnitSystem = 'us'): SizeOption[] {
  const series = pipeSeries.find((s) => s.id === seriesId);
  if (!series) return [];
  const roughness = defaultRoughness(series.material, headloss);
  return pipeSizes(seriesId).map((s) => ({
    nominal: s.nominal,
    label: `${s.nominal} · ID ${formatQuantity('diameter', s.id_m, units)} · ${formatQuantity('pressure', s.rating_m, units, 0)}`,
    diameter_m: s.id_m,
    roughness,
    rating_m: s.rating_m,
  }));
}

/** The catalogue fields of a pipe of `seriesId`/`nominal`, or {} when the catalogue lacks it. */
export function catalogueFields(seriesId: string, nominal: string, headloss: HeadlossModel): Partial<PipeLink> {
  const series = pipeSeries.find((s) => s.id === seriesId);
  const size = findPipeSize(seriesId, nominal);
  if (!series || !size) return {};
  return {
    series: seriesId,
    nominal,
    material: series.material,
    diameter_m: size.id_m,
    roughness: defaultRoughness(series.material, headloss),
    rating_m: size.rating_m,
  };
}
