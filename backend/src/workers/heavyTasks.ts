// The heavy-work thread's task handler (one thread of the pool in services/workerPool.ts): layout
// analysis, reach profiles and bands, arm models' reach summaries, plan-sheet rendering. Pure work on plain data: no database.
import type { FeatureCollection } from 'geojson';
import { createAnalyzer, prepareFloor, type AnalysisResult, type FloorLayer } from '@shared/analysis';
import { armReachFromModels, placedMaxSpace } from '@shared/analysis';
import { reachProfileOf } from '@shared/kinematics';
import { bandAt } from '@shared/kinematics';
import type { AreaGeometry } from '@shared/geometry';
import type { ArmParams } from '@shared/schemas/armModel';
import type { LayoutContent } from '@shared/schemas/layout';
import { reachSummaryOf, type ArmReachSummary } from '../services/armReachSummary';
import { renderPlanSheet } from '../services/planSheet/renderPlanSheet';
import type { PlanSheetInput, PlanSheetOptions } from '../services/planSheet/types';

/** Everything one analysis needs, as loaded from the database (plan frame, mm). */
export interface AnalysisJob {
  /** Arm model id → stored parameters. */
  models: Array<[number, unknown]>;
  floor: { geometry: FeatureCollection; layers: FloorLayer[] } | null;
  content: Pick<LayoutContent, 'arms' | 'workPoints' | 'boundaries' | 'workHeights'>;
}

/** The reach of one parameter set: side profile (arm frame, mm) and plan bands at tool-point heights. */
export interface ReachSummary {
  profile: { polygons: ReturnType<typeof reachProfileOf>['polygons']; method: 'exact' | 'sampled'; zMin: number; zMax: number };
  tolerance: number;
  maxReach: number;
  minReach: number;
  bands: Array<{ height: number; geometry: AreaGeometry }>;
}

/** An analysis with what the editor draws beside it: each arm's maximum space placed on the plan. */
export interface AnalysisViewResult {
  analysis: AnalysisResult;
  maxSpaces: Record<string, AreaGeometry | null>;
}

export type HeavyTask =
  | { kind: 'analysis'; job: AnalysisJob }
  | { kind: 'analysisView'; job: AnalysisJob }
  | { kind: 'reach'; params: ArmParams; heights: number[] }
  | { kind: 'armSummary'; params: ArmParams }
  | { kind: 'planSheet'; input: PlanSheetInput; opts: PlanSheetOptions };

export interface HeavyResults {
  analysis: AnalysisResult;
  analysisView: AnalysisViewResult;
  reach: ReachSummary;
  armSummary: ArmReachSummary;
  planSheet: Uint8Array;
}

/** Runs the shared analysis on loaded data; the same code the editor's worker runs. */
export function analyzeLoaded(job: AnalysisJob): AnalysisResult {
  return analyzeLoadedView(job, false).analysis;
}

/** The analysis and, when `withSpaces`, every arm's maximum space as the editor's worker draws it. */
export function analyzeLoadedView(job: AnalysisJob, withSpaces = true): AnalysisViewResult {
  const params = new Map(job.models);
  const floor = job.floor ? prepareFloor(job.floor.geometry, job.floor.layers) : null;
  const reachFor = armReachFromModels(params);
  const analyzer = createAnalyzer(reachFor);
  const c = job.content;
  const analysis = analyzer.analyze({ arms: c.arms, workPoints: c.workPoints, boundaries: c.boundaries, workHeights: c.workHeights, floor });
  const maxSpaces: Record<string, AreaGeometry | null> = {};
  if (withSpaces) for (const a of c.arms) maxSpaces[a.id] = placedMaxSpace(reachFor, a);
  return { analysis, maxSpaces };
}

/** Side profile and plan bands of a parameter set (arm frame, mm). */
export function reachSummary(params: ArmParams, heights: readonly number[]): ReachSummary {
  const profile = reachProfileOf(params);
  return {
    profile: { polygons: profile.polygons, method: profile.method, zMin: profile.zMin, zMax: profile.zMax },
    tolerance: profile.toleranceMm,
    maxReach: profile.maxReach,
    minReach: profile.minReach,
    bands: heights.map((height) => ({ height, geometry: bandAt(params, height) })),
  };
}

/** The pool's handler: one task in, its result out (structured clone both ways). */
export default async function runHeavyTask(task: HeavyTask): Promise<HeavyResults[HeavyTask['kind']]> {
  switch (task.kind) {
    case 'analysis':
      return analyzeLoaded(task.job);
    case 'analysisView':
      return analyzeLoadedView(task.job);
    case 'reach':
      return reachSummary(task.params, task.heights);
    case 'armSummary':
      return reachSummaryOf(task.params);
    case 'planSheet': {
      const pdf = await renderPlanSheet(task.input, task.opts);
      return new Uint8Array(pdf.buffer, pdf.byteOffset, pdf.byteLength);
    }
  }
}
