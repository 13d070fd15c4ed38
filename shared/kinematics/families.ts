import {
  ArmModelInput,
  armParamsSchema,
  articulatedParamsSchema,
  linkageParamsSchema,
  scaraParamsSchema,
  type ArmParams,
  type ArticulatedParams,
  type LinkageParams,
  type ScaraParams,
} from '../schemas/armModel';
import { canonicalJson } from '../canonicalJson';
import { ReadableError } from '../schemas/errors';
import { issueSentence, lowerFirst, type IssueLike } from '../schemas/labels';
import { articulatedAxes, articulatedForward, articulatedJ1Range, articulatedReachProfile } from './articulated';
import { chainFamily, type ChainParams } from './chain';
import { linkageAxes, linkageFeasibility, linkageForward, linkageJ1Range, linkageReachProfile } from './linkage';
import { scaraAxes, scaraForward, scaraJ1Range, scaraReachProfile } from './scara';
import type { FamilyModule, ForwardResult, ReachProfile } from './types';

/** The scara family module (planar 2R + stroke). */
export const scaraFamily: FamilyModule<ScaraParams> = {
  family: 'scara',
  schema: scaraParamsSchema,
  forward: scaraForward,
  reachProfile: (p) => scaraReachProfile(p),
  j1Range: scaraJ1Range,
  lateralOffset: () => 0,
  axes: scaraAxes,
};

/** The articulated family module (J1 vertical, J2 ∥ J3, wrist centre). */
export const articulatedFamily: FamilyModule<ArticulatedParams> = {
  family: 'articulated',
  schema: articulatedParamsSchema,
  forward: articulatedForward,
  reachProfile: articulatedReachProfile,
  j1Range: articulatedJ1Range,
  lateralOffset: () => 0,
  axes: articulatedAxes,
};

/** The linkage family module (four-bar driven forearm, level flange). */
export const linkageFamily: FamilyModule<LinkageParams> = {
  family: 'linkage',
  schema: linkageParamsSchema,
  forward: linkageForward,
  reachProfile: linkageReachProfile,
  j1Range: linkageJ1Range,
  lateralOffset: () => 0,
  axes: linkageAxes,
};

/** Registry: family name → module. */
export const FAMILIES = {
  scara: scaraFamily,
  articulated: articulatedFamily,
  linkage: linkageFamily,
  chain: chainFamily,
} as const;

export type FamilyName = keyof typeof FAMILIES;

/** The family module of a parameter set (throws on an unknown family). */
export function familyOf<M extends ArmParams>(model: M): FamilyModule<M> {
  const fam = (FAMILIES as unknown as Record<string, FamilyModule<unknown> | undefined>)[model?.family];
  if (!fam) throw new Error(`model.family '${String(model?.family)}' is not a known kinematic family`);
  return fam as unknown as FamilyModule<M>;
}

/** A problem with parameters that only the kinematics can see, at a field path of the parameters. */
export interface ArmParamsIssue {
  path: Array<string | number>;
  message: string;
}

/**
 * Checks the schema cannot make (it imports no kinematics): a linkage's four-bar must assemble, and
 * keep the upper arm–forearm angle within interiorAngle, somewhere in the J2/J3 motor ranges.
 * Skipped while the schema's own linkage checks fail (interior angle order, ground link), as those
 * come first.
 */
export function armParamsFeasibilityIssues(p: Readonly<ArmParams>): ArmParamsIssue[] {
  if (p.family !== 'linkage') return [];
  if (!(p.interiorAngle.min < p.interiorAngle.max)) return [];
  const fb = p.fourBar;
  if (fb && (Math.abs(fb.ground - p.upperArm) > 1 || Math.abs(fb.groundAngle) > 0.5)) return [];
  if (p.axes.length !== 3) return [];
  const verdict = linkageFeasibility(p);
  if (verdict === 'not-assemblable') {
    return [{ path: ['fourBar'], message: 'The four-bar does not assemble anywhere in the J2/J3 motor ranges: check the link lengths, the branch and the axis limits' }];
  }
  if (verdict === 'interior-angle') {
    return [{ path: ['interiorAngle'], message: 'No pose in the motor ranges keeps the upper arm–forearm angle within the elbow angle limits: widen them or check the axis limits' }];
  }
  return [];
}

/** The arm parameter schema with the kinematic checks added (what the server and the model form validate with). */
export const feasibleArmParamsSchema = armParamsSchema.superRefine((p, ctx) => {
  for (const issue of armParamsFeasibilityIssues(p)) ctx.addIssue({ code: 'custom', path: issue.path, message: issue.message });
});

/** A create or update of an arm model (name + parameters), with the kinematic checks added. */
export const FeasibleArmModelInput = ArmModelInput.extend({ params: feasibleArmParamsSchema });

/**
 * Parameters that failed their checks: the issues (field paths of the parameters) and, as the
 * message, the first one as a sentence about the arm using the model ("in its arm model, J1 max
 * must be greater than J1 min"), as the analysis' findings quote it.
 */
export class ArmParamsError extends ReadableError {
  override name = 'ArmParamsError';
  constructor(readonly issues: ReadonlyArray<IssueLike>) {
    super(issues[0] ? `in its arm model, ${lowerFirst(issueSentence(issues[0]))}` : 'its arm model has invalid parameters');
  }
}

/** Validates raw parameter JSON (defaults applied, kinematic checks made); throws an ArmParamsError naming the first bad field by its label. */
export function parseArmParams(raw: unknown): ArmParams {
  const r = feasibleArmParamsSchema.safeParse(raw);
  if (r.success) return r.data;
  throw new ArmParamsError(r.error.issues);
}

/** Forward kinematics of any family from controller joint values, arm frame, mm. */
export function forwardModel(model: ArmParams, joints: readonly number[]): ForwardResult {
  return familyOf(model).forward(model, joints);
}

const PROFILE_CACHE_SIZE = 64;
const profileCache = new Map<string, ReachProfile>();

/** Side reach profile of any family, computed once per distinct parameter set (small LRU keyed by canonical JSON), mm. */
export function reachProfileOf(model: ArmParams, opts: { toleranceMm?: number } = {}): ReachProfile {
  const key = `${opts.toleranceMm ?? ''}|${canonicalJson(model)}`;
  const hit = profileCache.get(key);
  if (hit) {
    profileCache.delete(key);
    profileCache.set(key, hit);
    return hit;
  }
  const profile = familyOf(model).reachProfile(model, opts);
  profileCache.set(key, profile);
  while (profileCache.size > PROFILE_CACHE_SIZE) profileCache.delete(profileCache.keys().next().value as string);
  return profile;
}

export type { ChainParams };
