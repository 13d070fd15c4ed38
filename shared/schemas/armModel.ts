import { z } from 'zod';
import { degrees, lengthMm, MAX_ANGLE_DEG, nonNegativeMm, nonNegativeNumber, positiveMm, positiveNumber, singleLineText } from './fields';

/**
 * Arm model parameters: a discriminated union on `family` (lengths mm, angles degrees).
 * Common to scara / articulated / linkage: `toolLength` (default 0; the tool points straight down
 * from the flange), `payloadRadius` (default 0), optional stopping data, and `axes` for the
 * revolute axes: controller angle → kinematic angle = direction · angle + zeroOffset.
 * The chain family is a DH table (see kinematics/chain.ts for its conventions).
 * Messages name what to change; `superRefine` issues carry the field path.
 * Whether a linkage's four-bar assembles needs the kinematics: `parseArmParams` and
 * `feasibleArmParamsSchema` in shared/kinematics add that check.
 */

/** One revolute axis: limits in controller degrees and the controller → kinematic mapping. */
export const axisSchema = z
  .object({
    min: degrees('min'),
    max: degrees('max'),
    zeroOffset: degrees('zeroOffset').default(0),
    direction: z.union([z.literal(1), z.literal(-1)], { error: 'direction must be 1 or -1' }).default(1),
  })
  .superRefine((a, ctx) => {
    if (!(a.min < a.max)) ctx.addIssue({ code: 'custom', path: ['max'], message: 'max must be greater than min' });
    else if (a.max - a.min > 720) ctx.addIssue({ code: 'custom', path: ['max'], message: 'The axis range must not exceed 720°' });
  });
export type AxisParams = z.infer<typeof axisSchema>;

const commonFields = {
  toolLength: nonNegativeMm('toolLength').default(0),
  payloadRadius: nonNegativeMm('payloadRadius').default(0),
  /** Stopping time of a category 0 stop (power removed), s. */
  stopTimeS: positiveNumber('stopTimeS').max(60).optional(),
  /** Stopping time of a category 1 stop (controlled stop, then power removed), s. */
  stopTimeCat1S: positiveNumber('stopTimeCat1S').max(60).optional(),
  stopDistanceMm: nonNegativeMm('stopDistanceMm').optional(),
  maxSpeedMmS: positiveMm('maxSpeedMmS').optional(),
  payloadKg: nonNegativeNumber('payloadKg').max(100_000).optional(),
};

/**
 * Link sizes (mm): the half-width of each moving link, so the envelope can grow each link's
 * centre line into a capsule. Every field is optional; `linkSizesOf` in shared/kinematics/envelope.ts
 * fills what is missing from its documented defaults, so stored models stay valid.
 */
const linkRadius = (what: string) => nonNegativeMm(what).refine((v) => v <= 5000, { message: `${what} must be at most 5000 mm` }).optional();

export const scaraLinkSizesSchema = z.object({
  innerLinkRadius: linkRadius('linkSizes.innerLinkRadius'),
  outerLinkRadius: linkRadius('linkSizes.outerLinkRadius'),
  toolRadius: linkRadius('linkSizes.toolRadius'),
});
export const articulatedLinkSizesSchema = z.object({
  upperArmRadius: linkRadius('linkSizes.upperArmRadius'),
  forearmRadius: linkRadius('linkSizes.forearmRadius'),
  toolRadius: linkRadius('linkSizes.toolRadius'),
});
export const linkageLinkSizesSchema = articulatedLinkSizesSchema.extend({
  rearLength: linkRadius('linkSizes.rearLength'),
  rearRadius: linkRadius('linkSizes.rearRadius'),
});
export const chainLinkSizesSchema = z.object({
  linkRadius: linkRadius('linkSizes.linkRadius'),
  toolRadius: linkRadius('linkSizes.toolRadius'),
});

const axes = (count: number, labels: string) =>
  z.array(axisSchema, { error: `axes must be a list of ${count} axes (${labels})` }).length(count, { message: `Give exactly ${count} axes (${labels})` });

