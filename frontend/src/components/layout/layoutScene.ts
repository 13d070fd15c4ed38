/**
 * The layout editor on the plan canvas: overlays for arms, reach, shared zones, zones and work
 * points, and the pointer work (drag an arm, turn it by its handle, drag a zone's vertices, draw
 * zones by clicks). Imperative, like the canvas: React hands it state with `update`, it hands
 * edits back through callbacks — drag positions live here in plain variables and are committed
 * once, on pointer up. Plan mm (x east, y north), yaw degrees CCW from +x.
 */
import { select, type Selection } from 'd3';
import type { AreaGeometry } from '@shared/geometry/geojson';
import type { ArmPlacement, LayoutContent, Zone } from '@shared/schemas/layout';
import { ZONE_STYLES } from '@shared/style/zoneStyles';
import { moveZoneVertex, nearestFence, nearestOnPolyline, normalizeYaw, roundMm } from '../../editor/layoutEdits';
import type { PlanCanvas, PlanViewState } from '../../plan/planTypes';
import type { AnalysisView, DragPose } from '../../workers/analysisProtocol';
import type { LayoutSelection } from './panelTypes';
import {
  drawAreaZones,
  drawFindingGeometry,
  drawLineZones,
  drawPatterns,
  drawPointLabels,
  drawReach,
  drawSharedZones,
  drawWorkPoints,
  drawZoneMarks,
  SCENE_COLOURS,
  TICK_PX,
  type ArmRegionsDatum,
} from './sceneDraw';

type XY = [number, number];
type G = Selection<SVGGElement, unknown, null, undefined>;

export type EditorTool = 'select' | 'point' | 'fence' | 'keepout' | 'operator' | 'opening';
/** Tools that draw a zone. */
export type ShapeTool = Exclude<EditorTool, 'select' | 'point'>;

export interface SceneState {
  content: LayoutContent;
  view: AnalysisView | null;
  selection: LayoutSelection | null;
  /** Arms to show emphasised (those of the selected finding). */
  highlightArms: ReadonlySet<string>;
  findingGeometry: AreaGeometry | null;
  tool: EditorTool;
  /** Work height whose reach band is drawn, mm; null = none. */
  bandHeight: number | null;
  readOnly: boolean;
}

export interface SceneCallbacks {
  onSelect(sel: LayoutSelection | null): void;
  /** The pose of the arm being dragged or turned, per pointer move; null when the drag ends. */
  onDragPose(pose: DragPose | null): void;
  onArmMoved(id: string, x: number, y: number): void;
  onArmTurned(id: string, yaw: number): void;
  onVertexMoved(zoneId: string, index: number, to: XY): void;
  onShapeDrawn(kind: ShapeTool, points: XY[]): void;
  /** The point tool clicked the plan at p (mm). */
  onPointPlaced(p: XY): void;
  /** A line for the status bar while drawing (or null). */
  onHint(text: string | null): void;
}

type Drag =
  | { kind: 'move'; armId: string; offset: XY; pose: DragPose; moved: boolean }
  | { kind: 'turn'; armId: string; pose: DragPose; moved: boolean }
  | { kind: 'vertex'; zoneId: string; index: number; at: XY; moved: boolean };

/** Pixels within which a click counts as on a fence (opening tool). */
const FENCE_PICK_PX = 24;

export interface LayoutScene {
  update(state: SceneState): void;
  /** Ends the shape being drawn (Enter, double-click). */
  finishDraw(): void;
  /** Drops the shape being drawn (Esc). */
  cancelDraw(): void;
  isDrawing(): boolean;
  destroy(): void;
}

