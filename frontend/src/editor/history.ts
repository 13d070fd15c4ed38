/**
 * Undo/redo history of an editable value (the layout content): every edit is a labelled entry;
 * drag moves coalesce by key so one drag is one undo step. Pure and immutable.
 */
export interface History<T> {
  past: Array<{ value: T; label: string }>;
  present: T;
  future: Array<{ value: T; label: string }>;
  /** Label of the edit that made `present` (for "Undo move R1"). */
  label: string;
  /** Key of the last edit, so repeated edits with the same key merge into one step. */
  lastKey: string | null;
}

export const HISTORY_LIMIT = 200;

export function createHistory<T>(value: T): History<T> {
  return { past: [], present: value, future: [], label: '', lastKey: null };
}

/** Records an edit. With `mergeKey` equal to the last edit's key, it replaces that step instead of adding one. */
export function commit<T>(h: History<T>, value: T, label: string, mergeKey: string | null = null): History<T> {
  if (Object.is(value, h.present)) return h;
  if (mergeKey !== null && mergeKey === h.lastKey) {
    return { ...h, present: value, future: [], label };
  }
  const past = [...h.past, { value: h.present, label: h.label }].slice(-HISTORY_LIMIT);
  return { past, present: value, future: [], label, lastKey: mergeKey };
}

export function undo<T>(h: History<T>): History<T> {
  const prev = h.past[h.past.length - 1];
  if (!prev) return h;
  return { past: h.past.slice(0, -1), present: prev.value, future: [{ value: h.present, label: h.label }, ...h.future], label: prev.label, lastKey: null };
}

export function redo<T>(h: History<T>): History<T> {
  const next = h.future[0];
  if (!next) return h;
  return { past: [...h.past, { value: h.present, label: h.label }], present: next.value, future: h.future.slice(1), label: next.label, lastKey: null };
}

/** Replaces the value without an undo step (e.g. after reloading from the server). */
export function reset<T>(value: T): History<T> {
  return createHistory(value);
}

export const canUndo = (h: History<unknown>) => h.past.length > 0;
export const canRedo = (h: History<unknown>) => h.future.length > 0;
