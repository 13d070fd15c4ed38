import { useCallback, useEffect, useLayoutEffect, useRef, useState } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import type { LayoutContent, LayoutDto } from '@shared/schemas/layout';
import { isApiError, errorMessage } from '../api/client';
import { layoutKeys } from '../api/queryKeys';
import { layoutDetailQuery, saveLayout } from '../api/layouts';
import { canRedo, canUndo, commit, createHistory, redo, reset, undo, type History } from './history';

export type SaveState =
  | { kind: 'saved'; at: Date | null }
  | { kind: 'pending' }
  | { kind: 'saving' }
  | { kind: 'error'; message: string }
  | { kind: 'conflict'; message: string; serverVersion: number | null };

const AUTOSAVE_MS = 800;

/**
 * The editor's state of one layout: content with undo/redo, autosave (PUT with the version it
 * edited, debounced), and a conflict state when someone else saved first (reload or keep a copy).
 */
export function useLayoutEditor(layout: LayoutDto) {
  const queryClient = useQueryClient();
  const [history, setHistory] = useState<History<LayoutContent>>(() => createHistory(layout.content));
  const [save, setSave] = useState<SaveState>({ kind: 'saved', at: null });
  const version = useRef(layout.version);
  const savedContent = useRef<LayoutContent>(layout.content);
  const timer = useRef<ReturnType<typeof setTimeout> | null>(null);
  const inFlight = useRef(false);
  const latest = useRef(history.present);
  useLayoutEffect(() => {
    latest.current = history.present;
  }, [history.present]);

  const flush = useCallback(async () => {
    if (inFlight.current) return;
    const content = latest.current;
    if (content === savedContent.current) {
      // Undone back to what is stored: nothing to send.
      setSave((s) => (s.kind === 'pending' ? { kind: 'saved', at: null } : s));
      return;
    }
    inFlight.current = true;
    setSave({ kind: 'saving' });
    try {
      const saved = await saveLayout(layout.id, { version: version.current, content });
      version.current = saved.version;
      savedContent.current = content;
      queryClient.setQueryData(layoutKeys.detail(layout.id), { ...saved, content });
      setSave(latest.current === content ? { kind: 'saved', at: new Date() } : { kind: 'pending' });
    } catch (err) {
      if (isApiError(err, 409)) {
        setSave({ kind: 'conflict', message: err.message, serverVersion: null });
      } else {
        setSave({ kind: 'error', message: errorMessage(err) });
      }
    } finally {
      inFlight.current = false;
    }
  }, [layout.id, queryClient]);

  // Every change of the content (edit, undo, redo) marks the layout pending and restarts the autosave timer.
  const conflicted = save.kind === 'conflict';
  const changed = useCallback((next: (h: History<LayoutContent>) => History<LayoutContent>) => {
    setHistory(next);
    setSave((s) => (s.kind === 'saving' || s.kind === 'conflict' ? s : { kind: 'pending' }));
  }, []);
  useEffect(() => {
    if (conflicted || history.present === savedContent.current) return;
    if (timer.current) clearTimeout(timer.current);
    timer.current = setTimeout(() => void flush(), AUTOSAVE_MS);
    return () => {
      if (timer.current) clearTimeout(timer.current);
    };
  }, [history.present, flush, conflicted]);

  // Save what is pending before the page goes away.
  useEffect(() => () => void flush(), [flush]);

  /** Records an edit; edits with the same mergeKey in a row (one drag) are one undo step. */
  const edit = useCallback((next: LayoutContent, label: string, mergeKey: string | null = null) => {
    changed((h) => commit(h, next, label, mergeKey));
  }, [changed]);

  /** After a conflict: take the server's current layout and drop local edits. */
  const reloadFromServer = useCallback(async () => {
    const fresh = await queryClient.fetchQuery({ ...layoutDetailQuery(layout.id), staleTime: 0 });
    version.current = fresh.version;
    savedContent.current = fresh.content;
    setHistory(reset(fresh.content));
    setSave({ kind: 'saved', at: new Date() });
  }, [layout.id, queryClient]);

  return {
    content: history.present,
    history,
    edit,
    undo: () => {
      if (canUndo(history)) changed(undo);
    },
    redo: () => {
      if (canRedo(history)) changed(redo);
    },
    canUndo: canUndo(history),
    canRedo: canRedo(history),
    save,
    saveNow: flush,
    reloadFromServer,
  };
}
