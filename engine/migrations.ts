/**
 * Saved designs keep opening: a document written under an older version of the format is brought
 * up to the current one (SCHEMA_VERSION in ./document-schema) by the steps below, one version at a
 * time, before the schema checks it. The server migrates what it loads and what it is sent; the
 * Layout's import and the CLI go through the same path (parseDocument in ./validate).
 *
 * Adding a step (a rename or reshape): bump SCHEMA_VERSION and NETWORK_SCHEMA, write
 * `STEPS[n]` turning a version-n document into version n+1 (a pure function on plain JSON: copy,
 * never mutate), and add a version-n document to spec/engine/migrations.spec.ts.
 *
 * @example
 * migrateDocument({ nodes: [], links: [] }) // { ok: true, doc: { schema: 'runnel.network/1', headloss: 'hazen-williams', … }, from: 0 }
 */
import { NETWORK_SCHEMA, SCHEMA_VERSION } from './document-schema';

type Json = Record<string, unknown>;

/** STEPS[n]: a version-n document → version n+1 (the `schema` tag is set by migrateDocument). */
const STEPS: Record<number, (doc: Json) => Json> = {
  // Version 0: documents written before the format carried a version (the engine and CLI accepted
  // them without `schema`, and without `headloss` meaning Hazen-Williams).
  0: (doc) => ({ ...doc, headloss: doc['headloss'] ?? 'hazen-williams' }),
};

const TAG = /^runnel\.network\/(\d{1,6})$/;

/**
 * The format version a document says it is written in: 0 when it has no `schema`, null when the
 * tag is not ours.
 * @example documentVersion({ schema: 'runnel.network/1' }) // 1
 */
export function documentVersion(doc: Json): number | null {
  const tag = doc['schema'];
  if (tag === undefined) return 0;
  const m = typeof tag === 'string' ? TAG.exec(tag) : null;
  return m ? Number(m[1]) : null;
}

export type Migration = { ok: true; doc: unknown; from: number } | { ok: false; message: string };

/**
 * Bring `raw` to the current version. Anything that is not an object, or is already current, is
 * returned as it is (the schema then judges it); a tag that is not ours or is newer than this
 * program fails with a message for the `schema` field.
 */
export function migrateDocument(raw: unknown): Migration {
  if (typeof raw !== 'object' || raw === null || Array.isArray(raw)) return { ok: true, doc: raw, from: SCHEMA_VERSION };
  let doc = raw as Json;
  const from = documentVersion(doc);
  if (from === null)
    return { ok: false, message: `must be "${NETWORK_SCHEMA}" or an earlier runnel.network version (got ${JSON.stringify(doc['schema'])?.slice(0, 60)})` };
  if (from > SCHEMA_VERSION)
    return { ok: false, message: `"runnel.network/${from}" is newer than this program reads ("${NETWORK_SCHEMA}"); update Runnel to open it` };
  if (from === SCHEMA_VERSION) return { ok: true, doc, from };
  for (let v = from; v < SCHEMA_VERSION; v++) {
    const step = STEPS[v];
    if (!step) return { ok: false, message: `no migration from version ${v} (a bug: every version needs a step)` };
    doc = step(doc);
  }
  return { ok: true, doc: { ...doc, schema: NETWORK_SCHEMA }, from };
}
