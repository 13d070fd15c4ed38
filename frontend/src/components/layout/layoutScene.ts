/**
 * The layout editor on the plan canvas: overlays for arms, reach, shared zones, boundaries and work
 * points, with the pointer work handed to the tools (tools/: select, move arm, turn arm, drag
 * vertex, draw boundary, add point, section line) through one dispatcher. Imperative, like the canvas: React hands it
 * state with `update`, it hands edits back through callbacks — a drag's pose lives in its tool and
 * is committed once, on pointer up. Plan mm (x east, y north), yaw degrees CCW from +x.
 */
import { select, type Selection } from 'd3';
import { parseFindingId } from '@shared/analysis';
import type { ArmPlacement, LayoutContent, Boundary } from '@shared/schemas/layout';
import { moveBoundaryVertex } from '../../editor/layoutEdits';
import type { OverlayRender, PlanCanvas, PlanViewState } from '../../plan/planTypes';
import { createDragLayer, type ArmPoseXY, type DragLayer } from './dragLayer';
import { LAYOUT_OVERLAYS, type LayoutOverlay } from './layoutOverlays';
import type { SceneCallbacks, SceneState, XY } from './sceneTypes';
import {
  drawAreaBoundaries,
  drawFindingGeometry,
  drawLineBoundaries,
  drawPatterns,
  drawPointLabels,
  drawReach,
  drawSharedZones,
  drawWorkPoints,
  drawBoundaryMarks,
  POINTS_LAYER,
  type ArmRegionsDatum,
} from './sceneDraw';
import { drawArmMarks, drawDraft, drawSectionLine, drawVertexHandles, placeArmMark } from './sceneMarks';
import type { HeldEdit, ToolHost, ToolPointer } from './tools/tool';
import { ToolDispatcher, boundaryUnder } from './tools/toolDispatcher';

export type { EditorTool, SceneCallbacks, SceneState, ShapeTool } from './sceneTypes';

type G = Selection<SVGGElement, unknown, null, undefined>;

export interface LayoutScene {
  update(state: SceneState): void;
  /** Ends the shape being drawn (Enter, double-click). */
  finishDraw(): void;
  /** Drops the shape being drawn (Esc). */
  cancelDraw(): void;
  isDrawing(): boolean;
  destroy(): void;
}

