/** The board's keyboard shortcuts: one table drives the key handler and the help overlay. */
export interface Shortcut {
  keys: string;
  what: string;
}

export const SHORTCUTS: readonly { group: string; items: readonly Shortcut[] }[] = [
  {
    group: 'Tools',
    items: [
      { keys: 'V', what: 'Pick and move (the usual tool)' },
      { keys: 'P', what: 'Draw a free polygon: click the vertices' },
      { keys: 'C', what: 'Draw a cut line: drag across the section to chart the temperature along it' },
      { keys: 'Enter', what: 'Close the polygon being drawn' },
      { keys: 'Backspace', what: 'While drawing: take back the last vertex' },
      { keys: 'Esc', what: 'Stop the tool, or clear the selection' },
    ],
  },
  {
    group: 'Selection',
    items: [
      { keys: 'Shift + click', what: 'Add to or take from the selection' },
      { keys: 'Drag on empty space', what: 'Select every part inside the box' },
      { keys: 'Ctrl + A', what: 'Select all parts' },
      { keys: 'Delete', what: 'Delete the selection (or the chosen vertex)' },
      { keys: 'Ctrl + D', what: 'Duplicate the selection' },
      { keys: 'Arrows', what: 'Nudge by one grid step (Shift: ten)' },
      { keys: ']  /  [', what: 'Bring forward / send back in the stack' },
      { keys: 'Shift + ]  /  [', what: 'To the top / to the bottom of the stack' },
      { keys: 'L', what: 'Lock or unlock the selection' },
      { keys: 'Alt while dragging', what: 'Move without snapping' },
      { keys: 'Double-click a vertex', what: 'Remove that vertex of a free polygon' },
    ],
  },
  {
    group: 'View',
    items: [
      { keys: 'Wheel or pinch', what: 'Zoom about the pointer' },
      { keys: 'Space + drag, middle drag, two fingers', what: 'Pan' },
      { keys: '0', what: 'Show the whole section' },
      { keys: 'F', what: 'Show the selection' },
      { keys: '+  /  -', what: 'Zoom in / out' },
      { keys: 'G', what: 'Grid on or off' },
      { keys: 'M', what: 'Snapping on or off' },
      { keys: 'U', what: 'Millimetres or inches' },
    ],
  },
  {
    group: 'Document',
    items: [
      { keys: 'Ctrl + Z', what: 'Undo your last change' },
      { keys: 'Ctrl + Shift + Z  or  Ctrl + Y', what: 'Redo' },
      { keys: 'Ctrl + S', what: 'Save the section to a file' },
      { keys: 'Ctrl + O', what: 'Open a section file' },
      { keys: '?', what: 'This list' },
    ],
  },
];
