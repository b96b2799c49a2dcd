/**
 * The canvas's keyboard shortcuts: one list, read by the key handler and shown in the
 * help dialog. `keys` is how the dialog writes them; "Mod" is Ctrl, or ⌘ on a Mac.
 */
export type CanvasCommand =
  | 'tool-select' | 'tool-pen' | 'tool-ray' | 'tool-line' | 'tool-segment' | 'tool-sweep' | 'tool-hand'
  | 'undo' | 'redo' | 'save' | 'delete' | 'escape' | 'finish'
  | 'fit' | 'zoom-in' | 'zoom-out' | 'toggle-grid' | 'toggle-controls' | 'toggle-snap' | 'toggle-y-up'
  | 'toggle-containment' | 'toggle-precision' | 'help'
  | 'kind-line' | 'kind-quadratic' | 'kind-cubic' | 'kind-arc'
  | 'nudge-left' | 'nudge-right' | 'nudge-up' | 'nudge-down'

export interface CanvasShortcut {
  readonly command: CanvasCommand
  readonly keys: string
  readonly description: string
  readonly group: 'Tools' | 'Edit' | 'View'
  /** KeyboardEvent.key values (lower case for letters) that trigger it. */
  readonly match: readonly string[]
  readonly mod?: boolean
  readonly shift?: boolean
}

export const CANVAS_SHORTCUTS: readonly CanvasShortcut[] = [
  { command: 'tool-select', keys: 'V', description: 'Select and move points, probes and hits', group: 'Tools', match: ['v'] },
  { command: 'tool-pen', keys: 'P', description: 'Pen: click for a line, drag for a cubic, click the first point to close', group: 'Tools', match: ['p'] },
  { command: 'tool-ray', keys: 'R', description: 'Cast a ray: drag from its origin along its direction', group: 'Tools', match: ['r'] },
  { command: 'tool-line', keys: 'L', description: 'Cast a line through two points', group: 'Tools', match: ['l'] },
  { command: 'tool-segment', keys: 'S', description: 'Cast a segment between two points', group: 'Tools', match: ['s'] },
  { command: 'tool-sweep', keys: 'W', description: 'Add a sweep of parallel lines: drag to set its angle', group: 'Tools', match: ['w'] },
  { command: 'tool-hand', keys: 'H (or hold Space)', description: 'Pan the view', group: 'Tools', match: ['h'] },
  { command: 'undo', keys: 'Mod+Z', description: 'Undo', group: 'Edit', match: ['z'], mod: true },
  { command: 'redo', keys: 'Shift+Mod+Z or Mod+Y', description: 'Redo', group: 'Edit', match: ['z', 'y'], mod: true, shift: true },
  { command: 'save', keys: 'Mod+S', description: 'Save the active path as a new revision', group: 'Edit', match: ['s'], mod: true },
  { command: 'delete', keys: 'Delete or Backspace', description: 'Delete the selected points, or the selected probe', group: 'Edit', match: ['delete', 'backspace'] },
  { command: 'kind-line', keys: '1', description: 'Make the selected segment a line', group: 'Edit', match: ['1'] },
  { command: 'kind-quadratic', keys: '2', description: 'Make the selected segment a quadratic', group: 'Edit', match: ['2'] },
  { command: 'kind-cubic', keys: '3', description: 'Make the selected segment a cubic', group: 'Edit', match: ['3'] },
  { command: 'kind-arc', keys: '4', description: 'Make the selected segment an arc', group: 'Edit', match: ['4'] },
  { command: 'nudge-left', keys: 'Arrow keys (Shift: ×10)', description: 'Move the selected points by one grid step', group: 'Edit', match: ['arrowleft'] },
  { command: 'nudge-right', keys: '', description: '', group: 'Edit', match: ['arrowright'] },
  { command: 'nudge-up', keys: '', description: '', group: 'Edit', match: ['arrowup'] },
  { command: 'nudge-down', keys: '', description: '', group: 'Edit', match: ['arrowdown'] },
  { command: 'finish', keys: 'Enter', description: 'Finish the contour the pen is drawing', group: 'Edit', match: ['enter'] },
  { command: 'escape', keys: 'Esc', description: 'Finish the pen, clear the selection, back to Select', group: 'Edit', match: ['escape'] },
  { command: 'fit', keys: 'F', description: 'Fit the paths in view', group: 'View', match: ['f'] },
  { command: 'zoom-in', keys: '+', description: 'Zoom in (or the mouse wheel, or pinch)', group: 'View', match: ['+', '='] },
  { command: 'zoom-out', keys: '−', description: 'Zoom out', group: 'View', match: ['-', '_'] },
  { command: 'toggle-grid', keys: 'G', description: 'Grid on or off', group: 'View', match: ['g'] },
  { command: 'toggle-controls', keys: 'C', description: 'Control points and polygons on or off', group: 'View', match: ['c'] },
  { command: 'toggle-snap', keys: 'N', description: 'Snapping to the grid and to points on or off', group: 'View', match: ['n'] },
  { command: 'toggle-y-up', keys: 'Y', description: 'Show y upwards (font units) or downwards (SVG)', group: 'View', match: ['y'] },
  { command: 'toggle-containment', keys: 'K', description: 'Shade a sampled grid by winding number', group: 'View', match: ['k'] },
  { command: 'toggle-precision', keys: 'D', description: 'Numbers with 17 significant digits', group: 'View', match: ['d'] },
  { command: 'help', keys: '?', description: 'This list', group: 'View', match: ['?'] },
]

/** The command a key press means, or null. Typing in a field never reaches this. */
export function commandOfKey(event: Pick<KeyboardEvent, 'key' | 'ctrlKey' | 'metaKey' | 'shiftKey' | 'altKey'>): CanvasCommand | null {
  const key = event.key.toLowerCase()
  const mod = event.ctrlKey || event.metaKey
  if (event.altKey) return null
  if (mod) {
    if (key === 'z') return event.shiftKey ? 'redo' : 'undo'
    if (key === 'y') return 'redo'
    if (key === 's') return 'save'
    return null
  }
  for (const s of CANVAS_SHORTCUTS) if (!s.mod && s.match.includes(key)) return s.command
  return null
}
