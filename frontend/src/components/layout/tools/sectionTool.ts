/**
 * The section tool: a click sets the start A of a section line, a second click its end A′; the
 * line then stays on the plan and the side view below the plan shows the layout cut along it.
 * Esc drops a line under way. Plan mm (x east, y north).
 */
import { roundMm } from '../../../editor/layoutEdits';
import type { XY } from '../sceneTypes';
import type { Tool, ToolHost, ToolPointer } from './tool';

/** Shortest section line, screen px: a shorter second click is taken as a slip and ignored. */
export const MIN_SECTION_PX = 8;

/** The line under way: its start and the pointer (plan mm). */
export interface SectionDraft {
  start: XY;
  cursor: XY | null;
}

export class SectionTool implements Tool {
  private start: XY | null = null;
  private cursor: XY | null = null;

  constructor(private readonly host: ToolHost) {}

  hint(): string {
    return this.start ? 'Click where the section ends (A′); Esc cancels.' : 'Click where the section starts (A), then where it ends (A′).';
  }

  draft(): SectionDraft | null {
    return this.start ? { start: this.start, cursor: this.cursor } : null;
  }

  isDrawing(): boolean {
    return this.start !== null;
  }

  /** Ends are placed on the click (up), so a pan that starts on the plan places none. */
  down(): void {}

  move(p: ToolPointer): void {
    if (!this.start) return;
    this.cursor = p.plan;
    this.host.redrawMarks();
  }

  up(p: ToolPointer): void {
    const at: XY = [roundMm(p.plan[0]), roundMm(p.plan[1])];
    if (!this.start) {
      this.start = at;
      this.cursor = null;
      this.host.cb.onHint(this.hint());
      this.host.redrawMarks();
      return;
    }
    if (Math.hypot(at[0] - this.start[0], at[1] - this.start[1]) * p.k < MIN_SECTION_PX) return;
    const line: [XY, XY] = [this.start, at];
    this.start = null;
    this.cursor = null;
    this.host.cb.onSectionDrawn?.(line);
    this.host.redrawMarks();
  }

  cancel(): void {
    this.start = null;
    this.cursor = null;
  }
}
