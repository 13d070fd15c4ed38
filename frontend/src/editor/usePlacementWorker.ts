import { useCallback, useEffect, useRef, useState } from 'react';
import type { AutoLayoutResult } from '@shared/analysis';
import type { PlacementMap, PlacementNames, PlacementResult } from '@shared/analysis';
import type { LayoutContent } from '@shared/schemas/layout';
import type { AutoLayoutInput, PlacementSearchInput } from '@shared/schemas/placement';
import type { FromPlacementWorker, LayoutScores, PlacementJobInput, ToPlacementWorker } from '../workers/placementProtocol';

export type PlacementJobState =
  | { kind: 'idle' }
  | { kind: 'running'; job: 'search' | 'auto'; progress: number }
  | { kind: 'error'; message: string };

export interface PlacementWork {
  state: PlacementJobState;
  /** The map as far as the running or last search has refined it. */
  map: { map: PlacementMap; names: PlacementNames } | null;
  result: PlacementResult | null;
  proposal: { result: AutoLayoutResult; content: LayoutContent; scores: { current: LayoutScores; proposal: LayoutScores } } | null;
  search(request: PlacementSearchInput, input: PlacementJobInput): void;
  propose(request: AutoLayoutInput, input: PlacementJobInput): void;
  cancel(): void;
  clear(): void;
}

/** Runs placement searches and auto-layouts in their own Web Worker (started on first use), one job at a time. */
export function usePlacementWorker(): PlacementWork {
  const worker = useRef<Worker | null>(null);
  const jobId = useRef(0);
  const [state, setState] = useState<PlacementJobState>({ kind: 'idle' });
  const [map, setMap] = useState<PlacementWork['map']>(null);
  const [result, setResult] = useState<PlacementResult | null>(null);
  const [proposal, setProposal] = useState<PlacementWork['proposal']>(null);

  useEffect(() => () => worker.current?.terminate(), []);

  const ensure = useCallback(() => {
    if (worker.current) return worker.current;
    const w = new Worker(new URL('../workers/placement.worker.ts', import.meta.url), { type: 'module', name: 'placement-search' });
    w.onmessage = (event: MessageEvent<FromPlacementWorker>) => {
      const m = event.data;
      if (m.id !== jobId.current) return; // an answer to a job that was replaced
      switch (m.type) {
        case 'map':
          setMap({ map: m.map, names: m.names });
          setState((s) => (s.kind === 'running' ? { ...s, progress: m.progress } : s));
          break;
        case 'progress':
          setState((s) => (s.kind === 'running' ? { ...s, progress: m.progress } : s));
          break;
        case 'searched':
          setMap({ map: m.result.map, names: m.result.names });
          setResult(m.result);
          setState({ kind: 'idle' });
          break;
        case 'proposed':
          setProposal({ result: m.result, content: m.proposal, scores: m.scores });
          setState({ kind: 'idle' });
          break;
        case 'cancelled':
          setState({ kind: 'idle' });
          break;
        case 'error':
          setState({ kind: 'error', message: m.message });
          break;
      }
    };
    w.onerror = (e) => setState({ kind: 'error', message: e.message || 'The placement worker stopped' });
    worker.current = w;
    return w;
  }, []);

  const post = useCallback((m: ToPlacementWorker) => ensure().postMessage(m), [ensure]);

  const cancel = useCallback(() => {
    if (worker.current) post({ type: 'cancel', id: jobId.current });
    setState({ kind: 'idle' });
  }, [post]);

  return {
    state,
    map,
    result,
    proposal,
    search(request, input) {
      if (worker.current) post({ type: 'cancel', id: jobId.current });
      const id = ++jobId.current;
      setResult(null);
      setMap(null);
      setState({ kind: 'running', job: 'search', progress: 0 });
      post({ type: 'search', id, request, ...input });
    },
    propose(request, input) {
      if (worker.current) post({ type: 'cancel', id: jobId.current });
      const id = ++jobId.current;
      setProposal(null);
      setState({ kind: 'running', job: 'auto', progress: 0 });
      post({ type: 'auto', id, request, ...input });
    },
    cancel,
    clear() {
      setMap(null);
      setResult(null);
      setProposal(null);
    },
  };
}
