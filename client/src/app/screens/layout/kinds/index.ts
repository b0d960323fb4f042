import type { LinkKind, NetworkLink, NetworkNode, NodeKind } from '../../../../../../engine/network-document';
import type { FieldSpec, LinkKindDef, NodeKindDef } from './kind-types';
import { outletKind } from './outlet-kind';
import { pipeKind } from './pipe-kind';
import { pumpKind } from './pump-kind';
import { sourceKind } from './source-kind';
import { tankKind } from './tank-kind';
import { teeKind } from './tee-kind';
import { valveKind } from './valve-kind';

export * from './kind-types';

/** Every node kind's behaviour, by kind. */
export const NODE_KINDS: Record<NodeKind, NodeKindDef> = {
  source: sourceKind as unknown as NodeKindDef,
  tank: tankKind as unknown as NodeKindDef,
  tee: teeKind as unknown as NodeKindDef,
  outlet: outletKind as unknown as NodeKindDef,
};

/** Every link kind's behaviour, by kind. */
export const LINK_KINDS: Record<LinkKind, LinkKindDef> = {
  pipe: pipeKind as unknown as LinkKindDef,
  pump: pumpKind as unknown as LinkKindDef,
  valve: valveKind as unknown as LinkKindDef,
};

export function isNodeKind(kind: string): kind is NodeKind {
  return kind in NODE_KINDS;
}

export function isLinkKind(kind: string): kind is LinkKind {
  return kind in LINK_KINDS;
}

export function fieldsFor(element: NetworkNode | NetworkLink): FieldSpec[] {
  const def = isNodeKind(element.kind) ? NODE_KINDS[element.kind as NodeKind] : LINK_KINDS[element.kind as LinkKind];
  return def.fields.filter((f) => !f.when || f.when(element));
}

/** Next free id with the kind's prefix: T1, T2… (numbers after the highest in use). */
export function nextId(prefix: string, taken: Iterable<string>): string {
  let max = 0;
  const re = new RegExp('^' + prefix + '(\\d+)$');
  for (const id of taken) {
    const m = re.exec(id);
    if (m) max = Math.max(max, Number(m[1]));
  }
  return prefix + (max + 1);
}

/** Read a dotted path ('demand_model.type') from a record. */
export function readPath(obj: object, path: string): unknown {
  let cur: unknown = obj;
  for (const part of path.split('.')) {
    if (cur === null || typeof cur !== 'object') return undefined;
    cur = (cur as Record<string, unknown>)[part];
  }
  return cur;
}

/** The top-level patch that sets a dotted path (nested objects copied, not mutated). */
export function patchForPath(obj: object, path: string, value: unknown): Record<string, unknown> {
  const [head, ...rest] = path.split('.');
  if (rest.length === 0) return { [head]: value };
  const inner = (obj as Record<string, unknown>)[head];
  const base = inner && typeof inner === 'object' ? (inner as object) : {};
  return { [head]: { ...base, ...patchForPath(base, rest.join('.'), value) } };
}
