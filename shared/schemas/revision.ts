import { z } from 'zod';
import type { FeatureCollection, MultiPolygon, Polygon } from 'geojson';
import { LayerRole } from './floorPlan';
import { LayoutContent, MESH_SHAPE_NAMES, SAFEGUARD_DEVICE_NAMES } from './layout';

/**
 * A revision's frozen snapshot and its comparison with the revision before, as stored (JSONB) and
 * as the review page receives them. Plan frame, mm; angles in degrees.
 *
 * The analysis part repeats the shape of the analysis result (shared/analysis/types.ts) in zod, as
 * schemas import nothing but zod; the server assigns one to the other in both directions (building
 * a snapshot, drawing a sheet from one), so the compiler keeps them the same.
 */

const isObject = (v: unknown): v is Record<string, unknown> => typeof v === 'object' && v !== null && !Array.isArray(v);

/** A Polygon or MultiPolygon (GeoJSON), plan mm. */
const AreaGeometry = z.custom<Polygon | MultiPolygon>(
  (v) => isObject(v) && (v.type === 'Polygon' || v.type === 'MultiPolygon') && Array.isArray(v.coordinates),
  { message: 'Expected a GeoJSON Polygon or MultiPolygon' },
);

/** The floor plan's features (GeoJSON FeatureCollection), plan mm. */
const PlanGeometry = z.custom<FeatureCollection>((v) => isObject(v) && v.type === 'FeatureCollection' && Array.isArray(v.features), {
  message: 'Expected a GeoJSON FeatureCollection',
});