/** Draws the layout on `canvas` (whose svg is `svg`) and routes its pointer work to the tools. */
export function createLayoutScene(canvas: PlanCanvas, svg: SVGSVGElement, cb: SceneCallbacks): LayoutScene {
  let state: SceneState | null = null;
  // What a finished drag committed, shown until React hands back content that holds it (no flicker).
  let held: HeldEdit | null = null;
  // The dragged arm's reach on a layer of its own while a move or turn lasts (dragLayer.ts), and
  // the pose each arm's reach was last drawn at in the plan (where that layer's copy starts from).
  let dragLayer: DragLayer | null = null;
  const drawnAt = new Map<string, ArmPoseXY>();
  const dropDragLayer = () => {
    dragLayer?.remove();
    dragLayer = null;
  };

  const show = (o: LayoutOverlay, render: OverlayRender) => canvas.setOverlay(o.name, render, o);

  const host: ToolHost = {
    state: () => state!,
    cb,
    hold: (edit) => {
      held = edit;
    },
    redrawArm: () => {
      const pose = tools.dragPose();
      if (pose && !dragLayer) {
        const from = drawnAt.get(pose.armId);
        dragLayer = from ? createDragLayer(svg, pose.armId, from, canvas.view()) : null;
        // the plan's own copy is hidden from now on (regionData)
        if (dragLayer) show(LAYOUT_OVERLAYS.reach, (l) => drawReach(l, regionData(state!)));
      }
      const arm = pose && state!.content.arms.find((a) => a.id === pose.armId);
      if (pose && arm && dragLayer?.armId === pose.armId) {
        // only the layer and the arm's own mark move: nothing else on the plan changes with the pointer
        const view = canvas.view();
        dragLayer.moveTo(pose, view);
        show(LAYOUT_OVERLAYS.arms, (l) => placeArmMark(l, shownArm(arm), view));
        return;
      }
      show(LAYOUT_OVERLAYS.reach, (l) => drawReach(l, regionData(state!)));
      renderMarks();
    },
    redrawMarks: () => renderMarks(),
    redrawDraft: () => show(LAYOUT_OVERLAYS.draft, (l, v) => drawDraft(l, tools.draft(), v)),
    redrawAll: () => {
      dropDragLayer();
      renderPlan();
      renderMarks();
    },
  };
  const toPointer = (e: MouseEvent): ToolPointer => {
    const view = canvas.view();
    const p = view.toPlan(e.clientX, e.clientY);
    return { plan: [p.x, p.y], k: view.transform.k || 1, boundaryId: boundaryUnder(e.target) };
  };
  const tools = new ToolDispatcher(host, toPointer);

  const shownArm = (a: ArmPlacement): ArmPlacement => {
    const pose = tools.dragPose() ?? held?.pose;
    return pose && pose.armId === a.id ? { ...a, x: pose.x, y: pose.y, yaw: pose.yaw } : a;
  };

  const shownContent = (): LayoutContent => {
    const c = state!.content;
    const v = tools.dragVertexAt() ?? held?.vertex;
    if (v && c.boundaries.some((z) => z.id === v.boundaryId && v.index < z.points.length)) return moveBoundaryVertex(c, v.boundaryId, v.index, v.at);
    return c;
  };

  function regionData(s: SceneState): ArmRegionsDatum[] {
    const regions = s.view?.analysis.regions ?? {};
    return s.content.arms.map((a0) => {
      const a = shownArm(a0);
      const placed = s.view?.placed[a.id];
      let transform = '';
      if (placed && (placed[0] !== a.x || placed[1] !== a.y || placed[2] !== a.yaw)) {
        transform = `translate(${a.x},${a.y}) rotate(${a.yaw - placed[2]}) translate(${-placed[0]},${-placed[1]})`;
      }
      const r = regions[a.id];
      drawnAt.set(a.id, { x: a.x, y: a.y, yaw: a.yaw });
      return {
        arm: a,
        hidden: dragLayer?.armId === a.id,
        transform,
        max: s.view?.maxSpaces[a.id] ?? null,
        restricted: r?.restricted ?? null,
        band: s.bandHeight === null ? null : (r?.bands.find((b) => b.height === s.bandHeight)?.geometry ?? null),
        emphasis: (s.selection?.kind === 'arm' && s.selection.id === a.id) || s.highlightArms.has(a.id),
      };
    });
  }

  const selectedBoundary = () => (state?.selection?.kind === 'boundary' ? state.selection.id : null);

  function bindBoundaryClicks(l: G): void {
    l.selectAll<SVGPathElement, Boundary>('path[data-boundary]').on('click', (event: MouseEvent, z) => {
      if (state) tools.boundaryClick(event, z.id);
    });
  }

  // ---- plan-space layers ----
  function renderPlan(): void {
    if (!state) return;
    const s = state;
    const c = shownContent();
    const boundary = selectedBoundary();
    show(LAYOUT_OVERLAYS.patterns, (l, v) => drawPatterns(l, v));
    show(LAYOUT_OVERLAYS.areas, (l) => {
      drawAreaBoundaries(l, c.boundaries, boundary);
      bindBoundaryClicks(l);
    });
    show(LAYOUT_OVERLAYS.reach, (l) => drawReach(l, regionData(s)));
    const finding = s.selection?.kind === 'finding' ? parseFindingId(s.selection.id) : null;
    const pair = finding?.kind === 'shared-zone' ? finding.ids.join('+') : null;
    show(LAYOUT_OVERLAYS.shared, (l) => drawSharedZones(l, s.view?.analysis.sharedZones ?? [], pair));
    show(LAYOUT_OVERLAYS.lines, (l) => {
      drawLineBoundaries(l, c.boundaries, boundary);
      bindBoundaryClicks(l);
    });
    renderZoomDependent(canvas.view());
    show(LAYOUT_OVERLAYS.finding, (l) => drawFindingGeometry(l, s.findingGeometry));
  }

  function renderZoomDependent(view: PlanViewState): void {
    if (!state) return;
    const s = state;
    drawWorkPoints(canvas, s.content, s.view?.analysis.coverage ?? null, view, s.selection?.kind === 'point' ? s.selection.id : null);
  }

  // ---- screen-space marks ----
  function renderMarks(view: PlanViewState = canvas.view()): void {
    if (!state) return;
    const s = state;
    const c = shownContent();
    show(LAYOUT_OVERLAYS.boundaryMarks, (l) => {
      drawBoundaryMarks(l, c.boundaries, view);
      drawPointLabels(l, c, view);
    });
    const arms = s.content.arms.map(shownArm);
    const marks = { selectedArm: s.selection?.kind === 'arm' ? s.selection.id : null, highlightArms: s.highlightArms, readOnly: s.readOnly };
    show(LAYOUT_OVERLAYS.arms, (l) => drawArmMarks(l, arms, view, marks, (e, el, a) => tools.pressArm(e, el, a)));
    const boundary = c.boundaries.find((z) => z.id === selectedBoundary());
    const corners = boundary && !s.readOnly ? boundary.points.map((p, index) => ({ boundaryId: boundary.id, index, at: p as XY })) : [];
    show(LAYOUT_OVERLAYS.handles, (l) => drawVertexHandles(l, corners, view, (e, el, d) => tools.pressVertex(e, el, d)));
    show(LAYOUT_OVERLAYS.section, (l) => drawSectionLine(l, s.sectionLine ?? null, tools.sectionDraft(), view));
    show(LAYOUT_OVERLAYS.draft, (l) => drawDraft(l, tools.draft(), view));
  }

  const on = {
    click: (e: MouseEvent) => state && tools.click(e),
    dblclick: (e: MouseEvent) => state && tools.dblClick(e),
    pointermove: (e: PointerEvent) => state && tools.pointerMove(e),
    pointerup: (e: PointerEvent) => state && tools.pointerUp(e),
    pointercancel: (e: PointerEvent) => state && tools.pointerCancel(e),
  };
  for (const [type, fn] of Object.entries(on)) svg.addEventListener(type, fn as EventListener);
  const stopView = canvas.onView((v) => {
    // the layer's copy was laid out for the view it started in
    if (dragLayer) {
      dropDragLayer();
      renderPlan();
    }
    show(LAYOUT_OVERLAYS.patterns, (l) => drawPatterns(l, v));
    renderZoomDependent(v);
    renderMarks(v);
  });

  return {
    update(next) {
      const from = state?.tool ?? null;
      if (state && next.content !== state.content) held = null;
      state = next;
      if (from !== next.tool) tools.toolChanged(from);
      svg.style.cursor = next.tool === 'select' || (next.readOnly && next.tool !== 'section') ? '' : 'crosshair';
      renderPlan();
      renderMarks();
    },
    finishDraw: () => state && tools.finishDraw(),
    cancelDraw: () => state && tools.cancelDraw(),
    isDrawing: () => tools.isDrawing(),
    destroy() {
      dropDragLayer();
      stopView();
      for (const [type, fn] of Object.entries(on)) svg.removeEventListener(type, fn as EventListener);
      for (const o of Object.values(LAYOUT_OVERLAYS)) canvas.removeOverlay(o.name);
      canvas.removeOverlay(POINTS_LAYER);
      select(svg).style('cursor', null);
    },
  };
}
