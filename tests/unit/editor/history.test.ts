import { describe, expect, it } from 'vitest';
import { canRedo, canUndo, commit, createHistory, redo, undo, HISTORY_LIMIT } from '../../../frontend/src/editor/history';

describe('editor history', () => {
  it('undoes and redoes labelled edits in order', () => {
    let h = createHistory(0);
    h = commit(h, 1, 'one');
    h = commit(h, 2, 'two');
    expect(h.present).toBe(2);
    h = undo(h);
    expect([h.present, h.label]).toEqual([1, 'one']);
    h = undo(h);
    expect(h.present).toBe(0);
    expect(canUndo(h)).toBe(false);
    h = redo(h);
    h = redo(h);
    expect(h.present).toBe(2);
    expect(canRedo(h)).toBe(false);
  });

  it('merges a drag (same key in a row) into one undo step, and a new edit clears redo', () => {
    let h = createHistory('a');
    h = commit(h, 'b', 'move R1', 'drag:R1');
    h = commit(h, 'c', 'move R1', 'drag:R1');
    h = commit(h, 'd', 'move R1', 'drag:R1');
    expect(h.past).toHaveLength(1);
    h = undo(h);
    expect(h.present).toBe('a');
    h = commit(h, 'x', 'rename');
    expect(canRedo(h)).toBe(false);
  });

  it('keeps at most HISTORY_LIMIT steps and ignores no-op commits', () => {
    let h = createHistory(0);
    for (let i = 1; i <= HISTORY_LIMIT + 50; i++) h = commit(h, i, `step ${i}`);
    expect(h.past.length).toBe(HISTORY_LIMIT);
    expect(commit(h, h.present, 'same')).toBe(h);
  });
});
