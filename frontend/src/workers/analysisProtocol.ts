/**
 * Messages between the editor and the analysis worker. Lengths plan mm, angles degrees. The
 * worker is told the arm models and the floor once, then the content on every change; during a
 * drag it gets only the dragged arm's pose, at most once per animation frame.
 */
import type { FeatureCollection } from 'geojson';
import type { FloorLayer } from '@shared/analysis';
import type { SectionResult } from '@shared/analysis';
import type { AnalysisResult } from '@shared/analysis';
import type { AreaGeometry } from '@shared/geometry';
import type { LayoutContent } from '@shared/schemas/layout';

/** An arm model as the worker needs it: its id and kinematic parameters (as the catalogue API sends them). */
export interface WorkerArmModel {
  id: number;
  params: unknown;
}

/** A pose the editor is dragging an arm through (not yet committed to the content). */
export interface DragPose {
  armId: string;
  x: number;
  y: number;
  yaw: number;
}

export type ToWorker =
  | { type: 'models'; models: WorkerArmModel[] }
  | { type: 'floor'; floor: { geometry: FeatureCollection; layers: FloorLayer[] } | null }
  | { type: 'content'; seq: number; content: LayoutContent }
  | { type: 'drag'; seq: number; pose: DragPose | null }
  /** The section line drawn on the plan (start A, end A′, plan mm), or null when there is none. */
  | { type: 'section'; line: [[number, number], [number, number]] | null };

/** What the worker adds to the analysis for drawing: each arm's maximum space (full J1 range), placed on the plan. */
export interface AnalysisView {
  analysis: AnalysisResult;
  maxSpaces: Record<string, AreaGeometry | null>;
  /** The pose (x, y mm; yaw deg) each arm was analysed at, so the drawing can follow a drag before the next result. */
  placed: Record<string, [number, number, number]>;
  /** The side view along the section line, computed with the same content and drag pose; null without a line. */
  section?: SectionResult | null;
}

/** Each arm's pose as the drawing takes it from a view: id → [x, y mm; yaw deg]. */
export function placedOf(content: Pick<LayoutContent, 'arms'>): AnalysisView['placed'] {
  return Object.fromEntries(content.arms.map((a) => [a.id, [a.x, a.y, a.yaw] as [number, number, number]]));
}

/**
 * A result crosses as a delta against the previous one sent (analysisDelta.ts); the page decodes
 * every delta in order, also those too old to show.
 */
export type FromWorker =
  | { type: 'result'; seq: number; dragging: boolean; delta: ViewDelta }
  | { type: 'error'; seq: number; message: string };

/** One analysis result as it crosses from the worker: the parts changed since the previous one sent (analysisDelta.ts). */
export interface ViewDelta {
  /** The decoder starts afresh from this delta (it carries everything). */
  reset: boolean;
  /** Finding ids in the result's order; null when the order is the previous one's. */
  findingOrder: string[] | null;
  /** Findings new or changed since the previous result sent (all of them on a reset). */
  findings: AnalysisResult['findings'];
  coverage: Record<string, AnalysisResult['coverage'][string]>;
  coverageRemoved: string[];
  regions: Record<string, AnalysisResult['regions'][string]>;
  regionsRemoved: string[];
  maxSpaces: Record<string, AreaGeometry | null>;
  maxSpacesRemoved: string[];
  /** Small parts, always whole. */
  sharedZones: AnalysisResult['sharedZones'];
  safeguarding: AnalysisResult['safeguarding'];
  timingMs: number;
  placed: AnalysisView['placed'];
  section: AnalysisView['section'];
}
