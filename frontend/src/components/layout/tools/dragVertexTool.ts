/** The drag-vertex tool: drag a corner of the selected boundary; the corner is committed on release. */
import { roundMm } from '../../../editor/layoutEdits';
import type { Tool, ToolHost, ToolPointer, VertexAt } from './tool';

export class DragVertexTool implements Tool<VertexAt> {
  private drag: { vertex: VertexAt; moved: boolean } | null = null;

  constructor(private readonly host: ToolHost) {}

  /** The corner drawn while dragging (once it has moved), or null. */
  vertex(): VertexAt | null {
    return this.drag?.moved ? this.drag.vertex : null;
  }

  down(_p: ToolPointer, vertex: VertexAt): void {
    this.drag = { vertex, moved: false };
  }

  move(p: ToolPointer): void {
    const d = this.drag;
    if (!d) return;
    d.vertex = { ...d.vertex, at: [roundMm(p.plan[0]), roundMm(p.plan[1])] };
    d.moved = true;
    this.host.redrawAll();
  }

  up(): void {
    const d = this.drag;
    if (!d) return;
    if (!d.moved) return this.cancel();
    this.drag = null;
    this.host.hold({ vertex: d.vertex });
    this.host.cb.onVertexMoved(d.vertex.boundaryId, d.vertex.index, d.vertex.at);
    this.host.redrawAll();
  }

  cancel(): void {
    if (!this.drag) return;
    this.drag = null;
    this.host.redrawAll();
  }
}
