/**
 * Safety distances against reaching over and through a protective structure (ISO 13857, persons
 * aged 14 and over), and the minimum gap against crushing the whole body (ISO 13854). Table
 * lookups only: between rows or columns the value giving more safety is taken, never an
 * interpolation.
 */
import { SafeguardInputError } from './separation';

/** Structure heights b (mm), the columns of the high-risk reach-over table. */
export const REACH_OVER_COLUMNS_MM = [1000, 1200, 1400, 1600, 1800, 2000, 2200, 2400, 2500, 2700] as const;

/**
 * High-risk reach-over table: hazard height a (mm) → horizontal distance c (mm) per column b.
 * Rows 2000…2700 checked against a published reproduction of the table; rows below 2000 are
 * values from memory of the same table, to be verified against the standard.
 */
export const REACH_OVER_ROWS: ReadonlyArray<{ aMm: number; cMm: readonly number[] }> = [
  { aMm: 2700, cMm: [0, 0, 0, 0, 0, 0, 0, 0, 0, 0] },
  { aMm: 2600, cMm: [900, 800, 700, 600, 600, 500, 400, 300, 100, 0] },
  { aMm: 2400, cMm: [1100, 1000, 900, 800, 700, 600, 400, 300, 100, 0] },
  { aMm: 2200, cMm: [1300, 1200, 1000, 900, 800, 600, 400, 300, 0, 0] },
  { aMm: 2000, cMm: [1400, 1300, 1100, 900, 800, 600, 400, 0, 0, 0] },
  { aMm: 1800, cMm: [1500, 1400, 1100, 900, 800, 600, 0, 0, 0, 0] },
  { aMm: 1600, cMm: [1500, 1400, 1100, 900, 800, 500, 0, 0, 0, 0] },
  { aMm: 1400, cMm: [1500, 1400, 1100, 900, 800, 0, 0, 0, 0, 0] },
  { aMm: 1200, cMm: [1500, 1400, 1100, 900, 700, 0, 0, 0, 0, 0] },
  { aMm: 1000, cMm: [1500, 1400, 1000, 800, 0, 0, 0, 0, 0, 0] },
  { aMm: 800, cMm: [1500, 1300, 900, 600, 0, 0, 0, 0, 0, 0] },
  { aMm: 600, cMm: [1400, 1300, 800, 0, 0, 0, 0, 0, 0, 0] },
  { aMm: 400, cMm: [1400, 1200, 400, 0, 0, 0, 0, 0, 0, 0] },
  { aMm: 200, cMm: [1200, 900, 0, 0, 0, 0, 0, 0, 0, 0] },
  { aMm: 0, cMm: [1100, 500, 0, 0, 0, 0, 0, 0, 0, 0] },
];

/** Hazard height (mm) at or above which a hazard is out of reach upwards (high risk). */
export const OUT_OF_REACH_UPWARD_MM = 2700;
/** Lowest structure height (mm) the reach-over table covers. */
export const REACH_OVER_MIN_STRUCTURE_MM = 1000;

export interface ReachOver {
  /** Horizontal distance c required between the structure and the hazard, mm. */
  distanceMm: number;
  /** The table row (hazard height a) whose value was taken, mm. */
  rowMm: number;
  /** The table column (structure height b) whose value was taken, mm. */
  columnMm: number;
}

function finite(field: string, v: unknown, label: string): number {
  if (typeof v !== 'number' || !Number.isFinite(v)) throw new SafeguardInputError(field, `${label} is required (mm).`);
  if (v < 0) throw new SafeguardInputError(field, `${label} cannot be negative.`);
  if (v > 20000) throw new SafeguardInputError(field, `${label} of ${v} mm is not plausible.`);
  return v;
}

/** Thrown when the table does not cover the case (a structure lower than 1000 mm). */
export class NotCoveredError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'NotCoveredError';
  }
}

/**
 * Horizontal distance c (mm) a structure of height b must keep from a hazard at height a so that
 * nobody reaches over it (ISO 13857 high-risk table). Structure heights between columns take the
 * lower column and hazard heights between rows the larger of the two rows' values (more safety).
 */
