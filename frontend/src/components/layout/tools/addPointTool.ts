/** The add-point tool: a click on the plan places a work point there (rounded to 0.1 mm). */
import { roundMm } from '../../../editor/layoutEdits';
import type { Tool, ToolHost, ToolPointer } from './tool';

export class AddPointTool implements Tool {
  constructor(private readonly host: ToolHost) {}

  hint(): string {
    return 'Click the plan to add a work point at the first work height; Esc returns to Select.';
  }

  down(): void {}

  move(): void {}

  up(p: ToolPointer): void {
    this.host.cb.onPointPlaced([roundMm(p.plan[0]), roundMm(p.plan[1])]);
  }

  cancel(): void {}
}
