/**
 * The network document's TypeScript types, inferred from its schema (./document-schema, the one
 * description of the format; field documentation is there). SI units inside.
 *
 * @example
 * const doc: NetworkDocument = {
 *   schema: 'runnel.network/1', headloss: 'hazen-williams',
 *   nodes: [{ id: 'T1', kind: 'tank', elevation_m: 41, diameter_m: 1.6, level_m: 1.2, min_level_m: 0.1, max_level_m: 1.5 }],
 *   links: [],
 * };
 */
import type { z } from 'zod';
import type { networkDocumentSchema, schemaParts } from './document-schema';

export { NETWORK_SCHEMA, SCHEMA_VERSION, OUTLET_TYPES, VALVE_TYPES, LENGTH_SOURCES, HEADLOSS_MODELS, SURVEY_FORMATS } from './document-schema';

type Parts = typeof schemaParts;

export type NetworkDocument = z.infer<typeof networkDocumentSchema>;
export type HeadlossModel = NetworkDocument['headloss'];

export type SourceNode = z.infer<Parts['sourceNode']>;
export type TankNode = z.infer<Parts['tankNode']>;
export type TeeNode = z.infer<Parts['teeNode']>;
export type OutletNode = z.infer<Parts['outletNode']>;
export type NetworkNode = z.infer<Parts['node']>;
export type NodeKind = NetworkNode['kind'];
export type OutletType = NonNullable<OutletNode['outlet_type']>;
export type DemandModel = z.infer<Parts['demandModel']>;

export type PipeLink = z.infer<Parts['pipeLink']>;
export type PumpLink = z.infer<Parts['pumpLink']>;
export type ValveLink = z.infer<Parts['valveLink']>;
export type NetworkLink = z.infer<Parts['link']>;
export type LinkKind = NetworkLink['kind'];
export type ValveType = ValveLink['valve_type'];
export type PumpControl = z.infer<Parts['pumpControl']>;
export type LengthSource = NonNullable<PipeLink['length_source']>;

/** Editor-only data (ignored by the engine). */
export type DocumentLayout = z.infer<Parts['layout']>;
/** The site backdrop image placed in world metres (doc.layout.backdrop). */
export type Backdrop = z.infer<Parts['backdrop']>;
/** A survey point in local site metres (doc.layout.survey.points). */
export type SurveyPoint = z.infer<Parts['surveyPoint']>;

/**
 * A new, empty document (a fresh object each call, so callers may not share one by accident).
 * @example emptyDocument().nodes // []
 */
export function emptyDocument(): NetworkDocument {
  return { schema: 'runnel.network/1', headloss: 'hazen-williams', nodes: [], links: [] };
}