/** Draws the layout on `canvas` (whose svg is `svg`) and handles its pointer work. */
export function createLayoutScene(canvas: PlanCanvas, svg: SVGSVGElement, cb: SceneCallbacks): LayoutScene {
  let state: SceneState | null = null;
  let drag: Drag | null = null;
  let draft: XY[] = [];
  let cursor: XY | null = null;
  // What a finished drag committed, shown until React hands back content that holds it (no flicker).
  let held: { pose?: DragPose; vertex?: { zoneId: string; index: number; at: XY } } | null = null;

  const shownArm = (a: ArmPlacement): ArmPlacement => {
    const pose = drag && drag.kind !== 'vertex' ? drag.pose : held?.pose;
    return pose && pose.armId === a.id ? { ...a, x: pose.x, y: pose.y, yaw: pose.yaw } : a;
  };

  const shownContent = (): LayoutContent => {
    const c = state!.content;
    const v = drag?.kind === 'vertex' && drag.moved ? drag : held?.vertex;
    if (v && c.zones.some((z) => z.id === v.zoneId && v.index < z.points.length)) return moveZoneVertex(c, v.zoneId, v.index, v.at);
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
      return {
        arm: a,
        transform,
        max: s.view?.maxSpaces[a.id] ?? null,
        restricted: r?.restricted ?? null,
        band: s.bandHeight === null ? null : (r?.bands.find((b) => b.height === s.bandHeight)?.geometry ?? null),
        emphasis: (s.selection?.kind === 'arm' && s.selection.id === a.id) || s.highlightArms.has(a.id),
      };
    });
  }

  const selectedZone = () => (state?.selection?.kind === 'zone' ? state.selection.id : null);

  // ---- plan-space layers ----
  function renderPlan(): void {
    if (!state) return;
    const s = state;
    const c = shownContent();
    const zone = selectedZone();
    canvas.setOverlay('layout-patterns', (l, v) => drawPatterns(l, v), { order: 1 });
    canvas.setOverlay('layout-areas', (l) => {
      drawAreaZones(l, c.zones, zone);
      bindZoneClicks(l);
    }, { order: 5 });
    canvas.setOverlay('layout-reach', (l) => drawReach(l, regionData(s)), { order: 10 });
    const pair = s.selection?.kind === 'finding' && s.selection.id.startsWith('shared-zone:') ? s.selection.id.slice('shared-zone:'.length) : null;
    canvas.setOverlay('layout-shared', (l) => drawSharedZones(l, s.view?.analysis.overlaps ?? [], pair), { order: 20 });
    canvas.setOverlay('layout-lines', (l) => {
      drawLineZones(l, c.zones, zone);
      bindZoneClicks(l);
    }, { order: 30 });
    renderZoomDependent(canvas.view());
    canvas.setOverlay('layout-finding', (l) => drawFindingGeometry(l, s.findingGeometry), { order: 45 });
  }

  function renderZoomDependent(view: PlanViewState): void {
    if (!state) return;
    const s = state;
    canvas.setOverlay('layout-points', (l) => {
      drawWorkPoints(l, s.content, s.view?.analysis.coverage ?? null, view, s.selection?.kind === 'point' ? s.selection.id : null);
    }, { order: 40 });
  }

  function bindZoneClicks(l: G): void {
    l.selectAll<SVGPathElement, Zone>('path[data-zone]').on('click', (event: MouseEvent, z) => {
      if (!state || state.tool !== 'select') return;
      event.stopPropagation();
      cb.onSelect({ kind: 'zone', id: z.id });
    });
  }

  // ---- screen-space marks ----
  function renderMarks(view: PlanViewState = canvas.view()): void {
    if (!state) return;
    const s = state;
    const c = shownContent();
    canvas.setOverlay('layout-zone-marks', (l) => {
      drawZoneMarks(l, c.zones, view);
      drawPointLabels(l, c, view);
    }, { space: 'screen', order: 1 });
    canvas.setOverlay('layout-arms', (l) => drawArms(l, s, view), { space: 'screen', order: 5 });
    canvas.setOverlay('layout-handles', (l) => drawHandles(l, c, view), { space: 'screen', order: 6 });
    canvas.setOverlay('layout-draft', (l) => drawDraft(l, view), { space: 'screen', order: 7 });
  }

  function drawArms(l: G, s: SceneState, view: PlanViewState): void {
    const arms = s.content.arms.map(shownArm);
    const selectedArm = s.selection?.kind === 'arm' ? s.selection.id : null;
    const marks = l
      .selectAll<SVGGElement, ArmPlacement>('g.arm-mark')
      .data(arms, (a) => a.id)
      .join((enter) => {
        const g = enter.append('g').attr('class', 'arm-mark').attr('data-plan-drag', '');
        g.append('line').attr('class', 'arm-tick');
        g.append('circle').attr('class', 'arm-base').attr('r', 8);
        g.append('circle').attr('class', 'arm-axis').attr('r', 2).attr('pointer-events', 'none');
        g.append('text').attr('class', 'arm-label').attr('x', 12).attr('y', -10).attr('paint-order', 'stroke');
        g.append('circle').attr('class', 'turn-handle').attr('r', 5.5).attr('data-plan-drag', '');
        return g;
      })
      .attr('data-arm', (a) => a.id)
      .attr('data-selected', (a) => (a.id === selectedArm ? 'true' : null))
      .attr('transform', (a) => {
        const [x, y] = view.toScreen({ x: a.x, y: a.y });
        return `translate(${x},${y})`;
      })
      .style('cursor', s.readOnly ? 'pointer' : 'grab');
    const colour = (a: ArmPlacement) => (a.id === selectedArm ? SCENE_COLOURS.selected : ZONE_STYLES.armBase.screen.colour);
    const tip = (a: ArmPlacement): XY => {
      const t = (a.yaw * Math.PI) / 180;
      return [Math.cos(t) * TICK_PX, -Math.sin(t) * TICK_PX];
    };
    marks
      .select('line.arm-tick')
      .attr('x1', 0)
      .attr('y1', 0)
      .attr('x2', (a) => tip(a)[0])
      .attr('y2', (a) => tip(a)[1])
      .style('stroke', colour)
      .style('stroke-width', 2.5);
    marks
      .select('circle.arm-base')
      .style('fill', SCENE_COLOURS.paper)
      .style('stroke', colour)
      .style('stroke-width', (a) => (a.id === selectedArm || s.highlightArms.has(a.id) ? ZONE_STYLES.armBase.screen.widthEmphasis : ZONE_STYLES.armBase.screen.width));
    marks.select('circle.arm-axis').style('fill', colour);
    marks
      .select('text.arm-label')
      .style('font', '700 12px var(--font-sans, sans-serif)')
      .style('fill', colour)
      .style('stroke', SCENE_COLOURS.paper)
      .style('stroke-width', 3)
      .text((a) => (a.label ? `${a.id} ${a.label}` : a.id));
    marks
      .select('circle.turn-handle')
      .attr('display', (a) => (a.id === selectedArm && !s.readOnly ? null : 'none'))
      .attr('cx', (a) => tip(a)[0])
      .attr('cy', (a) => tip(a)[1])
      .attr('aria-label', (a) => `Turn ${a.id}`)
      .style('fill', SCENE_COLOURS.selected)
      .style('stroke', SCENE_COLOURS.paper)
      .style('stroke-width', 1.5)
      .style('cursor', 'alias');
    marks.on('pointerdown', onArmPointerDown);
  }

  function drawHandles(l: G, c: LayoutContent, view: PlanViewState): void {
    const zone = c.zones.find((z) => z.id === selectedZone());
    const pts = zone && state && !state.readOnly ? zone.points.map((p, i) => ({ zoneId: zone.id, i, p: p as XY })) : [];
    l.selectAll<SVGRectElement, (typeof pts)[number]>('rect.vertex-handle')
      .data(pts, (d) => `${d.zoneId}:${d.i}`)
      .join('rect')
      .attr('class', 'vertex-handle')
      .attr('data-plan-drag', '')
      .attr('width', 10)
      .attr('height', 10)
      .attr('x', (d) => view.toScreen({ x: d.p[0], y: d.p[1] })[0] - 5)
      .attr('y', (d) => view.toScreen({ x: d.p[0], y: d.p[1] })[1] - 5)
      .style('fill', SCENE_COLOURS.paper)
      .style('stroke', SCENE_COLOURS.selected)
      .style('stroke-width', 2)
      .style('cursor', 'move')
      .on('pointerdown', onVertexPointerDown);
  }

  function drawDraft(l: G, view: PlanViewState): void {
    const pts = cursor && draft.length ? [...draft, cursor] : draft;
    const screen = pts.map(([x, y]) => view.toScreen({ x, y }));
    const closed = state?.tool === 'keepout' || state?.tool === 'operator';
    const d = screen.length ? screen.map((p, i) => `${i ? 'L' : 'M'}${p[0]},${p[1]}`).join('') + (closed && screen.length > 2 ? 'Z' : '') : '';
    l.selectAll<SVGPathElement, string>('path.draft')
      .data([d])
      .join('path')
      .attr('class', 'draft')
      .attr('d', (x) => x)
      .attr('fill', 'none')
      .attr('pointer-events', 'none')
      .style('stroke', SCENE_COLOURS.selected)
      .style('stroke-width', 2)
      .style('stroke-dasharray', '5 3');
    l.selectAll<SVGCircleElement, [number, number]>('circle.draft-point')
      .data(screen.slice(0, draft.length))
      .join('circle')
      .attr('class', 'draft-point')
      .attr('r', 3.5)
      .attr('cx', (p) => p[0])
      .attr('cy', (p) => p[1])
      .attr('pointer-events', 'none')
      .style('fill', SCENE_COLOURS.selected);
  }

  // ---- pointer work ----
  const toPlan = (e: PointerEvent | MouseEvent): XY => {
    const p = canvas.view().toPlan(e.clientX, e.clientY);
    return [p.x, p.y];
  };

  // A press on a marker or handle ends in a click on whatever is under the pointer then: not a deselect.
  let pressedOnMark = false;

  function startCapture(el: Element, e: PointerEvent): void {
    pressedOnMark = true;
    e.stopPropagation();
    e.preventDefault();
    (el as SVGElement).setPointerCapture?.(e.pointerId);
    el.addEventListener('pointermove', onDragMove as EventListener);
    el.addEventListener('pointerup', onDragEnd as EventListener);
    el.addEventListener('pointercancel', onDragEnd as EventListener);
  }

  function onArmPointerDown(this: SVGGElement, e: PointerEvent, a: ArmPlacement): void {
    if (!state || e.button !== 0) return;
    const turning = (e.target as Element).classList.contains('turn-handle');
    if (state.tool !== 'select' && !turning) return;
    cb.onSelect({ kind: 'arm', id: a.id });
    if (state.readOnly) {
      pressedOnMark = true;
      e.stopPropagation();
      return;
    }
    const arm = state.content.arms.find((x) => x.id === a.id);
    if (!arm) return;
    const p = toPlan(e);
    const pose = { armId: arm.id, x: arm.x, y: arm.y, yaw: arm.yaw };
    drag = turning ? { kind: 'turn', armId: arm.id, pose, moved: false } : { kind: 'move', armId: arm.id, offset: [arm.x - p[0], arm.y - p[1]], pose, moved: false };
    startCapture(this, e);
  }

  function onVertexPointerDown(this: SVGRectElement, e: PointerEvent, d: { zoneId: string; i: number; p: XY }): void {
    if (!state || state.readOnly || e.button !== 0) return;
    drag = { kind: 'vertex', zoneId: d.zoneId, index: d.i, at: d.p, moved: false };
    startCapture(this, e);
  }

  function onDragMove(e: PointerEvent): void {
    if (!drag || !state) return;
    const p = toPlan(e);
    if (drag.kind === 'move') {
      drag.pose = { ...drag.pose, x: roundMm(p[0] + drag.offset[0]), y: roundMm(p[1] + drag.offset[1]) };
    } else if (drag.kind === 'turn') {
      const yaw = normalizeYaw(Math.round((Math.atan2(p[1] - drag.pose.y, p[0] - drag.pose.x) * 180) / Math.PI * 10) / 10);
      drag.pose = { ...drag.pose, yaw };
    } else {
      drag.at = [roundMm(p[0]), roundMm(p[1])];
      drag.moved = true;
      renderPlan();
      renderMarks();
      return;
    }
    drag.moved = true;
    cb.onDragPose(drag.pose);
    canvas.setOverlay('layout-reach', (l) => drawReach(l, regionData(state!)));
    renderMarks();
  }

  function onDragEnd(this: Element, e: PointerEvent): void {
    this.removeEventListener('pointermove', onDragMove as EventListener);
    this.removeEventListener('pointerup', onDragEnd as EventListener);
    this.removeEventListener('pointercancel', onDragEnd as EventListener);
    (this as SVGElement).releasePointerCapture?.(e.pointerId);
    const d = drag;
    if (!d) return;
    // The drawing keeps the dragged pose until React hands back the committed content.
    if (!d.moved || e.type === 'pointercancel') {
      drag = null;
      if (d.kind !== 'vertex') cb.onDragPose(null);
      renderPlan();
      renderMarks();
      return;
    }
    drag = null;
    held = d.kind === 'vertex' ? { vertex: { zoneId: d.zoneId, index: d.index, at: d.at } } : { pose: d.pose };
    if (d.kind === 'move') cb.onArmMoved(d.armId, d.pose.x, d.pose.y);
    else if (d.kind === 'turn') cb.onArmTurned(d.armId, d.pose.yaw);
    else cb.onVertexMoved(d.zoneId, d.index, d.at);
    renderPlan();
    renderMarks();
  }

  function drawHint(): void {
    if (!state) return;
    const n = draft.length;
    switch (state.tool) {
      case 'fence':
        cb.onHint(n === 0 ? 'Click the fence’s first corner.' : `${n} point${n === 1 ? '' : 's'} — click the next corner; Enter or double-click finishes, Esc cancels.`);
        break;
      case 'keepout':
      case 'operator':
        cb.onHint(n < 3 ? `Click the corners of the area (${n} of at least 3).` : `${n} corners — Enter or double-click closes the area, Esc cancels.`);
        break;
      case 'opening':
        cb.onHint(n === 0 ? 'Click on a fence where the opening starts.' : 'Click on the fence where the opening ends.');
        break;
      case 'point':
        cb.onHint('Click the plan to add a work point at the first work height; Esc returns to Select.');
        break;
      default:
        cb.onHint(null);
    }
  }

  function onClick(e: MouseEvent): void {
    if (!state) return;
    const target = e.target as Element;
    const fromMark = pressedOnMark;
    pressedOnMark = false;
    if (fromMark || target.closest('[data-plan-drag]')) return;
    if (state.tool === 'select' || state.readOnly) {
      if (!target.closest('[data-zone]')) cb.onSelect(null);
      return;
    }
    const p = toPlan(e);
    const k = canvas.view().transform.k || 1;
    if (state.tool === 'point') {
      cb.onPointPlaced([roundMm(p[0]), roundMm(p[1])]);
      return;
    }
    if (state.tool === 'opening') {
      const near = nearestFence(state.content, p);
      if (!near || near.distance > FENCE_PICK_PX / k) {
        cb.onHint(near ? 'That is not on a fence: click on the fence line.' : 'Draw a fence first: an opening is cut into a fence.');
        return;
      }
      const on = nearestOnPolyline(near.fence.points as XY[], p)!.point;
      if (draft.length === 0) {
        draft = [on];
        drawHint();
      } else {
        const pts: XY[] = [draft[0], on];
        draft = [];
        cb.onShapeDrawn('opening', pts);
        drawHint();
      }
      renderMarks();
      return;
    }
    const last = draft[draft.length - 1];
    if (last && Math.hypot(last[0] - p[0], last[1] - p[1]) * k < 4) return; // second click of a double-click
    draft.push([roundMm(p[0]), roundMm(p[1])]);
    drawHint();
    renderMarks();
  }

  function onDblClick(e: MouseEvent): void {
    if (!state || state.readOnly || state.tool === 'select' || state.tool === 'opening' || state.tool === 'point') return;
    e.preventDefault();
    finishDraw();
  }

  function onMove(e: PointerEvent): void {
    if (!state || state.tool === 'select' || draft.length === 0) return;
    cursor = toPlan(e);
    canvas.setOverlay('layout-draft', (l, v) => drawDraft(l, v));
  }

  function finishDraw(): void {
    if (!state || state.tool === 'select' || state.tool === 'point') return;
    const need = state.tool === 'fence' ? 2 : state.tool === 'opening' ? 2 : 3;
    if (draft.length < need) {
      cb.onHint(`Needs at least ${need} points; keep clicking, or Esc to cancel.`);
      return;
    }
    const pts = draft;
    draft = [];
    cursor = null;
    cb.onShapeDrawn(state.tool, pts);
    drawHint();
    renderMarks();
  }

  function cancelDraw(): void {
    draft = [];
    cursor = null;
    drawHint();
    renderMarks();
  }

  svg.addEventListener('click', onClick);
  svg.addEventListener('dblclick', onDblClick);
  svg.addEventListener('pointermove', onMove);
  const stopView = canvas.onView((v) => {
    canvas.setOverlay('layout-patterns', (l) => drawPatterns(l, v));
    renderZoomDependent(v);
    renderMarks(v);
  });

  return {
    update(next) {
      const toolChanged = state?.tool !== next.tool;
      if (state && next.content !== state.content) held = null;
      state = next;
      if (toolChanged) {
        draft = [];
        cursor = null;
        drawHint();
      }
      svg.style.cursor = next.tool === 'select' || next.readOnly ? '' : 'crosshair';
      renderPlan();
      renderMarks();
    },
    finishDraw,
    cancelDraw,
    isDrawing: () => draft.length > 0,
    destroy() {
      stopView();
      svg.removeEventListener('click', onClick);
      svg.removeEventListener('dblclick', onDblClick);
      svg.removeEventListener('pointermove', onMove);
      for (const name of ['layout-patterns', 'layout-areas', 'layout-reach', 'layout-shared', 'layout-lines', 'layout-points', 'layout-finding', 'layout-zone-marks', 'layout-arms', 'layout-handles', 'layout-draft']) {
        canvas.removeOverlay(name);
      }
      select(svg).style('cursor', null);
    },
  };
}
