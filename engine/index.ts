/**
 * Public entry of the Runnel hydraulic engine (pure TypeScript: no DOM, no Node APIs).
 * STUB — replaced by the engine implementation.
 */
export * from './network-document';
export * from './units';

export interface Warning { code: string; element: string | null; message: string }

export interface SteadyResult {
  converged: boolean;
  iterations: number;
  nodes: Record<string, { head_m: number; pressure_m: number; demand_m3s: number }>;
  links: Record<string, { flow_m3s: number; velocity_ms: number; headloss_m: number; status: string }>;
  warnings: Warning[];
}

/** Structural validation of an untrusted document: one `invalid` warning per problem, naming element and field. */
export function validateDocument(doc: unknown): Warning[] {
  if (!doc || typeof doc !== 'object') return [{ code: 'invalid', element: null, message: 'document: must be an object' }];
  return [];
}

export function solve(_doc: unknown): SteadyResult {
  return { converged: false, iterations: 0, nodes: {}, links: {}, warnings: [] };
}
