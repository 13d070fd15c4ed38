import type { AreaGeometry } from '../geometry/geojson';
import type { Polygon2 } from '../geometry/types';
import type { ArmPlacement, WorkPoint, Boundary } from '../schemas/layout';

export type Severity = 'info' | 'warning' | 'critical';

export const FINDING_KINDS = [
  'unreached-point',
  'assigned-unreachable',
  'handover',
  'shared-zone',
  'reach-into-structure',
  'base-off-floor',
  'base-on-column',
  'reach-beyond-fence',
  'reach-through-opening',
  'fence-clearance',
  'fence-too-low',
  'reach-into-operator-area',
  'reach-into-keepout',
  'unknown-model',
  'computation-failed',
  'opening-too-close',
  'stopping-data-missing',
  'fence-reach-over',
  'fence-reach-through',
  'crushing-gap',
] as const;
export type FindingKind = (typeof FINDING_KINDS)[number];

/** One result of a check. `id` is stable across edits and revisions (kind + the ids involved). */
export interface Finding {
  id: string;
  kind: FindingKind;
  severity: Severity;
  arms: string[];
  points: string[];
  /** Plan mm; null when the finding has no area (e.g. a base point is given in `at`). */
  geometry: AreaGeometry | null;
  /** A plan spot to zoom to, mm. */
  at: [number, number] | null;
  message: string;
  /** Numbers behind the message (areas m², distances mm …). */
  data?: Record<string, number | string>;
}

/**
 * What the analysis needs of one arm model, precomputed once per (model, restricting limits): all
 * regions in the ARM frame (origin on J1 at the base plate, x along J1 zero), mm.
 */
export interface ArmReach {
  /** Largest plan distance of the restricted space from the J1 axis, mm. */
  maxReach: number;
  /** Lowest and highest point of the whole-arm envelope (links, tool, payload), arm frame mm. */
  zMin: number;
  zMax: number;
  /** Restricted space: the whole-arm envelope under the placement's restricting J1 limits, plan projection, arm frame. */
  restricted: Polygon2[];
  /** Reach band of the tool point at a height above the base plate (arm frame z), mm. */
  bandAt(zArm: number): Polygon2[];
  /** Plan projection of the part of the whole-arm envelope below a height (arm frame z), restricting limits applied. */
  restrictedBelow(zArmTop: number): Polygon2[];
  /** Signed margin of a point given in the arm frame (mm, positive = reached); follows the tool point. */
  margin(x: number, y: number, z: number, approach: 'top' | 'any'): number;
  /** The whole-arm envelope in the arm's (r, z) plane turned over J1, for section views (see docs/kinematics.md). */
  envelope: ArmEnvelope;
  /** The model's stopping time per stop category, s (absent where the model does not give it). */
  stopTimeS?: { 0?: number; 1?: number };
}

/** An arm's whole-arm envelope as a side profile turned about J1 (what a section cuts), arm frame, mm and degrees. */
export interface ArmEnvelope {
  /** (r, z) arm frame, mm: r the signed plan distance from the J1 axis, z above the base plate. */
  profile: Polygon2[];
  toleranceMm: number;
  /** Kinematic J1 range, degrees, restricting limits applied. */
  j1RangeDeg: { min: number; max: number };
  /** Sideways spread of the envelope's points off the plane through J1, mm. */
  lateralMm: { min: number; max: number };
}

/** Builds the ArmReach of a model under restricting J1 limits (controller degrees), or throws. */
export type ArmReachFactory = (modelId: number, restrict: ArmPlacement['restrict']) => ArmReach;

/** One structure item of the floor plan (a wall, column or obstacle), plan mm. */
export interface StructureItem {
  /** Stable within a floor plan: layer name + index of the feature in the plan. */
  id: string;
  layer: string;
  role: 'wall' | 'column' | 'obstacle';
  /** Top of the item above the floor, mm; Infinity = full height. */
  top: number;
  polygons: Polygon2[];
  /** Open polylines (walls drawn as lines). */
  lines: Array<Array<[number, number]>>;
  bbox: [number, number, number, number];
}

export interface PreparedFloor {
  /** Union of the floor outline rings (empty when the plan has no outline layer). */
  outline: Polygon2[];
  structures: StructureItem[];
}

export interface AnalysisInput {
  arms: ReadonlyArray<ArmPlacement>;
  workPoints: ReadonlyArray<WorkPoint>;
  boundaries: ReadonlyArray<Boundary>;
  workHeights: ReadonlyArray<number>;
  floor: PreparedFloor | null;
}

export interface SharedZone {
  arms: [string, string];
  areaM2: number;
  points: string[];
  geometry: AreaGeometry | null;
  /** Overlap of the two arms' bands at each work height, m². */
  byHeight: Array<{ height: number; areaM2: number }>;
}

/** The ISO 13855 check of one safeguarded access opening against the arm that governs it. */
export interface SafeguardOpeningRow {
  id: string;
  device: 'interlock' | 'interlock-locking' | 'light-curtain' | 'multi-beam' | 'single-beam';
  stopCategory: 0 | 1;
  /** The arm whose restricted space governs the opening (nearest, or the worst one too close); null with no arm placed. */
  armId: string | null;
  armModelId: number | null;
  /** The arm model field the stopping time came from. */
  stopField: 'stopTimeS' | 'stopTimeCat1S';
  /** Stopping time used, s; null when the model does not give it. */
  stopTimeS: number | null;
  /** T = device response + arm stopping time, s; null when it cannot be formed. */
  tS: number | null;
  /** Required separation distance S, mm (0 for guard locking); null when it cannot be computed. */
  requiredMm: number | null;
  /** Plan distance from the opening's detection line to the arm's restricted space, mm. */
  actualMm: number | null;
  /** null = cannot be judged (stopping data missing, no arm placed). */
  ok: boolean | null;
  /** The formula with its numbers, or why there is none. */
  note: string;
}

/** The ISO 13857 checks of one fence (reach over, and reach through its mesh) against the arm that governs it. */
export interface SafeguardFenceRow {
  id: string;
  heightMm: number;
  armId: string | null;
  /** Hazard height a: top of the arm's envelope above the floor, mm. */
  hazardHeightMm: number | null;
  /** Horizontal distance c required against reaching over, mm; null when the table does not cover the fence or no arm is near. */
  requiredMm: number | null;
  /** Plan distance from the fence's solid parts to the arm's restricted space, mm. */
  actualMm: number | null;
  meshMm: number | null;
  meshShape: 'slot' | 'square' | 'round' | null;
  /** Safety distance s_r against reaching through the mesh, mm. */
  reachThroughMm: number | null;
  ok: boolean | null;
  note: string;
}

export interface SafeguardingResult {
  openings: SafeguardOpeningRow[];
  fences: SafeguardFenceRow[];
}

export interface AnalysisResult {
  findings: Finding[];
  sharedZones: SharedZone[];
  /** pointId → armId → margin mm (positive = reached). */
  coverage: Record<string, Record<string, number>>;
  /** Placed regions per arm, plan mm, for drawing. */
  regions: Record<string, { restricted: AreaGeometry | null; bands: Array<{ height: number; geometry: AreaGeometry | null }> }>;
  /**
   * Safeguarding distances per safeguarded opening and per fence (ISO 13855, ISO 13857). Always set
   * by the analyzer; absent only from revision snapshots frozen before these checks existed.
   */
  safeguarding?: SafeguardingResult;
  timingMs: number;
}
