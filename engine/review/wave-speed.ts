/**
 * Pressure-wave speed in a thin-walled pipe full of water (Korteweg, textbook; REFERENCES.md, M):
 *   a = √( (K/ρ) / (1 + (K/E)·(D/e)) )
 * K bulk modulus of water, ρ its density, E the wall's elastic modulus, D the inside diameter and
 * e the wall thickness. Material moduli are mid-range values from memory (REFERENCES.md, M):
 * PVC 2.8–3.3 GPa, PE 0.8–1.1 GPa. A pipe of unknown wall is taken as rigid (a = √(K/ρ)), the
 * largest wave speed and so the largest surge: the safe side.
 *
 * @example
 * kortewegWaveSpeed({ modulus_pa: 3.0e9, diameterToWall: 16 }) // ≈ 416 m/s (PVC DR 18: ID/e = 16)
 */
import { findPipeSize, pipeSeries } from '../pipe-catalogue';
import type { PipeLink } from '../network-document';

/** Bulk modulus of water, Pa (about 2.2 GPa near 20 °C; REFERENCES.md, M). */
export const WATER_BULK_MODULUS_PA = 2.2e9;
/** Density of water, kg/m³ (998 at 20 °C, standard tables). */
export const WATER_DENSITY_KGM3 = 998;
/** Elastic modulus of the wall by material, Pa (mid-range, REFERENCES.md, M). */
export const WALL_MODULUS_PA: Record<string, number> = { pvc: 3.0e9, pe: 0.9e9 };

export interface WaveSpeedInput {
  /** Wall elastic modulus E, Pa; Infinity for a rigid pipe. */
  modulus_pa: number;
  /** Inside diameter over wall thickness, D/e. */
  diameterToWall: number;
}

/** Korteweg wave speed, m/s. */
export function kortewegWaveSpeed(input: WaveSpeedInput, K = WATER_BULK_MODULUS_PA, rho = WATER_DENSITY_KGM3): number {
  const stiffness = Number.isFinite(input.modulus_pa) ? (K / input.modulus_pa) * input.diameterToWall : 0;
  return Math.sqrt(K / rho / (1 + stiffness));
}

export interface PipeWave {
  waveSpeed_ms: number;
  /** How the wall was known: from the catalogue series and size, or assumed rigid. */
  basis: 'catalogue' | 'rigid';
  diameterToWall?: number;
}

/**
 * Wave speed for a document pipe: wall and inside diameter from its catalogue series and nominal size
 * (engine/pipe-catalogue.ts), modulus from its material; rigid when either is unknown.
 */
export function pipeWaveSpeed(pipe: PipeLink): PipeWave {
  const size = pipe.series && pipe.nominal ? findPipeSize(pipe.series, pipe.nominal) : undefined;
  const material = pipe.material ?? pipeSeries.find((s) => s.id === pipe.series)?.material;
  const modulus = material ? WALL_MODULUS_PA[material] : undefined;
  if (!size || modulus === undefined || !(size.wall_m > 0)) {
    return { waveSpeed_ms: kortewegWaveSpeed({ modulus_pa: Infinity, diameterToWall: 0 }), basis: 'rigid' };
  }
  const diameterToWall = size.id_m / size.wall_m;
  return { waveSpeed_ms: kortewegWaveSpeed({ modulus_pa: modulus, diameterToWall }), basis: 'catalogue', diameterToWall };
}
