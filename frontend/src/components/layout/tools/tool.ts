/**
 * A tool of the layout editor: a small state that the dispatcher (toolDispatcher.ts) feeds pointer
 * events in plan mm (x east, y north). A press on an arm, its turn handle or a boundary corner starts a
 * drag tool for that one gesture; every other event goes to the tool chosen in the toolbar.
 */
import type { DragPose } from '../../../workers/analysisProtocol';
import type { SceneCallbacks, SceneState, XY } from '../sceneTypes';

/** Where the pointer is. */
export interface ToolPointer {
  /** Plan mm under the pointer. */
  plan: XY;
  /** Zoom: screen px per plan mm. */
  k: number;
  /** The boundary whose shape is under the pointer, if any. */
  boundaryId: string | null;
}

export interface Tool<Press = void> {
  /** A press; drag tools are handed what was pressed. */
  down(p: ToolPointer, press: Press): void;
  move(p: ToolPointer): void;
  /** The release: ends a drag; for the click tools, the click (none follows a pan of the plan). */
  up(p: ToolPointer): void;
  /** Drops what is under way, without a hint. */
  cancel(): void;
}

/** A boundary corner on its way somewhere, plan mm. */
export interface VertexAt {
  boundaryId: string;
  index: number;
  at: XY;
}

/** What a finished drag committed, drawn until React hands back content that holds it. */
export interface HeldEdit {
  pose?: DragPose;
  vertex?: VertexAt;
}

/** What the scene lends its tools. */
export interface ToolHost {
  /** The state React handed the scene last. */
  state(): SceneState;
  readonly cb: SceneCallbacks;
  hold(edit: HeldEdit): void;
  /** Redraws the arms' reach and the screen marks (an arm drag). */
  redrawArm(): void;
  /** Redraws the screen marks (arms, handles, labels, the shape being drawn). */
  redrawMarks(): void;
  /** Redraws only the shape being drawn. */
  redrawDraft(): void;
  /** Redraws every overlay. */
  redrawAll(): void;
}
