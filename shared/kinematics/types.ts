import type { z } from 'zod';

/** A point or vector in the arm frame (origin on the J1 axis at the base plate, z up), mm. */
export interface Vec3 {
  x: number;
  y: number;
  z: number;
}

/** One frame of a chain: origin in the arm frame (mm) and rotation (3×3, row-major). */
export interface Frame {
  label: string;
  origin: Vec3;
  rotation: [[number, number, number], [number, number, number], [number, number, number]];
}

/** Why a pose gives no tool point. An expected non-answer, never NaN coordinates. */
export type PoseFailure = 'out-of-limits' | 'not-assemblable' | 'bad-joint-count';

export type ForwardResult =
  | { ok: true; tool: Vec3; wrist: Vec3; frames: Frame[] }
  | { ok: false; reason: PoseFailure; message: string; axis?: number };

/** A closed ring of (r, z) or (x, y) pairs in mm; the first point is not repeated at the end. */
export type Ring = Array<[number, number]>;
/** A polygon: outer ring first, then holes. */
export type Polygon2 = Ring[];

/**
 * Side-view reach region in the arm's vertical plane: r is the signed radial distance from the
 * J1 axis (negative = reached over the top behind J1), z the height above the base plate, mm.
 */
export interface ReachProfile {
  polygons: Polygon2[];
  /** Largest distance by which the polygon boundary may differ from the true region, mm. */
  toleranceMm: number;
  method: 'exact' | 'sampled';
  /** Largest |r| and smallest |r| of the region (minReach 0 when the region touches the axis). */
  maxReach: number;
  minReach: number;
  zMin: number;
  zMax: number;
}

/** Limits and labels of one axis as the pose panel shows it (controller units: deg or mm). */
export interface AxisInfo {
  label: string;
  kind: 'revolute' | 'prismatic';
  min: number;
  max: number;
}

/** What every kinematic family module exports (one file per family). */
export interface FamilyModule<P> {
  family: string;
  schema: z.ZodType<P>;
  /** Forward kinematics from controller joint values (deg / mm) in the arm frame, mm. */
  forward(params: P, joints: readonly number[]): ForwardResult;
  /** Side reach profile of the tool point (or wrist centre, see the family) in mm. */
  reachProfile(params: P, opts?: { toleranceMm?: number }): ReachProfile;
  /** Range of the reach plane's bearing in the arm frame, kinematic degrees (from J1 limits). */
  j1Range(params: P): { min: number; max: number };
  /** Lateral offset of the reach plane from the J1 axis, mm (0 when the plane contains J1). */
  lateralOffset(params: P): number;
  /** Axes in controller units, for forms and the pose panel. */
  axes(params: P): AxisInfo[];
}
