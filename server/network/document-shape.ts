/**
 * The shape check of an incoming network document, before the engine's own validateDocument:
 * top-level fields and, for every node and link, the fields that identify it. Messages name the
 * element ("node O1: elevation_m …") so a 400 tells the user what to fix.
 */
import { z } from 'zod';
import type { Warning } from '../../engine';
import type { FieldError } from '../errors';
import { issuePath } from '../errors';

const finite = z.number({ error: 'must be a number' }).finite('must be a finite number');
const id = z.string({ error: 'must be a string' }).min(1, 'must not be empty').max(100);

const nodeShape = z.looseObject({
  id,
  kind: z.enum(['source', 'tank', 'tee', 'outlet'], { error: 'must be source, tank, tee or outlet' }),
  elevation_m: finite,
});
const linkShape = z.looseObject({
  id,
  kind: z.enum(['pipe', 'pump', 'valve'], { error: 'must be pipe, pump or valve' }),
  from: id,
  to: id,
});

export const documentShape = z.looseObject({
  schema: z.literal('runnel.network/1', { error: 'must be "runnel.network/1"' }),
  headloss: z.enum(['hazen-williams', 'darcy-weisbach'], { error: 'must be hazen-williams or darcy-weisbach' }),
  nodes: z.array(nodeShape, { error: 'must be an array' }).max(20000),
  links: z.array(linkShape, { error: 'must be an array' }).max(20000),
});

/** The body of PUT /api/projects/:id/network. */
export const saveNetworkBody = z.object({
  version: z.number({ error: 'must be a number' }).int('must be an integer').min(0, 'must be 0 or more'),
  document: z.unknown(),
});

/** Field errors for `doc`'s shape ([] when fine), each naming the element where there is one. */
export function shapeErrors(doc: unknown): FieldError[] {
  const parsed = documentShape.safeParse(doc);
  if (parsed.success) return [];
  return parsed.error.issues.map((issue) => {
    const [list, index, field] = issue.path;
    const path = issuePath(['document', ...issue.path]);
    if ((list === 'nodes' || list === 'links') && typeof index === 'number') {
      const element = elementId(doc, list, index);
      const noun = list === 'nodes' ? 'node' : 'link';
      const label = element ? `${noun} ${element}` : `${noun} #${index + 1}`;
      return { path, ...(element ? { element } : {}), message: `${label}: ${field === undefined ? '' : `${String(field)} `}${issue.message}` };
    }
    return { path, message: `${issuePath(issue.path) || 'document'}: ${issue.message}` };
  });
}

/** Engine warnings of validateDocument as field errors. */
export function engineErrors(warnings: Warning[]): FieldError[] {
  return warnings.map((w) => ({ path: 'document', ...(w.element ? { element: w.element } : {}), message: w.message }));
}

function elementId(doc: unknown, list: 'nodes' | 'links', index: number): string | undefined {
  if (!doc || typeof doc !== 'object' || !(list in doc)) return undefined;
  const items: unknown = (doc as Record<string, unknown>)[list];
  if (!Array.isArray(items)) return undefined;
  const item: unknown = items[index];
  if (item && typeof item === 'object' && 'id' in item && typeof item.id === 'string' && item.id) return item.id;
  return undefined;
}
