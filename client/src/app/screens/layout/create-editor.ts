import type { NetworkDocument } from '../../../../../engine/network-document';
import { Editor } from './editor/editor';
import { STANDARD_TOOLS } from './tools';
import type { ToolRegistry } from './tools/tool';

/** An editor with the standard tools (and any extra ones a feature registers). */
export function createEditor(doc?: NetworkDocument, width = 800, height = 600, extraTools: ToolRegistry = {}): Editor {
  return new Editor({ ...STANDARD_TOOLS, ...extraTools }, doc, width, height);
}