export const scaraParamsSchema = z
  .object({
    family: z.literal('scara', { error: "family must be 'scara'" }),
    innerLink: positiveMm('innerLink'),
    outerLink: positiveMm('outerLink'),
    strokeMin: lengthMm('strokeMin'),
    strokeMax: lengthMm('strokeMax'),
    axes: axes(2, 'J1, J2'),
    linkSizes: scaraLinkSizesSchema.optional(),
    ...commonFields,
  })
  .superRefine((p, ctx) => {
    if (!(p.strokeMin < p.strokeMax)) ctx.addIssue({ code: 'custom', path: ['strokeMax'], message: 'strokeMax must be greater than strokeMin' });
  });
export type ScaraParams = z.infer<typeof scaraParamsSchema>;

const armFields = {
  shoulderHeight: lengthMm('shoulderHeight'),
  shoulderOffset: nonNegativeMm('shoulderOffset'),
  upperArm: positiveMm('upperArm'),
  forearm: positiveMm('forearm'),
  elbowOffset: lengthMm('elbowOffset').default(0),
};

export const articulatedParamsSchema = z.object({
  family: z.literal('articulated', { error: "family must be 'articulated'" }),
  ...armFields,
  axes: axes(3, 'J1, J2, J3'),
  linkSizes: articulatedLinkSizesSchema.optional(),
  ...commonFields,
});
export type ArticulatedParams = z.infer<typeof articulatedParamsSchema>;

export const fourBarParamsSchema = z.object({
  ground: positiveMm('ground'),
  crank: positiveMm('crank'),
  coupler: positiveMm('coupler'),
  rocker: positiveMm('rocker'),
  groundAngle: degrees('groundAngle').default(0),
  branch: z.enum(['open', 'crossed'], { error: "branch must be 'open' or 'crossed'" }).default('open'),
  rockerToForearm: degrees('rockerToForearm').default(0),
});
export type FourBarParams = z.infer<typeof fourBarParamsSchema>;

export const linkageParamsSchema = z
  .object({
    family: z.literal('linkage', { error: "family must be 'linkage'" }),
    ...armFields,
    flangeOffset: z
      .object({ horizontal: lengthMm('flangeOffset.horizontal').default(0), vertical: lengthMm('flangeOffset.vertical').default(0) })
      .default({ horizontal: 0, vertical: 0 }),
    fourBar: fourBarParamsSchema.nullable(),
    interiorAngle: z.object({ min: degrees('interiorAngle.min'), max: degrees('interiorAngle.max') }),
    axes: axes(3, 'J1, J2 motor, J3 motor'),
    linkSizes: linkageLinkSizesSchema.optional(),
    ...commonFields,
  })
  .superRefine((p, ctx) => {
    const ia = p.interiorAngle;
    if (ia.min < 0 || ia.min >= 360) ctx.addIssue({ code: 'custom', path: ['interiorAngle', 'min'], message: 'interiorAngle.min must be within 0…360°' });
    if (ia.max <= 0 || ia.max > 360) ctx.addIssue({ code: 'custom', path: ['interiorAngle', 'max'], message: 'interiorAngle.max must be within 0…360°' });
    if (!(ia.min < ia.max)) {
      ctx.addIssue({ code: 'custom', path: ['interiorAngle', 'max'], message: 'interiorAngle.max must be greater than interiorAngle.min' });
      return;
    }
    const fb = p.fourBar;
    if (fb) {
      if (Math.abs(fb.ground - p.upperArm) > 1) {
        ctx.addIssue({
          code: 'custom',
          path: ['fourBar', 'ground'],
          message: `The ground link is the upper arm between the J2 and J3 axes: make fourBar.ground equal to upperArm (${p.upperArm} mm)`,
        });
        return;
      }
      if (Math.abs(fb.groundAngle) > 0.5) {
        ctx.addIssue({
          code: 'custom',
          path: ['fourBar', 'groundAngle'],
          message: 'The ground link lies along the upper arm (crank on the J2 axis, rocker on the J3 axis): set fourBar.groundAngle to 0',
        });
        return;
      }
    }
  });
export type LinkageParams = z.infer<typeof linkageParamsSchema>;

/** Messages of the chain family name a value that is not a number as "not a finite number". */
const notFinite = (what: string) => `${what} must be a finite number`;
const chainLength = (what: string) => lengthMm(what, notFinite(what));
const chainAngle = (what: string) => degrees(what, notFinite(what));

