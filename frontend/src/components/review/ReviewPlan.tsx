import { useEffect, useMemo, useRef, useState } from 'react';
import type { Finding } from '@shared/analysis';
import { padBounds, pointsBounds } from '@shared/geometry';
import type { ReviewCommentDto, RevisionSnapshotDto } from '../../api/revisions';
import { PlanView } from '../../plan/PlanView';
import type { PlanCanvas, PlanViewState } from '../../plan/planTypes';
import { placedOf, type AnalysisView } from '../../workers/analysisProtocol';
import { layerStylesFor } from '../floorPlan/layerRoles';
import { createLayoutScene, type LayoutScene } from '../layout/layoutScene';

const NO_ARMS: ReadonlySet<string> = new Set();
/** Pointer travel (px) under which a press-release counts as a click, not a pan. */
const CLICK_PX = 4;

export interface ReviewPlanProps {
  snapshot: RevisionSnapshotDto;
  selectedFinding: Finding | null;
  /** Comments pinned to a spot (drawn as numbered pins). */
  pins: ReadonlyArray<Pick<ReviewCommentDto, 'id' | 'point' | 'resolved'>>;
  /** The spot chosen for a new comment, plan mm. */
  draftPin: { x: number; y: number } | null;
  /** A click on the plan (not a pan), plan mm; absent = read-only. */
  onPick?: (p: { x: number; y: number }) => void;
}

/** The revision's plan, read-only, from its frozen snapshot (the layout editor's scene in view-only mode), with comment pins. */
export function ReviewPlan({ snapshot, selectedFinding, pins, draftPin, onPick }: ReviewPlanProps) {
  const [canvas, setCanvas] = useState<PlanCanvas | null>(null);
  const scene = useRef<LayoutScene | null>(null);
  const fp = snapshot.floorPlan;
  const styles = useMemo(() => (fp ? layerStylesFor(fp.layers as Parameters<typeof layerStylesFor>[0], new Set()) : {}), [fp]);
  const content = snapshot.layout.content;
  const bounds = useMemo(() => {
    if (fp) return fp.bounds;
    const b = pointsBounds(content.arms.map((a) => [a.x, a.y]));
    return b ? padBounds(b, 3000) : { minX: -5000, minY: -5000, maxX: 5000, maxY: 5000 };
  }, [fp, content]);
  const view = useMemo<AnalysisView>(
    () => ({ analysis: snapshot.analysis, maxSpaces: {}, placed: placedOf(content) }),
    [snapshot, content],
  );

  useEffect(() => {
    if (!canvas) return;
    const noop = () => {};
    const s = createLayoutScene(canvas, canvas.svg, { onSelect: noop, onDragPose: noop, onArmMoved: noop, onArmTurned: noop, onVertexMoved: noop, onShapeDrawn: noop, onPointPlaced: noop, onHint: noop });
    scene.current = s;
    return () => {
      s.destroy();
      scene.current = null;
    };
  }, [canvas]);

  useEffect(() => {
    scene.current?.update({
      content,
      view,
      selection: selectedFinding ? { kind: 'finding', id: selectedFinding.id } : null,
      highlightArms: selectedFinding ? new Set(selectedFinding.arms) : NO_ARMS,
      findingGeometry: selectedFinding?.geometry ?? null,
      tool: 'select',
      bandHeight: content.workHeights[0] ?? null,
      readOnly: true,
    });
  }, [canvas, content, view, selectedFinding]);

  // Pins in screen space, redrawn on every zoom/pan so they keep their size.
  useEffect(() => {
    if (!canvas) return;
    const draw = (v: PlanViewState) =>
      canvas.setOverlay(
        'review-pins',
        (layer) => {
          layer.selectAll('*').remove();
          const all = [...pins.filter((p) => p.point).map((p, i) => ({ key: `c${p.id}`, n: String(i + 1), at: p.point!, resolved: p.resolved, draft: false }))];
          if (draftPin) all.push({ key: 'draft', n: '+', at: draftPin, resolved: false, draft: true });
          for (const p of all) {
            const [sx, sy] = v.toScreen(p.at);
            const g = layer.append('g').attr('transform', `translate(${sx},${sy})`).attr('data-pin', p.key);
            g.append('path').attr('d', 'M0 0 L-7 -12 A8 8 0 1 1 7 -12 Z').attr('fill', p.draft ? 'var(--color-accent)' : p.resolved ? 'var(--color-ink-faint)' : 'var(--color-finding-warning)').attr('stroke', '#fff').attr('stroke-width', 1.5);
            g.append('text').attr('x', 0).attr('y', -14).attr('text-anchor', 'middle').attr('font-size', 10).attr('font-weight', 700).attr('fill', '#fff').text(p.n);
          }
        },
        { space: 'screen', order: 50 },
      );
    draw(canvas.view());
    const off = canvas.onView(draw);
    return () => {
      off();
      canvas.removeOverlay('review-pins');
    };
  }, [canvas, pins, draftPin]);

  // A click (not a pan) picks a spot for a comment.
  useEffect(() => {
    if (!canvas || !onPick) return;
    const svg = canvas.svg;
    let down: [number, number] | null = null;
    const onDown = (e: PointerEvent) => {
      down = [e.clientX, e.clientY];
    };
    const onUp = (e: PointerEvent) => {
      if (!down || e.button !== 0) return;
      const moved = Math.hypot(e.clientX - down[0], e.clientY - down[1]);
      down = null;
      if (moved > CLICK_PX) return;
      const p = canvas.view().toPlan(e.clientX, e.clientY);
      onPick({ x: Math.round(p.x), y: Math.round(p.y) });
    };
    svg.addEventListener('pointerdown', onDown);
    svg.addEventListener('pointerup', onUp);
    return () => {
      svg.removeEventListener('pointerdown', onDown);
      svg.removeEventListener('pointerup', onUp);
    };
  }, [canvas, onPick]);

  return (
    <PlanView
      geometry={(fp?.geometry ?? null) as Parameters<typeof PlanView>[0]['geometry']}
      layerStyles={styles}
      bounds={bounds}
      onCanvas={setCanvas}
      label={`Revision plan of ${snapshot.layout.name}`}
      className="min-h-[28rem] flex-1"
    />
  );
}