/** The kinds of finding the analysis makes (the same list as FINDING_KINDS of the analysis). */
const FINDING_KIND_NAMES = [
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

const PlanXY = z.tuple([z.number(), z.number()]);

/** One finding of the analysis; `id` is stable across revisions (kind + the ids involved). */
export const SnapshotFinding = z.object({
  id: z.string(),
  kind: z.enum(FINDING_KIND_NAMES),
  severity: z.enum(['info', 'warning', 'critical']),
  arms: z.array(z.string()),
  points: z.array(z.string()),
  geometry: AreaGeometry.nullable(),
  at: PlanXY.nullable(),
  message: z.string(),
  data: z.record(z.string(), z.union([z.number(), z.string()])).optional(),
});

const num = z.number();
/** Safeguarding rows of the analysis (distances mm, times s); see SafeguardingResult of the analysis. */
export const SnapshotSafeguarding = z.object({
  openings: z.array(
    z.object({
      id: z.string(),
      device: z.enum(SAFEGUARD_DEVICE_NAMES),
      stopCategory: z.union([z.literal(0), z.literal(1)]),
      armId: z.string().nullable(),
      armModelId: num.nullable(),
      stopField: z.enum(['stopTimeS', 'stopTimeCat1S']),
      stopTimeS: num.nullable(),
      tS: num.nullable(),
      requiredMm: num.nullable(),
      actualMm: num.nullable(),
      ok: z.boolean().nullable(),
      note: z.string(),
    }),
  ),
  fences: z.array(
    z.object({
      id: z.string(),
      heightMm: num,
      armId: z.string().nullable(),
      hazardHeightMm: num.nullable(),
      requiredMm: num.nullable(),
      actualMm: num.nullable(),
      meshMm: num.nullable(),
      meshShape: z.enum(MESH_SHAPE_NAMES).nullable(),
      reachThroughMm: num.nullable(),
      ok: z.boolean().nullable(),
      note: z.string(),
    }),
  ),
});

/** The analysis result frozen with the layout (areas m², distances and margins mm). */
export const SnapshotAnalysis = z.object({
  findings: z.array(SnapshotFinding),
  sharedZones: z.array(
    z.object({
      arms: z.tuple([z.string(), z.string()]),
      areaM2: z.number(),
      points: z.array(z.string()),
      geometry: AreaGeometry.nullable(),
      byHeight: z.array(z.object({ height: z.number(), areaM2: z.number() })),
    }),
  ),
  /** pointId → armId → margin mm (positive = reached). */
  coverage: z.record(z.string(), z.record(z.string(), z.number())),
  regions: z.record(
    z.string(),
    z.object({ restricted: AreaGeometry.nullable(), bands: z.array(z.object({ height: z.number(), geometry: AreaGeometry.nullable() })) }),
  ),
  /** Absent from snapshots frozen before the analysis made safeguarding checks. */
  safeguarding: SnapshotSafeguarding.optional(),
  timingMs: z.number(),
});

const Bounds = z.object({ minX: z.number(), minY: z.number(), maxX: z.number(), maxY: z.number() });

/** The floor plan as frozen with a revision (plan mm). Stored once per content (by checksum), shared by revisions. */
export const SnapshotFloorPlan = z.object({
  id: z.number().int(),
  fileName: z.string(),
  units: z.string(),
  geometry: PlanGeometry,
  layers: z.array(z.object({ name: z.string(), role: LayerRole, height: z.number().nullable(), entityCount: z.number().optional(), color: z.string().optional() })),
  bounds: Bounds,
});
export type SnapshotFloorPlan = z.infer<typeof SnapshotFloorPlan>;

/** Everything a revision shows, frozen when it was submitted: project, layout, floor plan, arm models, analysis. */
export const RevisionSnapshot = z.object({
  project: z.object({ id: z.number().int(), name: z.string(), clientName: z.string().nullable(), siteName: z.string().nullable() }),
  layout: z.object({ id: z.number().int(), name: z.string(), version: z.number().int(), content: LayoutContent }),
  floorPlan: SnapshotFloorPlan.nullable(),
  /** The arm models the arms use, parameters as stored (lengths mm, angles deg). */
  models: z.array(z.object({ id: z.number().int(), name: z.string(), family: z.string(), params: z.record(z.string(), z.unknown()) })),
  analysis: SnapshotAnalysis,
});
export type RevisionSnapshot = z.infer<typeof RevisionSnapshot>;

/**
 * A snapshot as the revisions table holds it: the floor plan is kept apart (one row per content,
 * referenced by the revision's floor-plan checksum); revisions stored before that hold it inline.
 */
export const StoredRevisionSnapshot = RevisionSnapshot.omit({ floorPlan: true }).extend({ floorPlan: SnapshotFloorPlan.nullable().optional() });
export type StoredRevisionSnapshot = z.infer<typeof StoredRevisionSnapshot>;

const FindingBrief = SnapshotFinding.pick({ id: true, severity: true, message: true });

/** The parts of a cell layout a revision diff groups its changes by ("boundary": a fence, access opening, keep-out or operator area). */
export const DIFF_ELEMENTS = ['project', 'layout', 'floorPlan', 'workHeights', 'arm', 'armModel', 'boundary', 'workPoint', 'other'] as const;
export type DiffElement = (typeof DIFF_ELEMENTS)[number];

/** One readable change: `field` is its path inside the element (e.g. `restrict`, `params.axes.1.max`), `text` says it in words with units. */
export const RevisionChange = z.object({ field: z.string(), text: z.string() });
export type RevisionChange = z.infer<typeof RevisionChange>;

/** The changes of one element (an arm, an arm model, a boundary, a work point, the floor plan …) since the revision before. */
export const RevisionChangeGroup = z.object({
  element: z.enum(DIFF_ELEMENTS),
  /** The element's own id (arm, boundary and work point ids; an arm model's id as text); null for the one-of-a-kind parts. */
  id: z.string().nullable(),
  title: z.string(),
  status: z.enum(['added', 'removed', 'changed']),
  changes: z.array(RevisionChange),
});
export type RevisionChangeGroup = z.infer<typeof RevisionChangeGroup>;

/**
 * What changed since the revision before, over every input of the analysis (layout content, arm
 * models' parameters, floor plan, project and layout names), grouped by element in the order of
 * DIFF_ELEMENTS; and the findings new, gone and changed (same id, other severity or message).
 * Both lists empty = nothing changed. `previous` is null for a layout's first revision.
 */
export const RevisionDiff = z.object({
  previous: z.object({ id: z.number().int(), letter: z.string() }).nullable(),
  groups: z.array(RevisionChangeGroup),
  findings: z.object({
    added: z.array(FindingBrief),
    removed: z.array(FindingBrief),
    changed: z.array(FindingBrief.extend({ before: FindingBrief.pick({ severity: true, message: true }) })),
  }),
});
export type RevisionDiff = z.infer<typeof RevisionDiff>;

/**
 * A snapshot frozen under the product's older names read with today's: layout content `zones` →
 * `boundaries`, analysis `overlaps` → `sharedZones`, the floor-plan layer role `boundary` →
 * `outline`. The stored JSON never changes (its checksum is taken over it as stored); this is how it
 * is read. Returns the same object when there is nothing to rename.
 */
export function upgradeSnapshotNames<T>(snapshot: T): T {
  const s = snapshot as Record<string, unknown> | null;
  if (!s || typeof s !== 'object') return snapshot;
  let out: Record<string, unknown> = s;
  const layout = s.layout as { content?: Record<string, unknown> } | undefined;
  if (layout?.content && 'zones' in layout.content && !('boundaries' in layout.content)) {
    const { zones, ...rest } = layout.content;
    out = { ...out, layout: { ...layout, content: { ...rest, boundaries: zones } } };
  }
  const analysis = s.analysis as Record<string, unknown> | undefined;
  if (analysis && 'overlaps' in analysis && !('sharedZones' in analysis)) {
    const { overlaps, ...rest } = analysis;
    out = { ...out, analysis: { ...rest, sharedZones: overlaps } };
  }
  const fp = s.floorPlan as Record<string, unknown> | null | undefined;
  if (fp && typeof fp === 'object') {
    const up = upgradeFloorPlanNames(fp);
    if (up !== fp) out = { ...out, floorPlan: up };
  }
  return out as T;
}

/** A frozen floor plan with layer role `boundary` read as `outline` (same object when none). */
export function upgradeFloorPlanNames<T>(floorPlan: T): T {
  const fp = floorPlan as { layers?: Array<{ role?: string }> } | null;
  if (!fp?.layers?.some((l) => l.role === 'boundary')) return floorPlan;
  return { ...fp, layers: fp.layers.map((l) => (l.role === 'boundary' ? { ...l, role: 'outline' } : l)) } as T;
}
