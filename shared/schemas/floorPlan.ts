import { z } from 'zod';
import type { FeatureCollection, Geometry } from 'geojson';
import { finiteNumber, MAX_LENGTH_MM, NO_CONTROL_CHARACTERS, SINGLE_LINE_MESSAGE } from './fields';

/**
 * Drawing units a floor plan can be read in: every $INSUNITS code 1–24 of the DXF reference
 * (HEADER section), with its length in millimetres. Factors are exact by definition:
 * inch = 25.4 mm (international yard and pound agreement, 1959; NIST SP 811), US survey foot =
 * 1200/3937 m (NIST), astronomical unit = 149 597 870 700 m (IAU 2012 Resolution B2),
 * light-year = 9 460 730 472 580 800 m (IAU: Julian year × c), parsec = 648 000/π au
 * (IAU 2015 Resolution B2).
 */
export const UNIT_NAMES = [
  { name: 'in', label: 'Inches', mm: 25.4, insunits: 1 },
  { name: 'ft', label: 'Feet', mm: 304.8, insunits: 2 },
  { name: 'mi', label: 'Miles', mm: 1_609_344, insunits: 3 },
  { name: 'mm', label: 'Millimetres', mm: 1, insunits: 4 },
  { name: 'cm', label: 'Centimetres', mm: 10, insunits: 5 },
  { name: 'm', label: 'Metres', mm: 1000, insunits: 6 },
  { name: 'km', label: 'Kilometres', mm: 1_000_000, insunits: 7 },
  { name: 'uin', label: 'Microinches', mm: 2.54e-5, insunits: 8 },
  { name: 'mil', label: 'Mils (thousandths of an inch)', mm: 0.0254, insunits: 9 },
  { name: 'yd', label: 'Yards', mm: 914.4, insunits: 10 },
  { name: 'angstrom', label: 'Ångströms', mm: 1e-7, insunits: 11 },
  { name: 'nm', label: 'Nanometres', mm: 1e-6, insunits: 12 },
  { name: 'um', label: 'Micrometres', mm: 1e-3, insunits: 13 },
  { name: 'dm', label: 'Decimetres', mm: 100, insunits: 14 },
  { name: 'dam', label: 'Decametres', mm: 10_000, insunits: 15 },
  { name: 'hm', label: 'Hectometres', mm: 100_000, insunits: 16 },
  { name: 'Gm', label: 'Gigametres', mm: 1e12, insunits: 17 },
  { name: 'au', label: 'Astronomical units', mm: 149_597_870_700_000, insunits: 18 },
  { name: 'ly', label: 'Light-years', mm: 9_460_730_472_580_800_000, insunits: 19 },
  { name: 'pc', label: 'Parsecs', mm: (648_000 / Math.PI) * 149_597_870_700_000, insunits: 20 },
  { name: 'us-ft', label: 'US survey feet', mm: 1_200_000 / 3937, insunits: 21 },
  { name: 'us-in', label: 'US survey inches', mm: 100_000 / 3937, insunits: 22 },
  { name: 'us-yd', label: 'US survey yards', mm: 3_600_000 / 3937, insunits: 23 },
  { name: 'us-mi', label: 'US survey miles', mm: 6_336_000_000 / 3937, insunits: 24 },
] as const;

export type UnitName = (typeof UNIT_NAMES)[number]['name'];

/**
 * The units a building's floor plan is drawn in, in the order a person would look for them: the
 * metric lengths of architectural drawings and the inch-based ones of US and UK practice (common
 * practice). The unit picker offers these; a file whose header names another unit is still read in
 * it, and the picker shows that unit too so the choice stays visible.
 */
export const BUILDING_UNITS: readonly UnitName[] = ['mm', 'cm', 'dm', 'm', 'in', 'ft', 'yd', 'us-ft', 'us-in'];

/** The units the unit picker offers: the building units, plus `current` when the file named another. */
export function pickerUnits(current: UnitName): Array<(typeof UNIT_NAMES)[number]> {
  const names = BUILDING_UNITS.includes(current) ? BUILDING_UNITS : [...BUILDING_UNITS, current];
  return names.map((n) => UNIT_NAMES.find((u) => u.name === n)!);
}
const unitNameList = UNIT_NAMES.map((u) => u.name) as [UnitName, ...UnitName[]];
export const UnitNameSchema = z.enum(unitNameList);

/** Millimetres per drawing unit of `name` (exact factor of UNIT_NAMES). */
export function unitToMm(name: UnitName): number {
  const u = UNIT_NAMES.find((x) => x.name === name);
  if (!u) throw new RangeError(`unit: unknown unit "${String(name)}"`);
  return u.mm;
}

/** What a layer of an imported floor plan stands for in the plan. */
export const LAYER_ROLES = ['outline', 'wall', 'column', 'obstacle', 'ignore'] as const;
export const LayerRole = z.enum(LAYER_ROLES);
export type LayerRole = z.infer<typeof LayerRole>;

