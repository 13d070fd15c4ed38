import { armPose } from '@shared/geometry';
import { geoJSONToPolygons } from '@shared/geometry';
import type { Polygon2 } from '@shared/geometry';
import { maximumSpacePolygons, parseArmParams } from '@shared/kinematics';
import type { ArmPlacement, LayoutContent } from '@shared/schemas/layout';
import type { PlanSheetInput } from './types';

/** What the sheets and the DXF export show of one placed arm, plan mm / degrees. */
export interface ArmSummary {
  arm: ArmPlacement;
  /** "R1 Picker 1" (id, then label when there is one). */
  title: string;
  modelName: string;
  family: string;
  /** Largest plan distance of the maximum space from the J1 axis, mm; null when the model does not parse. */
  maxSpaceRadius: number | null;
  /** Stopping time from the model's stopping data, s; null when the model has none. */
  stopTimeS: number | null;
  /** Maximum space (all J1 limits of the model), placed in the plan, mm. */
  maxSpace: Polygon2[];
  /** Restricted space (the placement's restricting J1 limits), placed in the plan, mm (from the analysis). */
  restricted: Polygon2[];
  /** Reach band at the first work height, placed in the plan, mm; null when the layout has no work height. */
  band: { height: number; polygons: Polygon2[] } | null;
}

/** Title of an arm on the sheets: its id, then its label when it has one. */
export function armTitle(arm: Pick<ArmPlacement, 'id' | 'label'>): string {
  return arm.label ? `${arm.id} ${arm.label}` : arm.id;
}

/**
 * Per-arm summary: maximum space from the model's kinematics (shared/kinematics, rotated by yaw and
 * moved to the base), restricted space and first-height band from the analysis result.
 */
export function summarizeArms(input: Pick<PlanSheetInput, 'models' | 'analysis'> & { content: LayoutContent }): ArmSummary[] {
  const models = new Map(input.models.map((m) => [m.id, m]));
  const firstHeight = input.content.workHeights[0];
  // The maximum space depends on the model alone: worked out once per model, placed per arm.
  const spaces = new Map<number, { local: Polygon2[]; radius: number } | null>();
  const spaceOf = (modelId: number, params: unknown) => {
    if (!spaces.has(modelId)) {
      try {
        const local = maximumSpacePolygons(parseArmParams(params));
        let radius = 0;
        for (const p of local) for (const [x, y] of p[0] ?? []) radius = Math.max(radius, Math.hypot(x, y));
        spaces.set(modelId, { local, radius });
      } catch {
        spaces.set(modelId, null);
      }
    }
    return spaces.get(modelId)!;
  };
  return input.content.arms.map((arm) => {
    const model = models.get(arm.armModelId);
    const space = model ? spaceOf(model.id, model.params) : null;
    const maxSpace: Polygon2[] = space ? armPose(arm).placePolygons(space.local) : [];
    const maxSpaceRadius = space ? space.radius : null;
    const region = input.analysis.regions[arm.id];
    const bandGeom = firstHeight === undefined ? undefined : region?.bands.find((b) => b.height === firstHeight);
    const stop = model ? (model.params as { stopTimeS?: unknown }).stopTimeS : undefined;
    return {
      arm,
      title: armTitle(arm),
      modelName: model?.name ?? `unknown model ${arm.armModelId}`,
      family: model?.family ?? '—',
      maxSpaceRadius,
      stopTimeS: typeof stop === 'number' ? stop : null,
      maxSpace,
      restricted: geoJSONToPolygons(region?.restricted ?? null),
      band: firstHeight === undefined ? null : { height: firstHeight, polygons: geoJSONToPolygons(bandGeom?.geometry ?? null) },
    };
  });
}
