import { describe, expect, it } from 'vitest';
import { commandForKey, NUDGE_BIG_MM, NUDGE_MM, TURN_DEG, TURN_FINE_DEG, type KeyLike } from '../../../frontend/src/editor/editorKeys';

const key = (k: string, mods: Partial<KeyLike> = {}): KeyLike => ({ key: k, shiftKey: false, ctrlKey: false, metaKey: false, altKey: false, ...mods });
const arm = { armSelected: true, boundarySelected: false, drawing: false };
const none = { armSelected: false, boundarySelected: false, drawing: false };

describe('editor keys', () => {
  it('nudges the selected arm along the plan axes (north is up)', () => {
    expect(commandForKey(key('ArrowUp'), arm)).toEqual({ kind: 'nudge', dx: 0, dy: NUDGE_MM });
    expect(commandForKey(key('ArrowLeft', { shiftKey: true }), arm)).toEqual({ kind: 'nudge', dx: -NUDGE_BIG_MM, dy: 0 });
    // Without a selection the arrows stay with the plan (pan).
    expect(commandForKey(key('ArrowUp'), none)).toBeNull();
  });

  it('turns with [ and ], finer with Shift whatever character Shift makes', () => {
    expect(commandForKey(key(']'), arm)).toEqual({ kind: 'rotate', delta: TURN_DEG });
    expect(commandForKey(key('['), arm)).toEqual({ kind: 'rotate', delta: -TURN_DEG });
    expect(commandForKey(key('{', { shiftKey: true, code: 'BracketLeft' }), arm)).toEqual({ kind: 'rotate', delta: -TURN_FINE_DEG });
    expect(commandForKey(key('}', { shiftKey: true, code: 'BracketRight' }), arm)).toEqual({ kind: 'rotate', delta: TURN_FINE_DEG });
  });

  it('undo, redo, duplicate with Ctrl or ⌘; delete; finish and cancel while drawing', () => {
    expect(commandForKey(key('z', { ctrlKey: true }), none)).toEqual({ kind: 'undo' });
    expect(commandForKey(key('Z', { metaKey: true, shiftKey: true }), none)).toEqual({ kind: 'redo' });
    expect(commandForKey(key('d', { ctrlKey: true }), arm)).toEqual({ kind: 'duplicate' });
    expect(commandForKey(key('d', { ctrlKey: true }), none)).toBeNull();
    expect(commandForKey(key('Delete'), { ...none, boundarySelected: true })).toEqual({ kind: 'delete' });
    expect(commandForKey(key('Enter'), { ...none, drawing: true })).toEqual({ kind: 'finish' });
    expect(commandForKey(key('Escape'), { ...none, drawing: true })).toEqual({ kind: 'cancel' });
    // While drawing, Delete and the arrows do nothing to the selection.
    expect(commandForKey(key('Delete'), { ...arm, drawing: true })).toBeNull();
    expect(commandForKey(key('z', { altKey: true, ctrlKey: true }), none)).toBeNull();
  });

  it('S picks the section tool (not with Ctrl/⌘, nor while a shape is being drawn)', () => {
    expect(commandForKey(key('s'), none)).toEqual({ kind: 'section-tool' });
    expect(commandForKey(key('S', { shiftKey: true }), arm)).toBeNull(); // Shift S is not the key
    expect(commandForKey(key('s', { ctrlKey: true }), none)).toBeNull();
    expect(commandForKey(key('s'), { ...none, drawing: true })).toBeNull();
  });
});
