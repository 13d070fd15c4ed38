import { z } from 'zod';
import { degrees, lengthMm, MAX_ANGLE_DEG, nonNegativeMm, nonNegativeNumber, positiveMm, positiveNumber, singleLineText } from './fields';
import { greaterThan } from './labels';

/**
 * Arm model parameters: a discriminated union on `family` (lengths mm, angles degrees).
 * Common to scara / articulated / linkage: `toolLength` (default 0; the tool points straight down
 * from the flange), `payloadRadius` (default 0), optional stopping data, and `axes` for the
 * revolute axes: controller angle → kinematic angle = direction · angle + zeroOffset.
 * The chain family is a DH table (see kinematics/chain.ts for its conventions).
 * Messages name what to change by the field's label (shared/schemas/labels.ts); `superRefine` issues
 * carry the field path.
 * Whether a linkage's four-bar assembles needs the kinematics: `parseArmParams` and
 * `feasibleArmParamsSchema` in shared/kinematics add that check.
 */

/** One revolute axis: limits in controller degrees and the controller → kinematic mapping. */
export const axisSchema = z
  .object({
    min: degrees(),
    max: degrees(),
    zeroOffset: degrees().default(0),
    direction: z.union([z.literal(1), z.literal(-1)]).default(1),
  })
  .superRefine((a, ctx) => {
    if (!(a.min < a.max)) ctx.addIssue({ code: 'custom', path: ['max'], params: greaterThan('min'), message: 'The maximum must be greater than the minimum' });
    else if (a.max - a.min > 720) ctx.addIssue({ code: 'custom', path: ['max'], message: 'The axis range must not exceed 720°' });
  });
export type AxisParams = z.infer<typeof axisSchema>;

const commonFields = {
  toolLength: nonNegativeMm().default(0),
  payloadRadius: nonNegativeMm().default(0),
  /** Stopping time of a category 0 stop (power removed), s. */
  stopTimeS: positiveNumber().max(60).optional(),
  /** Stopping time of a category 1 stop (controlled stop, then power removed), s. */
  stopTimeCat1S: positiveNumber().max(60).optional(),
  stopDistanceMm: nonNegativeMm().optional(),
  maxSpeedMmS: positiveMm().optional(),
  payloadKg: nonNegativeNumber().max(100_000).optional(),
};

/**
 * Link sizes (mm): the half-width of each moving link, so the envelope can grow each link's
 * centre line into a capsule. Every field is optional; `linkSizesOf` in shared/kinematics/envelope.ts
 * fills what is missing from its documented defaults, so stored models stay valid.
 */
const linkRadius = () => nonNegativeMm().max(5000).optional();

export const scaraLinkSizesSchema = z.object({
  innerLinkRadius: linkRadius(),
  outerLinkRadius: linkRadius(),
  toolRadius: linkRadius(),
});
export const articulatedLinkSizesSchema = z.object({
  upperArmRadius: linkRadius(),
  forearmRadius: linkRadius(),
  toolRadius: linkRadius(),
});
export const linkageLinkSizesSchema = articulatedLinkSizesSchema.extend({
  rearLength: linkRadius(),
  rearRadius: linkRadius(),
});
export const chainLinkSizesSchema = z.object({
  linkRadius: linkRadius(),
  toolRadius: linkRadius(),
});

const axes = (count: number, labels: string) =>
  z.array(axisSchema, { error: `Give a list of ${count} axes (${labels})` }).length(count, { message: `Give exactly ${count} axes (${labels})` });

export const scaraParamsSchema = z
  .object({
    family: z.literal('scara'),
    innerLink: positiveMm(),
    outerLink: positiveMm(),
    strokeMin: lengthMm(),
    strokeMax: lengthMm(),
    axes: axes(2, 'J1, J2'),
    linkSizes: scaraLinkSizesSchema.optional(),
    ...commonFields,
  })
  .superRefine((p, ctx) => {
    if (!(p.strokeMin < p.strokeMax)) ctx.addIssue({ code: 'custom', path: ['strokeMax'], params: greaterThan('strokeMin'), message: 'The stroke top must be above the stroke bottom' });
  });
export type ScaraParams = z.infer<typeof scaraParamsSchema>;

const armFields = {
  shoulderHeight: lengthMm(),
  shoulderOffset: nonNegativeMm(),
  upperArm: positiveMm(),
  forearm: positiveMm(),
  elbowOffset: lengthMm().default(0),
};

export const articulatedParamsSchema = z.object({
  family: z.literal('articulated'),
  ...armFields,
  axes: axes(3, 'J1, J2, J3'),
  linkSizes: articulatedLinkSizesSchema.optional(),
  ...commonFields,
});
export type ArticulatedParams = z.infer<typeof articulatedParamsSchema>;

export const fourBarParamsSchema = z.object({
  ground: positiveMm(),
  crank: positiveMm(),
  coupler: positiveMm(),
  rocker: positiveMm(),
  groundAngle: degrees().default(0),
  branch: z.enum(['open', 'crossed']).default('open'),
  rockerToForearm: degrees().default(0),
});
export type FourBarParams = z.infer<typeof fourBarParamsSchema>;

