/**
 * Types shared by the layout scene (layoutScene.ts) and its tools (tools/): what React hands the
 * scene and the callbacks through which the scene hands edits back. Plan mm (x east, y north),
 * yaw degrees CCW from +x.
 */
import type { AreaGeometry } from '@shared/geometry';
import type { LayoutContent } from '@shared/schemas/layout';
import type { AnalysisView, DragPose } from '../../workers/analysisProtocol';
import type { LayoutSelection } from './panelTypes';

export type XY = [number, number];

export type EditorTool = 'select' | 'point' | 'fence' | 'keepout' | 'operator' | 'opening' | 'section';
/** Tools that draw a boundary. */
export type ShapeTool = Exclude<EditorTool, 'select' | 'point' | 'section'>;
/** A section line on the plan: start A, end A′, plan mm. */
export type SectionLineXY = [XY, XY];

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
  /** The section line drawn on the plan, or null. */
  sectionLine?: SectionLineXY | null;
}

export interface SceneCallbacks {
  onSelect(sel: LayoutSelection | null): void;
  /** The pose of the arm being dragged or turned, per pointer move; null when the drag ends. */
  onDragPose(pose: DragPose | null): void;
  onArmMoved(id: string, x: number, y: number): void;
  onArmTurned(id: string, yaw: number): void;
  onVertexMoved(boundaryId: string, index: number, to: XY): void;
  onShapeDrawn(kind: ShapeTool, points: XY[]): void;
  /** The point tool clicked the plan at p (mm). */
  onPointPlaced(p: XY): void;
  /** The section tool finished a line from A to A′ (mm). */
  onSectionDrawn?(line: SectionLineXY): void;
  /** A line for the status bar while drawing (or null). */
  onHint(text: string | null): void;
}
