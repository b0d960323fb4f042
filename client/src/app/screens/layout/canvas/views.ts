import type Konva from 'konva';
import type { NetworkLink, NetworkNode } from '../../../../../../engine/network-document';
import type { SteadyResult } from '../../../../../../engine/index';
import type { ServiceStates } from '../../../../../../engine/service-state';
import type { UnitSystem } from '../../../../../../engine/units';

/** What the results overlay needs besides the document. */
export interface OverlayInput {
  results: SteadyResult | null;
  /** What the results mean per element (engine/service-state.ts), from the same solve. */
  service: ServiceStates | null;
  units: UnitSystem;
  warnings: Map<string, string[]>;
  show: boolean;
}

/** The Konva shapes of one node: symbol, selection halo, name, and its results marks. */
export interface NodeView {
  rec: NetworkNode;
  group: Konva.Group;
  symbol: Konva.Group;
  halo: Konva.Rect;
  label: Konva.Text;
  overlay: Konva.Group;
  /** State mark and warning badge (scaled with the symbol) and the state badge (placed with the name). */
  marks: Konva.Group;
  tag: Konva.Label | null;
  tagText: string;
  scale: number;
  /** The badge reports trouble (short, near or over rating): its label is placed before others. */
  urgent: boolean;
  /** The kind's symbolKey when the symbol was drawn. */
  symbolKey: string;
}

/** The Konva shapes of one link: line, halo, mid-line symbol, and its results marks. */
export interface LinkView {
  rec: NetworkLink;
  from: NetworkNode | undefined;
  to: NetworkNode | undefined;
  group: Konva.Group;
  line: Konva.Line;
  halo: Konva.Line;
  mid: Konva.Group;
  overlay: Konva.Group;
  /** A white dashed stripe down the line's middle, shown when the pipe runs over the speed limit. */
  hatch: Konva.Line;
  /** The pipe's size, placed beside the line by the label layout. */
  note: Konva.Text | null;
  noteText: string;
}

/** The scene's element views by id, shared by the layers that decorate them. */
export interface SceneViews {
  nodes: Map<string, NodeView>;
  links: Map<string, LinkView>;
}
