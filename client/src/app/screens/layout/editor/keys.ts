import type { Tool, ToolId } from '../tools/tool';

/** Keyboard shortcuts, shown by the help dialog and handled by `handleEditorKey`. */
export const SHORTCUTS: { keys: string; action: string }[] = [
  { keys: 'V', action: 'Select tool' },
  { keys: 'H', action: 'Pan tool (or hold Space, or drag with the middle button)' },
  { keys: 'P', action: 'Draw a pipe' },
  { keys: 'U', action: 'Draw a pump' },
  { keys: 'L', action: 'Draw a valve' },
  { keys: 'F', action: 'Fit the network in view' },
  { keys: 'G', action: 'Grid snapping on/off' },
  { keys: 'Delete / Backspace', action: 'Delete the selection (or the chosen bend point)' },
  { keys: 'Double-click a line', action: 'Add a bend point there' },
  { keys: 'Double-click a bend', action: 'Remove that bend point' },
  { keys: 'Ctrl/⌘ C, Ctrl/⌘ V', action: 'Copy, paste (new ids)' },
  { keys: 'Ctrl/⌘ A', action: 'Select everything' },
  { keys: 'Ctrl/⌘ S', action: 'Save now' },
  { keys: 'Ctrl/⌘ Z', action: 'Undo' },
  { keys: 'Shift Ctrl/⌘ Z, Ctrl Y', action: 'Redo' },
  { keys: 'Esc', action: 'Cancel the drawing or gesture; clear the selection' },
  { keys: 'Wheel', action: 'Zoom at the cursor' },
  { keys: '?', action: 'This help' },
];

/** What the keys act on (the Editor). */
export interface KeyTarget {
  readonly tool: Tool;
  readonly activeTool: Tool;
  undo(): void;
  redo(): void;
  copy(): void;
  paste(): void;
  selectAll(): void;
  select(ids: Iterable<string>): void;
  deleteSelection(): void;
  setTool(id: ToolId, option?: string): void;
  fitToView(): void;
  toggleSnap(): void;
}

/** Letter keys that choose a tool (with its variant). */
const TOOL_KEYS: Record<string, [ToolId, string?]> = {
  v: ['select'],
  h: ['pan'],
  p: ['link', 'pipe'],
  u: ['link', 'pump'],
  l: ['link', 'valve'],
};

/**
 * Keyboard input (key as in KeyboardEvent.key). Returns true when handled so the caller can
 * prevent the browser default. The active tool sees plain keys first (Backspace in a drawing).
 */
export function handleEditorKey(ed: KeyTarget, key: string, mods: { mod: boolean; shift: boolean }): boolean {
  const k = key.length === 1 ? key.toLowerCase() : key;
  if (mods.mod) {
    const act: Record<string, () => void> = {
      z: () => (mods.shift ? ed.redo() : ed.undo()),
      y: () => ed.redo(),
      c: () => ed.copy(),
      v: () => ed.paste(),
      a: () => ed.selectAll(),
    };
    const f = act[k];
    if (!f) return false;
    f();
    return true;
  }
  if (ed.tool.key?.(key)) return true;
  if (k === 'Escape') {
    if (!ed.activeTool.cancel()) ed.select([]);
    return true;
  }
  const tool = TOOL_KEYS[k];
  const act: (() => void) | undefined =
    k === 'Delete' || k === 'Backspace'
      ? () => ed.deleteSelection()
      : tool
        ? () => ed.setTool(tool[0], tool[1])
        : k === 'f'
          ? () => ed.fitToView()
          : k === 'g'
            ? () => ed.toggleSnap()
            : undefined;
  if (!act) return false;
  act();
  return true;
}