/** One DH row: constant a, alpha, d, theta and the joint limits in controller units (deg or mm). */
export const chainJointSchema = z
  .object({
    type: z.enum(['revolute', 'prismatic'], { error: 'type must be revolute or prismatic' }),
    a: chainLength('a'),
    alpha: chainAngle('alpha'),
    d: chainLength('d'),
    theta: chainAngle('theta'),
    min: chainLength('min'),
    max: chainLength('max'),
    zeroOffset: chainLength('zeroOffset').optional(),
    direction: z.union([z.literal(1), z.literal(-1)], { error: 'direction must be 1 or -1' }).optional(),
  })
  .superRefine((j, ctx) => {
    if (j.min >= j.max) ctx.addIssue({ code: 'custom', path: ['max'], message: 'max must be greater than min' });
    if (j.type === 'revolute') {
      if (Math.abs(j.min) > MAX_ANGLE_DEG) ctx.addIssue({ code: 'custom', path: ['min'], message: `min must be within ±${MAX_ANGLE_DEG}°` });
      if (Math.abs(j.max) > MAX_ANGLE_DEG) ctx.addIssue({ code: 'custom', path: ['max'], message: `max must be within ±${MAX_ANGLE_DEG}°` });
    }
  });
export type ChainJoint = z.infer<typeof chainJointSchema>;

/** The chain family: a DH table (standard or modified), the tool point in the last frame, mm. */
export const chainParamsSchema = z
  .object({
    family: z.literal('chain', { error: "family must be 'chain'" }),
    convention: z.enum(['standard', 'modified'], { error: 'convention must be standard or modified' }),
    joints: z
      .array(chainJointSchema, { error: 'joints must be a list' })
      .min(1, { message: 'Add at least one joint' })
      .max(8, { message: 'At most 8 joints' }),
    tool: z.object({ x: chainLength('tool x'), y: chainLength('tool y'), z: chainLength('tool z') }, { error: 'tool must be {x, y, z} in mm' }),
    toolLength: nonNegativeNumber('toolLength', notFinite('toolLength')).optional(),
    payloadRadius: nonNegativeNumber('payloadRadius', notFinite('payloadRadius')).optional(),
    stopTimeS: positiveNumber('stopTimeS', notFinite('stopTimeS')).optional(),
    stopTimeCat1S: positiveNumber('stopTimeCat1S', notFinite('stopTimeCat1S')).optional(),
    stopDistanceMm: nonNegativeNumber('stopDistanceMm', notFinite('stopDistanceMm')).optional(),
    maxSpeedMmS: positiveNumber('maxSpeedMmS', notFinite('maxSpeedMmS')).optional(),
    payloadKg: nonNegativeNumber('payloadKg', notFinite('payloadKg')).optional(),
    linkSizes: chainLinkSizesSchema.optional(),
  })
  .superRefine((p, ctx) => {
    const first = p.joints[0];
    if (!first) return;
    if (first.type !== 'revolute') {
      ctx.addIssue({ code: 'custom', path: ['joints', 0, 'type'], message: 'Joint 1 must be revolute about the vertical base axis' });
    }
    if (p.convention === 'modified') {
      const turns = first.alpha / 360;
      if (Math.abs(turns - Math.round(turns)) > 1e-12) {
        ctx.addIssue({ code: 'custom', path: ['joints', 0, 'alpha'], message: 'Joint 1 axis must be vertical: alpha of row 1 must be 0' });
      }
      if (first.a !== 0) {
        ctx.addIssue({ code: 'custom', path: ['joints', 0, 'a'], message: 'Joint 1 axis must pass through the base origin: a of row 1 must be 0' });
      }
    }
  });
export type ChainParams = z.infer<typeof chainParamsSchema>;

/** Parameters of any arm model family, discriminated on `family`. */
export const armParamsSchema = z.discriminatedUnion('family', [scaraParamsSchema, articulatedParamsSchema, linkageParamsSchema, chainParamsSchema], {
  error: "family must be one of 'scara', 'articulated', 'linkage', 'chain'",
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
