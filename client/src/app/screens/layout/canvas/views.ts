import type Konva from 'konva';
import type { NetworkLink, NetworkNode } from '../../../../../../engine/network-document';
import type { SteadyResult } from '../../../../../../engine/index';
import type { UnitSystem } from '../../../../../../engine/units';
import type { Point } from '../editor/geometry';

/** What the results overlay needs besides the document. */
export interface OverlayInput {
  results: SteadyResult | null;
  units: UnitSystem;
  warnings: Map<string, string[]>;
  show: boolean;
}

/** The Konva shapes of one node: symbol, selection halo, name, and its results marks. */
export interface NodeView {
  rec: NetworkNode; group: Konva.Group; symbol: Konva.Group; halo: Konva.Rect; label: Konva.Text; overlay: Konva.Group;
  /** Pressure ring and badge (scaled with the symbol) and the pressure tag (placed with the name). */
  marks: Konva.Group; tag: Konva.Label | null; tagText: string; scale: number;
  /** The kind's symbolKey when the symbol was drawn. */
  symbolKey: string;
}

/** The Konva shapes of one link: line, halo, mid-line symbol, and its results marks. */
export interface LinkView {
  rec: NetworkLink; from: NetworkNode | undefined; to: NetworkNode | undefined; group: Konva.Group; line: Konva.Line; halo: Konva.Line; mid: Konva.Group; overlay: Konva.Group;
  speed: Konva.Text | null; speedText: string; arrowAt: Point | null;
}

/** The scene's element views by id, shared by the layers that decorate them. */
export interface SceneViews {
  nodes: Map<string, NodeView>;
  links: Map<string, LinkView>;
}
