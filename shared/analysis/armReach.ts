import { canonicalJson as stableKey } from '../canonicalJson';
import { armPose } from '../geometry/frames';
import { polygonsToGeoJSON, type AreaGeometry } from '../geometry/geojson';
import type { Polygon2 } from '../geometry/types';
import { armReach, parseArmParams } from '../kinematics';
import { ReadableError } from '../schemas/errors';
import type { ArmPlacement } from '../schemas/layout';
import type { ArmReach, ArmReachFactory } from './types';

/** What an arm whose model is not among the loaded ones is told (the analysis shows it in a finding). */
export const MISSING_MODEL_TEXT = 'its arm model is not in the catalogue: choose one that is';

const cache = new Map<string, ArmReach>();
const CACHE_LIMIT = 256;

/**
 * The analysis' view of an arm model (stored params, validated here) under a placement's
 * restricting J1 limits: regions and margins from shared/kinematics, built once per distinct
 * (params, limits) and kept in a small cache, so re-analysing after an edit costs only the moved arm.
 */
export function armReachFor(params: unknown, restrict: ArmPlacement['restrict']): ArmReach {
  const key = stableKey({ params, restrict: restrict ?? null });
  let r = cache.get(key);
  if (!r) {
    const model = parseArmParams(params);
    const base = armReach(model, restrict ?? null);
    // Bands and below-height regions depend only on the height: keep each one once built.
    const bands = new Map<number, ReturnType<ArmReach['bandAt']>>();
    const below = new Map<number, ReturnType<ArmReach['restrictedBelow']>>();
    r = {
      ...base,
      stopTimeS: { 0: model.stopTimeS, 1: model.stopTimeCat1S },
      bandAt: (z) => {
        let b = bands.get(z);
        if (!b) bands.set(z, (b = base.bandAt(z)));
        return b;
      },
      restrictedBelow: (z) => {
        let b = below.get(z);
        if (!b) below.set(z, (b = base.restrictedBelow(z)));
        return b;
      },
    };
    if (cache.size >= CACHE_LIMIT) cache.delete(cache.keys().next().value as string);
    cache.set(key, r);
  }
  return r;
}

/** The reach factory over loaded arm models (id → stored parameters); a missing model is a ReadableError. */
export function armReachFromModels(params: ReadonlyMap<number, unknown>): ArmReachFactory {
  return (modelId, restrict) => {
    if (!params.has(modelId)) throw new ReadableError(MISSING_MODEL_TEXT);
    return armReachFor(params.get(modelId), restrict);
  };
}

/**
 * An arm's maximum space as drawn on the plan: its model's restricted space over the full J1 range
 * (no restricting limits), placed at the arm's pose; null when the model's reach cannot be built
 * (the analysis reports that arm as a finding) or is empty. The editor's worker and the server's
 * first view of a layout both draw it from here.
 */
export function placedMaxSpace(reachFor: ArmReachFactory, arm: Pick<ArmPlacement, 'armModelId' | 'x' | 'y' | 'yaw'>): AreaGeometry | null {
  let polys: Polygon2[];
  try {
    polys = reachFor(arm.armModelId, undefined).restricted;
  } catch {
    return null;
  }
  return polys.length ? polygonsToGeoJSON(armPose({ x: arm.x, y: arm.y, yaw: arm.yaw }).placePolygons(polys)) : null;
}
