/**
 * A quick yes for the common case of the schema check (./validate): a large network is nearly all
 * plain tees and pipes, and running each through zod's discriminated unions took about two thirds
 * of validating a 10,000-tee grid (and more in a fresh process, before the JIT has warmed zod).
 * `quickValid(doc)` answers true only when the schema would accept the document: the document's
 * own fields and every element that is not a plain tee or pipe go through the schema's own parts;
 * a tee or pipe is accepted here only when each field it has of the schema's is one this file
 * checks, holding a value the schema accepts (same bounds from ./bounds); unknown fields are
 * ignored, as the schema ignores them. Anything else (a missing field, a wrong type, a field this
 * file does not check) is left to zod: false sends the caller to the full schema parse,
 * whose messages (element and field named) are then exactly those of before.
 * `spec/engine/validate-quick.spec.ts` checks that it never says yes where the schema says no.
 */
import { z } from 'zod';
import { BOUNDS, MAX_ELEMENTS, MAX_ID_LENGTH, MAX_NAME_LENGTH, type Bound } from './bounds';
import { networkDocumentSchema, schemaParts } from './document-schema';

/** The document without its element lists (those are counted here and checked element by element). */
let documentFields: z.ZodType | null = null;

/** Built on first use: a fresh process that never validates pays nothing for it. */
function documentFieldsSchema(): z.ZodType {
  documentFields ??= networkDocumentSchema.omit({ nodes: true, links: true });
  return documentFields;
}

// what ./document-schema's quantity(), id, name and flag accept
function inBound(v: unknown, b: Bound): boolean {
  return typeof v === 'number' && Number.isFinite(v) && (b.above ? v > b.min : v >= b.min) && v <= b.max;
}
function isId(v: unknown): boolean {
  if (typeof v !== 'string' || v.length > MAX_ID_LENGTH) return false;
  const c = v.charCodeAt(0);
  return (c > 32 && c < 127) || v.trim() !== ''; // a printable ASCII first character is not blank
}
function isName(v: unknown): boolean {
  return typeof v === 'string' && v.length <= MAX_NAME_LENGTH;
}

const { elevation_m, coordinate_m, demand_m3s, length_m, diameter_m, roughness, minor_loss, rating_m, cover_m } = BOUNDS;

/**
 * The schema's fields of a tee and of a pipe that plainTee / plainPipe know: checked (as the
 * schema checks them) or required absent (the schema checks those with rules of its own). Unknown
 * fields are ignored, as by the schema. Should the schema gain a field not listed here, the quick
 * path for that kind switches itself off (see quickPathFor) and zod decides, as before.
 */
export const TEE_FIELDS = [
  'id',
  'name',
  'elevation_m',
  'x_m',
  'y_m',
  'notes',
  'elevation_source',
  'elevation_from',
  'kind',
  'demand_m3s',
  'pattern',
  'air_valve',
  'drain',
  'demand_model',
];
export const PIPE_FIELDS = [
  'id',
  'name',
  'from',
  'to',
  'vertices',
  'notes',
  'kind',
  'length_m',
  'diameter_m',
  'roughness',
  'minor_loss',
  'material',
  'series',
  'nominal',
  'rating_m',
  'profile',
  'cover_m',
  'closed',
  'air_valves_m',
  'drains_m',
  'length_source',
];

/** Does every field of the schema's shape appear in `known`? (computed once per kind) */
function quickPathFor(shape: Record<string, unknown>, known: string[]): boolean {
  return Object.keys(shape).every((key) => known.includes(key));
}
let teeQuick: boolean | null = null;
let pipeQuick: boolean | null = null;

// each field read by name (not through a table of keys and checks: V8 makes those reads and calls
// megamorphic, three times slower)
function plainTee(el: Record<string, unknown>): boolean {
  return (
    el.kind === 'tee' &&
    isId(el.id) &&
    inBound(el.elevation_m, elevation_m) &&
    inBound(el.demand_m3s, demand_m3s) &&
    (el.name === undefined || isName(el.name)) &&
    (el.x_m === undefined || inBound(el.x_m, coordinate_m)) &&
    (el.y_m === undefined || inBound(el.y_m, coordinate_m)) &&
    el.notes === undefined &&
    el.elevation_source === undefined &&
    el.elevation_from === undefined &&
    el.pattern === undefined &&
    el.air_valve === undefined &&
    el.drain === undefined &&
    el.demand_model === undefined
  );
}

function plainPipe(el: Record<string, unknown>): boolean {
  return (
    el.kind === 'pipe' &&
    isId(el.id) &&
    isId(el.from) &&
    isId(el.to) &&
    inBound(el.length_m, length_m) &&
    inBound(el.diameter_m, diameter_m) &&
    inBound(el.roughness, roughness) &&
    (el.name === undefined || isName(el.name)) &&
    (el.minor_loss === undefined || inBound(el.minor_loss, minor_loss)) &&
    (el.material === undefined || isName(el.material)) &&
    (el.series === undefined || isName(el.series)) &&
    (el.nominal === undefined || isName(el.nominal)) &&
    (el.rating_m === undefined || inBound(el.rating_m, rating_m)) &&
    (el.cover_m === undefined || inBound(el.cover_m, cover_m)) &&
    (el.closed === undefined || typeof el.closed === 'boolean') &&
    el.vertices === undefined &&
    el.notes === undefined &&
    el.profile === undefined &&
    el.air_valves_m === undefined &&
    el.drains_m === undefined &&
    el.length_source === undefined
  );
}

function isRecord(v: unknown): v is Record<string, unknown> {
  return typeof v === 'object' && v !== null && !Array.isArray(v);
}

/** Would the schema accept this node? (a plain tee here, anything else through the schema's node part) */
export function quickNodeValid(el: unknown): boolean {
  teeQuick ??= quickPathFor(schemaParts.teeNode.shape, TEE_FIELDS);
  if (teeQuick && isRecord(el) && plainTee(el)) return true;
  return schemaParts.node.safeParse(el).success;
}

/** Would the schema accept this link? (a plain pipe here, anything else through the schema's link part) */
export function quickLinkValid(el: unknown): boolean {
  pipeQuick ??= quickPathFor(schemaParts.pipeLink.shape, PIPE_FIELDS);
  if (pipeQuick && isRecord(el) && plainPipe(el)) return true;
  return schemaParts.link.safeParse(el).success;
}

/**
 * True only when networkDocumentSchema accepts `doc` (false: ask the schema, which may still accept it).
 * @example quickValid(loopedGrid(40, 250)) // true, in a few ms
 */
export function quickValid(doc: unknown): boolean {
  try {
    if (!documentFieldsSchema().safeParse(doc).success) return false;
    const { nodes, links } = doc as { nodes: unknown; links: unknown };
    if (!Array.isArray(nodes) || !Array.isArray(links) || nodes.length > MAX_ELEMENTS || links.length > MAX_ELEMENTS) return false;
    for (let i = 0; i < nodes.length; i++) if (!quickNodeValid(nodes[i])) return false;
    for (let i = 0; i < links.length; i++) if (!quickLinkValid(links[i])) return false;
    return true;
  } catch {
    return false; // a getter that throws, a proxy: the schema's parse reports it as before
  }
}
