/** The move-arm tool: drag an arm's base; the new position is committed on release. */
import type { DragPose } from '../../../workers/analysisProtocol';
import { roundMm } from '../../../editor/layoutEdits';
import type { XY } from '../sceneTypes';
import type { Tool, ToolHost, ToolPointer } from './tool';

/** Where a dragged base goes: the pointer plus the offset it was grabbed at, rounded to 0.1 mm (plan mm). */
export function draggedBase(offset: Readonly<XY>, pointer: Readonly<XY>): XY {
  return [roundMm(pointer[0] + offset[0]), roundMm(pointer[1] + offset[1])];
}

export class MoveArmTool implements Tool<DragPose> {
  private drag: { offset: XY; pose: DragPose; moved: boolean } | null = null;

  constructor(private readonly host: ToolHost) {}

  /** The pose drawn while dragging, or null. */
  pose(): DragPose | null {
    return this.drag?.pose ?? null;
  }

  down(p: ToolPointer, pose: DragPose): void {
    this.drag = { offset: [pose.x - p.plan[0], pose.y - p.plan[1]], pose, moved: false };
  }

  move(p: ToolPointer): void {
    const d = this.drag;
    if (!d) return;
    const [x, y] = draggedBase(d.offset, p.plan);
    d.pose = { ...d.pose, x, y };
    d.moved = true;
    this.host.cb.onDragPose(d.pose);
    this.host.redrawArm();
  }

  up(): void {
    const d = this.drag;
    if (!d) return;
    if (!d.moved) return this.cancel();
    this.drag = null;
    // The drawing keeps the dragged pose until React hands back the committed content.
    this.host.hold({ pose: d.pose });
    this.host.cb.onArmMoved(d.pose.armId, d.pose.x, d.pose.y);
    this.host.redrawAll();
  }

  cancel(): void {
    if (!this.drag) return;
    this.drag = null;
    this.host.cb.onDragPose(null);
    this.host.redrawAll();
  }
}
