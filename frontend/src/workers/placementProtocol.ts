/**
 * Messages between the editor and the placement worker (placement search and auto-layout). Lengths
 * plan mm, angles degrees. Each job has an id; `cancel` stops it between steps.
 */
import type { FeatureCollection } from 'geojson';
import type { AutoLayoutResult } from '@shared/analysis';
import type { FloorLayer } from '@shared/analysis';
import type { PlacementMap, PlacementNames, PlacementResult } from '@shared/analysis';
import type { LayoutContent } from '@shared/schemas/layout';
import type { AutoLayoutInput, PlacementSearchInput } from '@shared/schemas/placement';
import type { WorkerArmModel } from './analysisProtocol';

export interface PlacementJobInput {
  content: LayoutContent;
  models: WorkerArmModel[];
  floor: { geometry: FeatureCollection; layers: FloorLayer[] } | null;
}

export type ToPlacementWorker =
  | ({ type: 'search'; id: number; request: PlacementSearchInput } & PlacementJobInput)
  | ({ type: 'auto'; id: number; request: AutoLayoutInput } & PlacementJobInput)
  | { type: 'cancel'; id: number };

/** Scores of one layout from the shared analysis (shared zone m², guarded area m², unreached points). */
export interface LayoutScores {
  sharedZoneM2: number;
  guardedAreaM2: number;
  unreachedPoints: number;
}

export type FromPlacementWorker =
  | { type: 'map'; id: number; progress: number; map: PlacementMap; names: PlacementNames }
  | { type: 'progress'; id: number; progress: number }
  | { type: 'searched'; id: number; result: PlacementResult }
  | { type: 'proposed'; id: number; result: AutoLayoutResult; proposal: LayoutContent; scores: { current: LayoutScores; proposal: LayoutScores } }
  | { type: 'cancelled'; id: number }
  | { type: 'error'; id: number; message: string };
