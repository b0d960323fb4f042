import type { NetworkDocument, NetworkLink, NetworkNode } from '../../../../../../engine/network-document';
import { fromDisplay, Quantity, UnitSystem } from '../../../../../../engine/units';

/**
 * A symbol is drawn from these plain shape descriptions (CSS pixels around the element's centre,
 * screen y down), so kinds stay free of Konva and testable headlessly. The canvas view turns
 * them into Konva shapes.
 */
export type ShapeSpec =
  | { t: 'circle'; x?: number; y?: number; r: number; fill?: string; stroke?: string; sw?: number }
  | { t: 'rect'; x: number; y: number; w: number; h: number; fill?: string; stroke?: string; sw?: number; corner?: number }
  | { t: 'poly'; points: number[]; closed?: boolean; fill?: string; stroke?: string; sw?: number };

/** One row of the properties panel. `key` may be a dotted path ('demand_model.type'). */
export interface FieldSpec {
  key: string;
  label: string;
  type: 'text' | 'number' | 'select' | 'checkbox' | 'pipe-size' | 'schedule' | 'length' | 'curve';
  /** Display conversion through engine/units.ts; absent means a plain number. */
  quantity?: Quantity;
  /** Plain-number unit label (e.g. "K"). */
  suffix?: string;
  options?: { value: string; label: string }[];
  /** Shown for a select when the record lacks the field (the engine's default). */
  fallback?: string;
  /** Bounds in SI. */
  min?: number;
  max?: number;
  required?: boolean;
  /** data-testid of the input: prop-<slug>. */
  testid: string;
  hint?: string;
  when?: (element: NetworkNode | NetworkLink) => boolean;
  /** A hint that depends on the element (where its elevation came from). */
  hintFor?: (element: NetworkNode | NetworkLink) => string | undefined;
  /** The label for this element when it depends on it (a hose bib "gives", a trough "refills"). */
  labelFor?: (element: NetworkNode | NetworkLink) => string;
  /**
   * A field worded in farm terms over stored physics (farm-terms.ts): `read` gives the SI value
   * shown, `write` the patch that stores a typed SI value. Without them the field is `key` itself.
   */
  read?: (element: NetworkNode | NetworkLink) => number | string | undefined;
  write?: (element: NetworkNode | NetworkLink, si: number | undefined) => Record<string, unknown>;
  /** A select worded over stored fields: the patch for the chosen option. */
  choose?: (element: NetworkNode | NetworkLink, value: string) => Record<string, unknown>;
}

export interface NodeKindDef<N extends NetworkNode = NetworkNode> {
  kind: N['kind'];
  label: string;
  /** Id prefix: T → T1, T2… */
  prefix: string;
  /** Hit radius around the centre, CSS px. */
  hitRadiusPx: number;
  /** A new record; numbers from the kind's `defaults` for `units` (round in that system), stored SI. */
  create(id: string, x_m: number, y_m: number, units?: UnitSystem): N;
  symbol(node: N): ShapeSpec[];
  /** The fields the symbol is drawn from: the canvas redraws a symbol when this string changes. */
  symbolKey?(node: N): string;
  /** Label priority on a crowded plan (lower is placed first; the selection is 0). */
  labelRank: number;
  /** Whether the plan and the results list show this kind's pressure (else its head). */
  showsPressure: boolean;
  /** The pressure the element needs, m of water (0 when it needs none). */
  requiredPressure_m?(node: N): number;
  fields: FieldSpec[];
  /** Messages for combinations of fields that are each valid alone. */
  check?(node: N, doc: NetworkDocument): string[];
}

export interface LinkKindDef<L extends NetworkLink = NetworkLink> {
  kind: L['kind'];
  label: string;
  prefix: string;
  create(id: string, from: string, to: string, vertices: [number, number][], units?: UnitSystem): L;
  /** Stroke of the line. */
  stroke: { colour: string; widthPx: number; dash?: number[] };
  /** Symbol drawn at the middle of the line, rotated along it (pointing from → to); empty for none. */
  midSymbol(link: L): ShapeSpec[];
  /** Whether the plan shows a velocity beside the line (pipes; a pump or valve has no bore of its own). */
  showsVelocity: boolean;
  /** The results list's value for this link: flow and velocity, or what a pump adds. */
  resultText(flow: string, velocity: string, addedHead: string): string;
  fields: FieldSpec[];
  check?(link: L, doc: NetworkDocument): string[];
}

export const INK = '#24323d';
export const PAPER = '#ffffff';
export const WATER = '#cfe6f3';

/** A node, not a link: only nodes have an elevation. */
const isNode = (e: NetworkNode | NetworkLink): e is NetworkNode => 'elevation_m' in e;

export const nameField: FieldSpec = { key: 'name', label: 'Name', type: 'text', testid: 'prop-name' };
export const elevationField: FieldSpec = {
  key: 'elevation_m',
  label: 'Elevation',
  type: 'number',
  quantity: 'elevation',
  required: true,
  min: -500,
  max: 9000,
  testid: 'prop-elevation',
  // Unset shows empty (and is asked for); a guess says where it came from. A source's water
  // surface moves with a first typed elevation (it keeps its height over the ground).
  write: (e, v) => {
    const lift = e.kind === 'source' && e.elevation_source && v !== undefined ? { head_m: v + (e.head_m - e.elevation_m) } : {};
    return { elevation_m: v, elevation_source: undefined, elevation_from: undefined, ...lift };
  },
  read: (e) => (!isNode(e) || e.elevation_source === 'unset' ? undefined : e.elevation_m),
  hintFor: (e) => {
    if (!isNode(e)) return undefined;
    const { elevation_source: src, elevation_from: from } = e;
    return src === 'nearest'
      ? `Copied from ${from ?? 'the nearest element'}: check it`
      : src === 'survey'
        ? `From survey point ${from ?? ''}`.trim()
        : undefined;
  },
};
export const notesField: FieldSpec = { key: 'notes', label: 'Notes', type: 'text', testid: 'prop-notes' };

/**
 * Default values of a kind's new records, written as the round numbers a designer would type in
 * each unit system (10 psi, 70 kPa), with the quantity that converts them to SI.
 */
export type DefaultTable<F extends string> = Record<UnitSystem, Record<F, [Quantity, number]>>;

/** The SI values of a default table for `units`. */
export function siDefaults<F extends string>(table: DefaultTable<F>, units: UnitSystem): Record<F, number> {
  const out = {} as Record<F, number>;
  for (const [key, [q, shown]] of Object.entries(table[units]) as [F, [Quantity, number]][]) out[key] = fromDisplay(q, shown, units);
  return out;
}
