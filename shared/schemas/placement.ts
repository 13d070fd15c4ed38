import { z } from 'zod';
import { degrees, finiteNumber, lengthMm, nonNegativeMm, positiveId } from './fields';

const Id = z.string().trim().min(1, 'Give an id').max(24, 'Use at most 24 characters');

/** A placement search: one arm model over the floor for chosen work points (lengths mm, angles deg). */
export const PlacementSearchInput = z
  .object({
    armModelId: positiveId('Choose an arm model'),
    /** A placed arm being moved: left out of the arms the candidates are ranked against. */
    armId: Id.optional(),
    pointIds: z.array(Id).min(1, 'Choose at least one work point').max(5000, 'At most 5000 work points'),
    minMarginMm: nonNegativeMm().default(0),
    yawMinDeg: degrees().default(-180),
    yawMaxDeg: degrees().default(180),
    yawStepDeg: finiteNumber().refine((v) => v >= 0.5 && v <= 360, { message: 'Yaw step must be between 0.5° and 360°' }).default(5),
    mountHeightMm: lengthMm().default(0),
    restrict: z
      .object({ j1Min: degrees(), j1Max: degrees() })
      .refine((r) => r.j1Min < r.j1Max, { message: 'J1 min must be below J1 max', path: ['j1Max'] })
      .optional(),
    gridMm: finiteNumber().refine((v) => v >= 5 && v <= 50, { message: 'Grid must be between 5 and 50 mm' }).default(10),
  })
  .strict()
  .refine((q) => q.yawMaxDeg >= q.yawMinDeg, { message: 'Yaw to must not be below yaw from', path: ['yawMaxDeg'] })
  .refine((q) => (q.yawMaxDeg - q.yawMinDeg) / q.yawStepDeg <= 720, { message: 'Too many yaw steps: use a larger yaw step', path: ['yawStepDeg'] });
export type PlacementSearchInput = z.infer<typeof PlacementSearchInput>;

/** Auto-layout: available arm models with how many of each, for chosen work points. */
export const AutoLayoutInput = z
  .object({
    models: z
      .array(z.object({ armModelId: positiveId('Choose an arm model'), count: z.number().int().min(1, 'Count must be at least 1').max(50, 'At most 50 of one model') }).strict())
      .min(1, 'Choose at least one arm model')
      .max(20),
    pointIds: z.array(Id).min(1, 'Choose at least one work point').max(5000, 'At most 5000 work points'),
    minMarginMm: nonNegativeMm().default(0),
    mountHeightMm: lengthMm().default(0),
    seed: z.number().int().min(0).max(2 ** 31 - 1).default(1),
    timeLimitS: finiteNumber().refine((v) => v > 0 && v <= 60, { message: 'Time limit must be between 0 and 60 s' }).default(10),
  })
  .strict();
export type AutoLayoutInput = z.infer<typeof AutoLayoutInput>;

/** The placement map as JSON: row-major from the origin (south-west corner), null = infeasible. */
export interface PlacementCellsDto {
  gridMm: number;
  origin: [number, number];
  cols: number;
  rows: number;
  worstMarginMm: Array<number | null>;
}

export interface PlacementSearchDto {
  candidates: Array<{ x: number; y: number; yawDeg: number; worstMarginMm: number; sharedZoneM2: number; fenceLengthMm: number; limitingPointId: string }>;
  feasibleAreaM2: number;
  cells: PlacementCellsDto;
  /** The most limiting reason per work point. */
  limits: Array<{ pointId: string; reason: string; shortMm: number | null }>;
}
