import type { LinkKind, NodeKind } from '../../../../../../engine/network-document';
import { BackdropTool } from './backdrop-tool';
import { CalibrateTool } from './calibrate-tool';
import { LinkTool } from './link-tool';
import { PanTool } from './pan-tool';
import { PlaceTool } from './place-tool';
import { SelectTool } from './select-tool';
import type { ToolRegistry } from './tool';

/**
 * The Layout's standard tools. A feature adds its own by spreading this table with more entries
 * and passing it to `new Editor(tools)` (create-editor.ts); the editor names no tool itself.
 */
export const STANDARD_TOOLS: ToolRegistry = {
  select: (host) => new SelectTool(host),
  pan: (host) => new PanTool(host),
  place: (host, option) => new PlaceTool(host, (option as NodeKind | undefined) ?? 'tee'),
  link: (host, option) => new LinkTool(host, (option as LinkKind | undefined) ?? 'pipe'),
  calibrate: (host) => new CalibrateTool(host),
  backdrop: (host) => new BackdropTool(host),
};
