import { useCallback, useEffect, useMemo, useRef, useState } from 'react';
import type { FeatureCollection } from 'geojson';
import type { FloorLayer } from '@shared/analysis';
import type { LayoutContent } from '@shared/schemas/layout';
import { placedOf, type AnalysisView, type DragPose, type FromWorker, type ToWorker, type WorkerArmModel } from '../workers/analysisProtocol';
import { createDeltaDecoder } from '../workers/analysisDelta';

/** The server's analysis of the content the editor opened with (GET /layouts/:id/analysis). */
export interface FirstView {
  content: LayoutContent;
  analysis: AnalysisView['analysis'];
  maxSpaces: AnalysisView['maxSpaces'];
}

export interface LiveAnalysis {
  /** The latest result (of the content, or of the content with a drag pose); null until the first. */
  view: (AnalysisView & { dragging: boolean }) | null;
  error: string | null;
  /** True while a newer input than the shown result is being analysed. */
  busy: boolean;
  /** Tells the worker the pose of an arm being dragged; posted at most once per animation frame. */
  postDrag(pose: DragPose | null): void;
}

/**
 * Runs the layout analysis in a Web Worker: the models and the floor are posted when they change
 * (rarely), the content on every edit, drag poses throttled to animation frames. The worker keeps
 * one analyzer, so a drag recomputes only the dragged arm's parts.
 */
export function useAnalysisWorker(input: {
  models: WorkerArmModel[] | null;
  floor: { geometry: FeatureCollection; layers: FloorLayer[] } | null;
  content: LayoutContent;
  /** The section line drawn on the plan (A, A′ in plan mm), or null: its side view comes with every result. */
  sectionLine?: [[number, number], [number, number]] | null;
  /**
   * Shown until the worker's first result while the content is still the one it was computed from
   * and no section line is drawn: the same shared analysis, run by the server, so opening a layout
   * need not wait for the worker to build every arm model's reach.
   */
  firstView?: FirstView | null;
}): LiveAnalysis {
  const worker = useRef<Worker | null>(null);
  const seq = useRef(0);
  const shown = useRef(0);
  const frame = useRef<number | null>(null);
  const pendingPose = useRef<DragPose | null>(null);
  const [view, setView] = useState<LiveAnalysis['view']>(null);
  const [error, setError] = useState<string | null>(null);
  // Busy with a drag pose (or not yet answered at all), as the worker's answers tell.
  const [busy, setBusy] = useState(true);
  // The content (and models) last posted, and those the shown result was computed from: an edit is
  // being analysed while they differ.
  const sent = useRef<{ seq: number; content: LayoutContent; models: WorkerArmModel[] } | null>(null);
  const [answered, setAnswered] = useState<{ content: LayoutContent; models: WorkerArmModel[] } | null>(null);

  const post = useCallback((msg: ToWorker) => worker.current?.postMessage(msg), []);

  useEffect(() => {
    const w = new Worker(new URL('../workers/analysis.worker.ts', import.meta.url), { type: 'module', name: 'layout-analysis' });
    worker.current = w;
    const decoder = createDeltaDecoder();
    w.onmessage = (event: MessageEvent<FromWorker>) => {
      const msg = event.data;
      // Every delta is applied in the order sent, also one too old to show: the next builds on it.
      const decoded = msg.type === 'result' ? decoder.decode(msg.delta) : null;
      if (msg.seq < shown.current) return;
      shown.current = msg.seq;
      setBusy(msg.seq < seq.current);
      const last = sent.current;
      if (last && msg.seq >= last.seq) setAnswered({ content: last.content, models: last.models });
      if (msg.type === 'error') {
        setError(msg.message);
        return;
      }
      setError(null);
      if (decoded && msg.type === 'result') setView({ ...decoded, section: decoded.section ?? null, dragging: msg.dragging });
    };
    w.onerror = (event) => {
      setError(event.message || 'The analysis could not start in this browser.');
      setBusy(false);
      const last = sent.current;
      if (last) setAnswered({ content: last.content, models: last.models });
    };
    return () => {
      w.terminate();
      worker.current = null;
      if (frame.current !== null) cancelAnimationFrame(frame.current);
      frame.current = null;
    };
  }, []);

  const { models, floor, content } = input;
  const sectionLine = input.sectionLine ?? null;
  // Declared in this order so the worker has models and floor before the first content.
  useEffect(() => {
    if (models) post({ type: 'models', models });
  }, [models, post]);
  useEffect(() => {
    post({ type: 'floor', floor });
  }, [floor, post]);
  useEffect(() => {
    if (!models) return;
    // A committed edit supersedes any drag pose still waiting for its frame.
    if (frame.current !== null) cancelAnimationFrame(frame.current);
    frame.current = null;
    pendingPose.current = null;
    seq.current += 1;
    sent.current = { seq: seq.current, content, models };
    post({ type: 'content', seq: seq.current, content });
  }, [content, models, post]);

  useEffect(() => {
    post({ type: 'section', line: sectionLine });
  }, [sectionLine, post]);

  const postDrag = useCallback(
    (pose: DragPose | null) => {
      pendingPose.current = pose;
      if (frame.current !== null) return;
      frame.current = requestAnimationFrame(() => {
        frame.current = null;
        seq.current += 1;
        setBusy(true);
        post({ type: 'drag', seq: seq.current, pose: pendingPose.current });
      });
    },
    [post],
  );

  const firstView = input.firstView ?? null;
  const first = useMemo(
    () => (firstView ? { analysis: firstView.analysis, maxSpaces: firstView.maxSpaces, placed: placedOf(firstView.content), section: null, dragging: false } : null),
    [firstView],
  );
  if (view === null && error === null && first && firstView!.content === content && sectionLine === null) {
    return { view: first, error: null, busy: false, postDrag };
  }
  const editPending = models !== null && (answered?.content !== content || answered.models !== models);
  return { view, error, busy: busy || editPending, postDrag };
}