export function reachOverDistance(hazardHeightMm: number, structureHeightMm: number): ReachOver {
  const a = finite('hazardHeightMm', hazardHeightMm, 'Hazard height');
  const b = finite('structureHeightMm', structureHeightMm, 'Structure height');
  if (b < REACH_OVER_MIN_STRUCTURE_MM) {
    throw new NotCoveredError(`ISO 13857 does not cover structures lower than ${REACH_OVER_MIN_STRUCTURE_MM} mm against reaching over (this one is ${b} mm): such a structure does not restrict movement enough; raise it or guard otherwise.`);
  }
  let col = 0;
  for (let i = 0; i < REACH_OVER_COLUMNS_MM.length; i++) if (REACH_OVER_COLUMNS_MM[i] <= b) col = i;
  if (a >= OUT_OF_REACH_UPWARD_MM) return { distanceMm: 0, rowMm: OUT_OF_REACH_UPWARD_MM, columnMm: REACH_OVER_COLUMNS_MM[col] };
  // Rows run from high a to low a; the hazard lies between rows `i` (above) and `i + 1` (below), or on one.
  let best: { c: number; a: number } | null = null;
  for (let i = 0; i < REACH_OVER_ROWS.length; i++) {
    const row = REACH_OVER_ROWS[i];
    const next = REACH_OVER_ROWS[i + 1];
    const onRow = row.aMm === a;
    const bracket = next && row.aMm > a && next.aMm < a;
    if (onRow) {
      best = { c: row.cMm[col], a: row.aMm };
      break;
    }
    if (bracket) {
      best = row.cMm[col] >= next.cMm[col] ? { c: row.cMm[col], a: row.aMm } : { c: next.cMm[col], a: next.aMm };
      break;
    }
  }
  const chosen = best ?? { c: REACH_OVER_ROWS[REACH_OVER_ROWS.length - 1].cMm[col], a: 0 };
  return { distanceMm: chosen.c, rowMm: chosen.a, columnMm: REACH_OVER_COLUMNS_MM[col] };
}

export const MESH_SHAPES = ['slot', 'square', 'round'] as const;
export type MeshShape = (typeof MESH_SHAPES)[number];

/** Reach-through table (age 14 and over): opening e up to (mm) → safety distance s_r (mm) for slot / square / round. */
export const REACH_THROUGH_ROWS: ReadonlyArray<{ upToMm: number; slot: number; square: number; round: number }> = [
  { upToMm: 4, slot: 2, square: 2, round: 2 },
  { upToMm: 6, slot: 10, square: 5, round: 5 },
  { upToMm: 8, slot: 20, square: 15, round: 5 },
  { upToMm: 10, slot: 80, square: 25, round: 20 },
  { upToMm: 12, slot: 100, square: 80, round: 80 },
  { upToMm: 20, slot: 120, square: 120, round: 120 },
  { upToMm: 30, slot: 850, square: 120, round: 120 },
  { upToMm: 40, slot: 850, square: 200, round: 120 },
  { upToMm: 120, slot: 850, square: 850, round: 850 },
];

/**
 * Safety distance s_r (mm) between an opening of size e (slot width, square side or round
 * diameter) and the hazard behind it (ISO 13857, age 14 and over). Openings above 120 mm let a
 * body through and are not covered.
 */
export function reachThroughDistance(openingMm: number, shape: MeshShape): { distanceMm: number; rowUpToMm: number } {
  const e = finite('openingMm', openingMm, 'Opening size');
  if (!MESH_SHAPES.includes(shape)) throw new SafeguardInputError('shape', `Opening shape must be one of ${MESH_SHAPES.join(', ')}.`);
  if (e === 0) throw new SafeguardInputError('openingMm', 'Opening size must be greater than 0 mm.');
  const row = REACH_THROUGH_ROWS.find((r) => e <= r.upToMm);
  if (!row) throw new NotCoveredError(`An opening of ${e} mm lets a person's body through; ISO 13857 gives no reach-through distance above 120 mm — treat it as an access opening with its own safeguard.`);
  return { distanceMm: row[shape], rowUpToMm: row.upToMm };
}

/** Minimum gap (mm) that keeps a person's whole body from being crushed (ISO 13854). */
export const CRUSHING_GAP_BODY_MM = 500;