export const linkageParamsSchema = z
  .object({
    family: z.literal('linkage'),
    ...armFields,
    flangeOffset: z
      .object({ horizontal: lengthMm().default(0), vertical: lengthMm().default(0) })
      .default({ horizontal: 0, vertical: 0 }),
    fourBar: fourBarParamsSchema.nullable(),
    interiorAngle: z.object({ min: degrees(), max: degrees() }),
    axes: axes(3, 'J1, J2 motor, J3 motor'),
    linkSizes: linkageLinkSizesSchema.optional(),
    ...commonFields,
  })
  .superRefine((p, ctx) => {
    const ia = p.interiorAngle;
    if (ia.min < 0 || ia.min >= 360) ctx.addIssue({ code: 'custom', path: ['interiorAngle', 'min'], message: 'Elbow angle min must be within 0…360°' });
    if (ia.max <= 0 || ia.max > 360) ctx.addIssue({ code: 'custom', path: ['interiorAngle', 'max'], message: 'Elbow angle max must be within 0…360°' });
    if (!(ia.min < ia.max)) {
      ctx.addIssue({ code: 'custom', path: ['interiorAngle', 'max'], params: greaterThan('min'), message: 'Elbow angle max must be greater than elbow angle min' });
      return;
    }
    const fb = p.fourBar;
    if (fb) {
      if (Math.abs(fb.ground - p.upperArm) > 1) {
        ctx.addIssue({
          code: 'custom',
          path: ['fourBar', 'ground'],
          message: `The ground link is the upper arm between the J2 and J3 axes: make the ground link equal to the upper arm (${p.upperArm} mm)`,
        });
        return;
      }
      if (Math.abs(fb.groundAngle) > 0.5) {
        ctx.addIssue({
          code: 'custom',
          path: ['fourBar', 'groundAngle'],
          message: 'The ground link lies along the upper arm (crank on the J2 axis, rocker on the J3 axis): set the ground angle to 0°',
        });
        return;
      }
    }
  });
export type LinkageParams = z.infer<typeof linkageParamsSchema>;


/** One DH row: constant a, alpha, d, theta and the joint limits in controller units (deg or mm). */
export const chainJointSchema = z
  .object({
    type: z.enum(['revolute', 'prismatic']),
    a: lengthMm(),
    alpha: degrees(),
    d: lengthMm(),
    theta: degrees(),
    min: lengthMm(),
    max: lengthMm(),
    zeroOffset: lengthMm().optional(),
    direction: z.union([z.literal(1), z.literal(-1)]).optional(),
  })
  .superRefine((j, ctx) => {
    if (j.min >= j.max) ctx.addIssue({ code: 'custom', path: ['max'], params: greaterThan('min'), message: 'The maximum must be greater than the minimum' });
    if (j.type === 'revolute') {
      if (Math.abs(j.min) > MAX_ANGLE_DEG) ctx.addIssue({ code: 'custom', path: ['min'], message: `A revolute joint takes limits within ±${MAX_ANGLE_DEG}°` });
      if (Math.abs(j.max) > MAX_ANGLE_DEG) ctx.addIssue({ code: 'custom', path: ['max'], message: `A revolute joint takes limits within ±${MAX_ANGLE_DEG}°` });
    }
  });
export type ChainJoint = z.infer<typeof chainJointSchema>;

/** The chain family: a DH table (standard or modified), the tool point in the last frame, mm. */
export const chainParamsSchema = z
  .object({
    family: z.literal('chain'),
    convention: z.enum(['standard', 'modified']),
    joints: z.array(chainJointSchema).min(1, { message: 'Add at least one joint' }).max(8, { message: 'A chain has at most 8 joints' }),
    tool: z.object({ x: lengthMm(), y: lengthMm(), z: lengthMm() }, { error: 'Give the tool point as x, y and z in mm' }),
    toolLength: nonNegativeNumber().optional(),
    payloadRadius: nonNegativeNumber().optional(),
    stopTimeS: positiveNumber().optional(),
    stopTimeCat1S: positiveNumber().optional(),
    stopDistanceMm: nonNegativeNumber().optional(),
    maxSpeedMmS: positiveNumber().optional(),
    payloadKg: nonNegativeNumber().optional(),
    linkSizes: chainLinkSizesSchema.optional(),
  })
  .superRefine((p, ctx) => {
    const first = p.joints[0];
    if (!first) return;
    if (first.type !== 'revolute') {
      ctx.addIssue({ code: 'custom', path: ['joints', 0, 'type'], message: 'J1 must be revolute about the vertical base axis' });
    }
    if (p.convention === 'modified') {
      const turns = first.alpha / 360;
      if (Math.abs(turns - Math.round(turns)) > 1e-12) {
        ctx.addIssue({ code: 'custom', path: ['joints', 0, 'alpha'], message: 'The J1 axis must be vertical: J1 alpha must be 0°' });
      }
      if (first.a !== 0) {
        ctx.addIssue({ code: 'custom', path: ['joints', 0, 'a'], message: 'The J1 axis must pass through the base origin: J1 a must be 0 mm' });
      }
    }
  });
export type ChainParams = z.infer<typeof chainParamsSchema>;

/** Parameters of any arm model family, discriminated on `family`. */
export const armParamsSchema = z.discriminatedUnion('family', [scaraParamsSchema, articulatedParamsSchema, linkageParamsSchema, chainParamsSchema], {
  error: 'Choose a kinematic family: SCARA, articulated, linkage-driven or DH chain',
});
export type ArmParams = z.infer<typeof armParamsSchema>;
/** Parameters as typed or stored (defaults not yet applied). */
export type ArmParamsInput = z.input<typeof armParamsSchema>;
export type ArmFamily = ArmParams['family'];

/** What a create or update sends: a name and the family parameters. */
export const ArmModelInput = z.object({
  name: singleLineText({ error: 'Give the model a name' }).min(1, 'Give the model a name').max(120, 'Use at most 120 characters'),
  params: armParamsSchema,
});
export type ArmModelInput = z.infer<typeof ArmModelInput>;
