/**
 * Routes the plan's pointer events to the editor's tools. A press on an arm, its turn handle or a
 * boundary corner starts that drag tool (the pointer is captured, so the gesture's moves and release
 * come back to the svg as bubbling events); clicks, double-clicks and moves otherwise go to the
 * tool chosen in the toolbar (the select tool on a read-only layout).
 */
import type { ArmPlacement } from '@shared/schemas/layout';
import type { DragPose } from '../../../workers/analysisProtocol';
import type { EditorTool, ShapeTool } from '../sceneTypes';
import { AddPointTool } from './addPointTool';
import { DragVertexTool } from './dragVertexTool';
import { DrawBoundaryTool, type Draft } from './drawBoundaryTool';
import { MoveArmTool } from './moveArmTool';
import { SectionTool, type SectionDraft } from './sectionTool';
import { SelectTool } from './selectTool';
import type { Tool, ToolHost, ToolPointer, VertexAt } from './tool';
import { TurnArmTool } from './turnArmTool';

type ChosenTool = SelectTool | AddPointTool | DrawBoundaryTool | SectionTool;

export class ToolDispatcher {
  private readonly select: SelectTool;
  private readonly moveArm: MoveArmTool;
  private readonly turnArm: TurnArmTool;
  private readonly dragVertex: DragVertexTool;
  private readonly section: SectionTool;
  private readonly chosen: Record<EditorTool, ChosenTool>;
  /** The drag under way and the element holding its pointer capture. */
  private drag: { tool: Tool<never>; el: Element } | null = null;
  /** A press on a mark ends in a click on whatever is under the pointer then: not a deselect. */
  private pressedOnMark = false;

  constructor(
    private readonly host: ToolHost,
    private readonly toPointer: (e: MouseEvent) => ToolPointer,
  ) {
    this.select = new SelectTool(host);
    this.moveArm = new MoveArmTool(host);
    this.turnArm = new TurnArmTool(host);
    this.dragVertex = new DragVertexTool(host);
    this.section = new SectionTool(host);
    const draw = (kind: ShapeTool) => new DrawBoundaryTool(host, kind);
    this.chosen = { select: this.select, point: new AddPointTool(host), fence: draw('fence'), keepout: draw('keepout'), operator: draw('operator'), opening: draw('opening'), section: this.section };
  }

  private get tool(): ChosenTool {
    return this.chosen[this.host.state().tool];
  }

  private drawTool(): DrawBoundaryTool | null {
    const t = this.tool;
    return t instanceof DrawBoundaryTool ? t : null;
  }

  /** The pose of the arm being moved or turned, or null. */
  dragPose(): DragPose | null {
    return this.moveArm.pose() ?? this.turnArm.pose();
  }

  /** The boundary corner being dragged (once moved), or null. */
  dragVertexAt(): VertexAt | null {
    return this.dragVertex.vertex();
  }

  /** The shape being drawn, or null when the chosen tool draws none. */
  draft(): Draft | null {
    return this.drawTool()?.draft() ?? null;
  }

  /** The section line being drawn (its start and the pointer), or null. */
  sectionDraft(): SectionDraft | null {
    return this.tool === this.section ? this.section.draft() : null;
  }

  isDrawing(): boolean {
    if (this.tool === this.section) return this.section.isDrawing();
    return this.drawTool()?.isDrawing() ?? false;
  }

  /** The toolbar's tool changed from `from`: drops its shape and shows the new tool's hint. */
  toolChanged(from: EditorTool | null): void {
    if (from) this.chosen[from].cancel();
    this.host.cb.onHint(this.tool.hint());
  }

  /** A press on an arm's mark: selects it; on an editable layout starts moving it, or turning it from its handle. */
  pressArm(e: PointerEvent, el: Element, arm: ArmPlacement): void {
    const s = this.host.state();
    if (e.button !== 0) return;
    const turning = (e.target as Element).classList.contains('turn-handle');
    if (s.tool !== 'select' && !turning) return;
    this.host.cb.onSelect({ kind: 'arm', id: arm.id });
    if (s.readOnly) {
      this.pressedOnMark = true;
      e.stopPropagation();
      return;
    }
    const a = s.content.arms.find((x) => x.id === arm.id);
    if (!a) return;
    const pose: DragPose = { armId: a.id, x: a.x, y: a.y, yaw: a.yaw };
    const tool = turning ? this.turnArm : this.moveArm;
    tool.down(this.toPointer(e), pose);
    this.capture(tool, el, e);
  }

  /** A press on a corner handle of the selected boundary: starts dragging it. */
  pressVertex(e: PointerEvent, el: Element, vertex: VertexAt): void {
    if (this.host.state().readOnly || e.button !== 0) return;
    this.dragVertex.down(this.toPointer(e), vertex);
    this.capture(this.dragVertex, el, e);
  }

  private capture(tool: Tool<never>, el: Element, e: PointerEvent): void {
    this.pressedOnMark = true;
    e.stopPropagation();
    e.preventDefault();
    (el as SVGElement).setPointerCapture?.(e.pointerId);
    this.drag = { tool, el };
  }

  private release(e: PointerEvent): Tool<never> | null {
    const d = this.drag;
    if (!d) return null;
    this.drag = null;
    (d.el as SVGElement).releasePointerCapture?.(e.pointerId);
    return d.tool;
  }

  pointerMove(e: PointerEvent): void {
    const p = this.toPointer(e);
    this.drag?.tool.move(p);
    this.tool.move(p);
  }

  pointerUp(e: PointerEvent): void {
    this.release(e)?.up(this.toPointer(e));
  }

  pointerCancel(e: PointerEvent): void {
    this.release(e)?.cancel();
  }

  click(e: MouseEvent): void {
    const target = e.target as Element;
    const fromMark = this.pressedOnMark;
    this.pressedOnMark = false;
    if (fromMark || target.closest('[data-plan-drag]')) return;
    const s = this.host.state();
    // A read-only layout may still draw a section line (a view, not an edit); every other tool selects.
    const tool = s.readOnly && s.tool !== 'section' ? this.select : this.tool;
    tool.up(this.toPointer(e));
  }

  /** A click on a boundary's shape: the select tool picks it (before the plan's own click). */
  boundaryClick(e: MouseEvent, boundaryId: string): void {
    if (this.host.state().tool !== 'select') return;
    e.stopPropagation();
    this.select.up({ ...this.toPointer(e), boundaryId });
  }

  dblClick(e: MouseEvent): void {
    const draw = this.drawTool();
    if (this.host.state().readOnly || !draw?.finishesOnDoubleClick) return;
    e.preventDefault();
    draw.finish();
  }

  /** Ends the shape being drawn (Enter). */
  finishDraw(): void {
    this.drawTool()?.finish();
  }

  /** Drops the shape being drawn (Esc). */
  cancelDraw(): void {
    this.tool.cancel();
    this.host.cb.onHint(this.tool.hint());
    this.host.redrawMarks();
  }
}

/** The boundary whose shape is under an event's target, if any. */
export function boundaryUnder(target: EventTarget | null): string | null {
  return (target as Element | null)?.closest?.('[data-boundary]')?.getAttribute('data-boundary') ?? null;
}
