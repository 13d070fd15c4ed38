/**
 * The draw-boundary tool, one per boundary kind: fences and areas corner by corner (Enter or a
 * double-click finishes, Esc drops), openings by two clicks snapped onto a fence. Plan mm.
 */
import type { LayoutContent } from '@shared/schemas/layout';
import { nearestFence, nearestOnPolyline, roundMm } from '../../../editor/layoutEdits';
import type { ShapeTool, XY } from '../sceneTypes';
import type { Tool, ToolHost, ToolPointer } from './tool';

/** Screen px within which a click counts as on a fence (opening tool). */
export const FENCE_PICK_PX = 24;
/** Screen px within which a click repeats the corner before it (the second click of a double-click). */
export const REPEAT_CLICK_PX = 4;

/** Corners a shape of this kind needs. */
export function pointsNeeded(kind: ShapeTool): number {
  return kind === 'fence' || kind === 'opening' ? 2 : 3;
}

/** Keep-outs and operator areas are closed; fences and openings are open lines. */
export const isClosedShape = (kind: ShapeTool): boolean => kind === 'keepout' || kind === 'operator';

/** Whether a click at `p` repeats the last corner: closer than REPEAT_CLICK_PX on screen (plan mm, px per mm). */
export function isRepeatClick(last: Readonly<XY> | undefined, p: Readonly<XY>, k: number): boolean {
  return !!last && Math.hypot(last[0] - p[0], last[1] - p[1]) * k < REPEAT_CLICK_PX;
}

export type OpeningEnd = { ok: true; at: XY } | { ok: false; reason: 'no-fence' | 'off-fence' };

/**
 * Where an opening's end goes for a click at `p`: the nearest point on the nearest fence, when that
 * fence is within FENCE_PICK_PX on screen (plan mm; k = px per mm).
 */
export function openingEndAt(content: LayoutContent, p: Readonly<XY>, k: number): OpeningEnd {
  const near = nearestFence(content, p as XY);
  if (!near) return { ok: false, reason: 'no-fence' };
  if (near.distance > FENCE_PICK_PX / k) return { ok: false, reason: 'off-fence' };
  return { ok: true, at: nearestOnPolyline(near.fence.points as XY[], p as XY)!.point };
}

/** The status-bar line while drawing a shape of this kind with n corners placed. */
export function drawHint(kind: ShapeTool, n: number): string {
  switch (kind) {
    case 'fence':
      return n === 0 ? 'Click the fence’s first corner.' : `${n} point${n === 1 ? '' : 's'} — click the next corner; Enter or double-click finishes, Esc cancels.`;
    case 'keepout':
    case 'operator':
      return n < 3 ? `Click the corners of the area (${n} of at least 3).` : `${n} corners — Enter or double-click closes the area, Esc cancels.`;
    case 'opening':
      return n === 0 ? 'Click on a fence where the opening starts.' : 'Click on the fence where the opening ends.';
  }
}

/** The shape being drawn, for the drawing: corners placed, the pointer, closed or open. */
export interface Draft {
  points: readonly XY[];
  cursor: XY | null;
  closed: boolean;
}

export class DrawBoundaryTool implements Tool {
  private points: XY[] = [];
  private cursor: XY | null = null;

  constructor(
    private readonly host: ToolHost,
    readonly kind: ShapeTool,
  ) {}

  /** Openings end on their second click; the other shapes also finish on a double-click. */
  get finishesOnDoubleClick(): boolean {
    return this.kind !== 'opening';
  }

  draft(): Draft {
    return { points: this.points, cursor: this.cursor, closed: isClosedShape(this.kind) };
  }

  isDrawing(): boolean {
    return this.points.length > 0;
  }

  hint(): string {
    return drawHint(this.kind, this.points.length);
  }

  /** Corners are placed on the click (up), so a pan that starts on the plan places none. */
  down(): void {}

  move(p: ToolPointer): void {
    if (this.points.length === 0) return;
    this.cursor = p.plan;
    this.host.redrawDraft();
  }

  up(p: ToolPointer): void {
    const { cb } = this.host;
    if (this.kind === 'opening') {
      const end = openingEndAt(this.host.state().content, p.plan, p.k);
      if (!end.ok) {
        cb.onHint(end.reason === 'off-fence' ? 'That is not on a fence: click on the fence line.' : 'Draw a fence first: an opening is cut into a fence.');
        return;
      }
      if (this.points.length === 0) {
        this.points = [end.at];
      } else {
        const pts: XY[] = [this.points[0], end.at];
        this.points = [];
        cb.onShapeDrawn('opening', pts);
      }
      cb.onHint(this.hint());
      this.host.redrawMarks();
      return;
    }
    if (isRepeatClick(this.points[this.points.length - 1], p.plan, p.k)) return;
    this.points.push([roundMm(p.plan[0]), roundMm(p.plan[1])]);
    cb.onHint(this.hint());
    this.host.redrawMarks();
  }

  /** Ends the shape (Enter, double-click), or says how many corners it still needs. */
  finish(): void {
    const need = pointsNeeded(this.kind);
    if (this.points.length < need) {
      this.host.cb.onHint(`Needs at least ${need} points; keep clicking, or Esc to cancel.`);
      return;
    }
    const pts = this.points;
    this.points = [];
    this.cursor = null;
    this.host.cb.onShapeDrawn(this.kind, pts);
    this.host.cb.onHint(this.hint());
    this.host.redrawMarks();
  }

  cancel(): void {
    this.points = [];
    this.cursor = null;
  }
}
