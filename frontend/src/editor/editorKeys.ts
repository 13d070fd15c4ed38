/**
 * The editor's keyboard commands: which key does what, as data (shown in the key help) and as a
 * pure mapping from a key event to a command. Plan frame: x east, y north; angles CCW positive.
 */

/** Nudge steps, mm. */
export const NUDGE_MM = 10;
export const NUDGE_BIG_MM = 100;
/** Rotation steps, degrees. */
export const TURN_DEG = 5;
export const TURN_FINE_DEG = 1;

export type EditorCommand =
  | { kind: 'nudge'; dx: number; dy: number }
  | { kind: 'rotate'; delta: number }
  | { kind: 'delete' }
  | { kind: 'duplicate' }
  | { kind: 'undo' }
  | { kind: 'redo' }
  | { kind: 'finish' }
  | { kind: 'cancel' }
  | { kind: 'section-tool' };

/** What the key help lists, in order. */
export const KEY_HELP: ReadonlyArray<{ keys: string; does: string }> = [
  { keys: '← ↑ → ↓', does: `move the arm ${NUDGE_MM} mm (Shift: ${NUDGE_BIG_MM} mm)` },
  { keys: '[  ]', does: `turn the arm ${TURN_DEG}° clockwise / counter-clockwise (Shift: ${TURN_FINE_DEG}°)` },
  { keys: 'Delete', does: 'remove the selected arm or boundary' },
  { keys: 'Ctrl/⌘ D', does: 'duplicate the selected arm' },
  { keys: 'Ctrl/⌘ Z · Shift Ctrl/⌘ Z', does: 'undo · redo' },
  { keys: 'Enter · Esc', does: 'finish · cancel the shape being drawn' },
  { keys: 'S', does: 'draw a section line (the side view appears below the plan)' },
];

export interface KeyLike {
  key: string;
  code?: string;
  shiftKey: boolean;
  ctrlKey: boolean;
  metaKey: boolean;
  altKey: boolean;
}

/**
 * The command a key press means, or null. `hasSelection` says whether an arm or boundary is selected
 * (moving keys mean nothing without one, so the plan's own arrow-key pan keeps working).
 */
export function commandForKey(e: KeyLike, ctx: { armSelected: boolean; boundarySelected: boolean; drawing: boolean }): EditorCommand | null {
  const mod = e.ctrlKey || e.metaKey;
  if (e.altKey) return null;
  const key = e.key.length === 1 ? e.key.toLowerCase() : e.key;
  if (mod) {
    if (key === 'z') return e.shiftKey ? { kind: 'redo' } : { kind: 'undo' };
    if (key === 'y' && !e.shiftKey) return { kind: 'redo' };
    if (key === 'd' && ctx.armSelected) return { kind: 'duplicate' };
    return null;
  }
  if (ctx.drawing) {
    if (key === 'Enter') return { kind: 'finish' };
    if (key === 'Escape') return { kind: 'cancel' };
    return null;
  }
  if (key === 's' && !e.shiftKey) return { kind: 'section-tool' };
  if (key === 'Escape' && (ctx.armSelected || ctx.boundarySelected)) return { kind: 'cancel' };
  if ((key === 'Delete' || key === 'Backspace') && (ctx.armSelected || ctx.boundarySelected)) return { kind: 'delete' };
  if (!ctx.armSelected) return null;
  const step = e.shiftKey ? NUDGE_BIG_MM : NUDGE_MM;
  switch (key) {
    case 'ArrowLeft':
      return { kind: 'nudge', dx: -step, dy: 0 };
    case 'ArrowRight':
      return { kind: 'nudge', dx: step, dy: 0 };
    case 'ArrowUp':
      return { kind: 'nudge', dx: 0, dy: step };
    case 'ArrowDown':
      return { kind: 'nudge', dx: 0, dy: -step };
  }
  // Shift turns "[" into "{" on many layouts: read the physical key too.
  const turn = e.shiftKey ? TURN_FINE_DEG : TURN_DEG;
  if (key === ']' || key === '}' || e.code === 'BracketRight') return { kind: 'rotate', delta: turn };
  if (key === '[' || key === '{' || e.code === 'BracketLeft') return { kind: 'rotate', delta: -turn };
  return null;
}
