/** The turn-arm tool: drag an arm's turn handle round its base; the yaw is committed on release. */
import type { DragPose } from '../../../workers/analysisProtocol';
import { normalizeYaw } from '../../../editor/layoutEdits';
import type { XY } from '../sceneTypes';
import type { Tool, ToolHost, ToolPointer } from './tool';

/**
 * Yaw that points an arm's J1 zero from its base at the pointer: the direction angle atan2(dy, dx)
 * in degrees CCW from +x, rounded to 0.1° and normalised to (-180, 180] (plan mm in, degrees out).
 */
export function turnYaw(base: Readonly<XY>, pointer: Readonly<XY>): number {
  return normalizeYaw(Math.round((Math.atan2(pointer[1] - base[1], pointer[0] - base[0]) * 180) / Math.PI * 10) / 10);
}

export class TurnArmTool implements Tool<DragPose> {
  private drag: { pose: DragPose; moved: boolean } | null = null;

  constructor(private readonly host: ToolHost) {}

  /** The pose drawn while turning, or null. */
  pose(): DragPose | null {
    return this.drag?.pose ?? null;
  }

  down(_p: ToolPointer, pose: DragPose): void {
    this.drag = { pose, moved: false };
  }

  move(p: ToolPointer): void {
    const d = this.drag;
    if (!d) return;
    d.pose = { ...d.pose, yaw: turnYaw([d.pose.x, d.pose.y], p.plan) };
    d.moved = true;
    this.host.cb.onDragPose(d.pose);
    this.host.redrawArm();
  }

  up(): void {
    const d = this.drag;
    if (!d) return;
    if (!d.moved) return this.cancel();
    this.drag = null;
    this.host.hold({ pose: d.pose });
    this.host.cb.onArmTurned(d.pose.armId, d.pose.yaw);
    this.host.redrawAll();
  }

  cancel(): void {
    if (!this.drag) return;
    this.drag = null;
    this.host.cb.onDragPose(null);
    this.host.redrawAll();
  }
}
