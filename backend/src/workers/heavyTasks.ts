// The heavy-work thread's task handler (one thread of the pool in services/workerPool.ts): layout
// analysis, reach profiles and bands, arm models' reach summaries, plan-sheet rendering. Pure work on plain data: no database.
import type { FeatureCollection } from 'geojson';
import { createAnalyzer, prepareFloor, type AnalysisResult, type FloorLayer } from '@shared/analysis';
import { armReachFromModels } from '@shared/analysis';
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

export type HeavyTask =
  | { kind: 'analysis'; job: AnalysisJob }
  | { kind: 'reach'; params: ArmParams; heights: number[] }
  | { kind: 'armSummary'; params: ArmParams }
  | { kind: 'planSheet'; input: PlanSheetInput; opts: PlanSheetOptions };

export interface HeavyResults {
  analysis: AnalysisResult;
  reach: ReachSummary;
  armSummary: ArmReachSummary;
  planSheet: Uint8Array;
}

/** Runs the shared analysis on loaded data; the same code the editor's worker runs. */
export function analyzeLoaded(job: AnalysisJob): AnalysisResult {
  const params = new Map(job.models);
  const floor = job.floor ? prepareFloor(job.floor.geometry, job.floor.layers) : null;
  const analyzer = createAnalyzer(armReachFromModels(params));
  const c = job.content;
  return analyzer.analyze({ arms: c.arms, workPoints: c.workPoints, boundaries: c.boundaries, workHeights: c.workHeights, floor });
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