export interface ImportLayer {
  name: string;
  role: LayerRole;
  /** Height of what the layer draws, mm above finished floor; null = full height. */
  height: number | null;
  /** Entities placed on the layer after block expansion (one block inserted 6× counts 6×). */
  entityCount: number;
  /** Layer colour from the file's ACI colour number, `#rrggbb`. */
  color: string;
}

/** Properties of every feature of an imported floor plan. */
export interface PlanFeatureProps {
  layer: string;
  /** Source entity type ('LINE', 'LWPOLYLINE', …), or 'JOINED' for a chain of several. */
  entity: string;
  closed: boolean;
  /** Label text (Point features of TEXT/MTEXT). */
  text?: string;
  /** Label height, mm. */
  textHeight?: number;
  /** Label direction, degrees counter-clockwise from +x. */
  rotation?: number;
  /** Number of entities a 'JOINED' feature was made from. */
  parts?: number;
}

export interface ImportBounds {
  minX: number;
  minY: number;
  maxX: number;
  maxY: number;
}

/** The result of reading a DXF floor plan: plan frame (x east, y north), millimetres. */
export interface ImportResult {
  units: UnitName;
  unitsSource: 'header' | 'default' | 'chosen';
  /** The raw $INSUNITS header value (null when the header has none). */
  insunits: number | null;
  bounds: ImportBounds;
  layers: ImportLayer[];
  geometry: FeatureCollection<Geometry, PlanFeatureProps>;
  /** Plain sentences for the planner. */
  warnings: string[];
  stats: { entities: number; features: number; skipped: Record<string, number> };
  /** Largest distance of a drawn curve from the true one, mm (grows when rescaled up). */
  chordToleranceMm: number;
  /**
   * Where the plan's 0,0 lies in the drawing, mm: a drawing far from its own origin (map grid
   * coordinates) is moved by this much at import, and moved back on export. 0,0 when not moved.
   */
  origin: PlanOrigin;
  /** Entities left out: on purpose (annotation, paper space, fills) and those that could not be read. */
  notes: ImportNotes;
  /** Joining of lines and arcs into outlines: gaps closed within the tolerance, ends left open. */
  gaps: ImportGaps;
}

export interface PlanOrigin {
  x: number;
  y: number;
}

export interface ImportNotes {
  ignored: string[];
  unread: string[];
}

export interface ImportGaps {
  closed: number;
  open: number;
  /** Open ends on floor outline layers, plan mm (at most a few hundred listed; `open` counts all). */
  ends: Array<{ layer: string; x: number; y: number }>;
}

/** Default height of what each role draws, mm (null = full height). */
export const DEFAULT_ROLE_HEIGHT: Record<LayerRole, number | null> = {
  outline: null,
  wall: null,
  column: null,
  obstacle: 1500,
  ignore: null,
};

/** One layer's changes in a floor-plan patch. */
export const LayerPatch = z.object({
  name: z.string().regex(NO_CONTROL_CHARACTERS, SINGLE_LINE_MESSAGE).min(1, 'Name the layer').max(255),
  role: LayerRole.optional(),
  height: finiteNumber('Enter a height in mm')
    .positive('Height must be above the floor')
    .max(MAX_LENGTH_MM, 'Height must be at most 100 m')
    .nullable()
    .optional(),
});
export type LayerPatch = z.infer<typeof LayerPatch>;

/** PATCH body of a floor plan: layer roles/heights and the drawing unit. */
export const FloorPlanPatch = z
  .object({
    layers: z.array(LayerPatch).max(10_000).optional(),
    units: UnitNameSchema.optional(),
  })
  .refine((v) => v.layers !== undefined || v.units !== undefined, { message: 'Nothing to change' })
  .refine((v) => !v.layers || new Set(v.layers.map((l) => l.name)).size === v.layers.length, {
    message: 'Each layer may appear once',
    path: ['layers'],
  });
export type FloorPlanPatch = z.infer<typeof FloorPlanPatch>;

/** One layer's saved role: matched to the layers of a later drawing by name, ignoring case. */
export const SavedLayerRole = z.object({
  name: z.string().min(1, 'Name the layer').max(255),
  role: LayerRole,
  height: finiteNumber('Enter a height in mm')
    .positive('Height must be above the floor')
    .max(MAX_LENGTH_MM, 'Height must be at most 100 m')
    .nullable(),
});
export type SavedLayerRole = z.infer<typeof SavedLayerRole>;

/** PUT body of a project's saved layer roles. */
export const SavedLayerRoles = z
  .object({ layers: z.array(SavedLayerRole).max(10_000) })
  .refine((v) => new Set(v.layers.map((l) => l.name.toLowerCase())).size === v.layers.length, {
    message: 'Each layer may appear once',
    path: ['layers'],
  });
export type SavedLayerRoles = z.infer<typeof SavedLayerRoles>;
