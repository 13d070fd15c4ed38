/**
 * The select tool: a click on a boundary selects it, a click on the empty plan clears the selection.
 * Presses on arms, turn handles and corners start the drag tools (see toolDispatcher.ts).
 */
import type { Tool, ToolHost, ToolPointer } from './tool';

export class SelectTool implements Tool {
  constructor(private readonly host: ToolHost) {}

  hint(): null {
    return null;
  }

  down(): void {}

  move(): void {}

  up(p: ToolPointer): void {
    this.host.cb.onSelect(p.boundaryId === null ? null : { kind: 'boundary', id: p.boundaryId });
  }

  cancel(): void {}
}
