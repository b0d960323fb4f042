/**
 * The engine's door for an untrusted network document (JSON from a browser, a file or the API):
 * migrate an older version (./migrations), check every field against the schema
 * (./document-schema) and then the cross-element rules (./physical-checks). Problems come back as
 * `invalid` warnings naming the element and field:
 * `{ code: 'invalid', element: 'P3', message: 'P3.diameter_m: must be a positive number (got 0)' }`.
 * Unknown fields are accepted and kept. A document with no source or tank is valid (a design in
 * progress); solve() reports `no-fixed-head`.
 */
import type { z } from 'zod';
import { networkDocumentSchema } from './document-schema';
import { migrateDocument } from './migrations';
import type { NetworkDocument } from './network-document';
import { physicalProblems, type DocumentProblem } from './physical-checks';
import { quickValid } from './validate-quick';
import type { Warning } from './warnings';

/** At most this many problems are listed (a garbage document could have 100,000). */
const MAX_PROBLEMS = 100;

export type { DocumentProblem };

export type DocumentParse =
  | { ok: true; doc: NetworkDocument; /** version the input was written in */ from: number; warnings: []; problems: [] }
  | { ok: false; /** as `invalid` warnings */ warnings: Warning[]; /** the same with their paths (for an API's field errors) */ problems: DocumentProblem[] };

/**
 * Migrate and check `raw`. On success `doc` is the current-version document (the input itself
 * when it was current: unknown fields kept).
 * @example parseDocument({ nodes: [], links: [] }) // { ok: true, doc: { schema: 'runnel.network/1', headloss: 'hazen-williams', … }, from: 0, warnings: [] }
 */
export function parseDocument(raw: unknown): DocumentParse {
  const migrated = migrateDocument(raw);
  if (!migrated.ok) return failed([{ path: ['schema'], element: null, message: `document.schema: ${migrated.message}` }]);
  // most documents are plain tees and pipes: a quick yes skips zod, a no asks it for the messages
  if (!quickValid(migrated.doc)) {
    const parsed = networkDocumentSchema.safeParse(migrated.doc);
    if (!parsed.success) return failed(parsed.error.issues.map((issue) => issueProblem(issue, migrated.doc)));
  }
  const doc = migrated.doc as NetworkDocument;
  const problems = physicalProblems(doc);
  if (problems.length) return failed(problems);
  return { ok: true, doc, from: migrated.from, warnings: [], problems: [] };
}

/**
 * Structural validation: [] when the document can be compiled and solved.
 * @example validateDocument({ schema: 'runnel.network/1', headloss: 'hazen-williams', nodes: [], links: [] }) // []
 */
export function validateDocument(doc: unknown): Warning[] {
  return parseDocument(doc).warnings;
}

function failed(all: DocumentProblem[]): DocumentParse {
  const more = all.length - MAX_PROBLEMS;
  const problems =
    more > 0 ? [...all.slice(0, MAX_PROBLEMS), { path: [], element: null, message: `document: … and ${more} more problem${more === 1 ? '' : 's'}` }] : all;
  return { ok: false, problems, warnings: problems.map((p) => ({ code: 'invalid', element: p.element, message: p.message })) };
}

/** A schema issue with its message as "P3.diameter_m: must be a positive number (got 0)". */
function issueProblem(issue: z.core.$ZodIssue, doc: unknown): DocumentProblem {
  const path = issue.path;
  let element: string | null = null;
  let rest = path;
  let prefix = 'document';
  if ((path[0] === 'nodes' || path[0] === 'links') && typeof path[1] === 'number') {
    const id = at(doc, path.slice(0, 2).concat('id'));
    if (typeof id === 'string' && id.trim() !== '' && id.length <= 100 && path[2] !== 'id') {
      element = id;
      prefix = id;
      rest = path.slice(2);
    }
  }
  const field = rest.map((p) => (typeof p === 'number' ? `[${p}]` : `.${String(p)}`)).join('');
  const value = at(doc, path);
  const got = typeof value === 'object' && value !== null ? '' : ` (got ${show(value)})`;
  return { path: path.map((p) => (typeof p === 'number' ? p : String(p))), element, message: `${prefix}${field}: ${issue.message}${got}` };
}

function at(doc: unknown, path: readonly PropertyKey[]): unknown {
  let v: unknown = doc;
  for (const key of path) {
    if (typeof v !== 'object' || v === null) return undefined;
    v = (v as Record<PropertyKey, unknown>)[key];
  }
  return v;
}

function show(v: unknown): string {
  if (v === undefined) return 'nothing';
  if (typeof v === 'string') return JSON.stringify(v.length > 40 ? v.slice(0, 40) + '…' : v);
  return String(v);
}
