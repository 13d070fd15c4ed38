import { z } from 'zod';
import { chainParamsSchema } from '../kinematics/chain';
import { linkageFeasibility } from '../kinematics/linkage';

/**
 * Arm model parameters: a discriminated union on `family` (lengths mm, angles degrees).
 * Common to scara / articulated / linkage: `toolLength` (default 0; the tool points straight down
 * from the flange), `payloadRadius` (default 0), optional stopping data, and `axes` for the
 * revolute axes: controller angle → kinematic angle = direction · angle + zeroOffset.
 * The chain family brings its own schema (DH table, see kinematics/chain.ts).
 * Messages name what to change; `superRefine` issues carry the field path.
 */

const MAX_LENGTH_MM = 100_000;
const MAX_ANGLE_DEG = 720;

const num = (what: string) =>
  z
    .number({ error: `${what} must be a number` })
    .refine(Number.isFinite, { message: `${what} must be a finite number` })
    .refine((v) => Math.abs(v) <= MAX_LENGTH_MM, { message: `${what} must be within ±${MAX_LENGTH_MM} mm` });
const positive = (what: string) => num(what).refine((v) => v > 0, { message: `${what} must be greater than 0` });
const nonNegative = (what: string) => num(what).refine((v) => v >= 0, { message: `${what} must not be negative` });
const angle = (what: string) =>
  z
    .number({ error: `${what} must be a number` })
    .refine(Number.isFinite, { message: `${what} must be a finite number` })
    .refine((v) => Math.abs(v) <= MAX_ANGLE_DEG, { message: `${what} must be within ±${MAX_ANGLE_DEG}°` });

/** One revolute axis: limits in controller degrees and the controller → kinematic mapping. */
export const axisSchema = z
  .object({
    min: angle('min'),
    max: angle('max'),
    zeroOffset: angle('zeroOffset').default(0),
    direction: z.union([z.literal(1), z.literal(-1)], { error: 'direction must be 1 or -1' }).default(1),
  })
  .superRefine((a, ctx) => {
    if (!(a.min < a.max)) ctx.addIssue({ code: 'custom', path: ['max'], message: 'max must be greater than min' });
    else if (a.max - a.min > 720) ctx.addIssue({ code: 'custom', path: ['max'], message: 'The axis range must not exceed 720°' });
  });
export type AxisParams = z.infer<typeof axisSchema>;

const commonFields = {
  toolLength: nonNegative('toolLength').default(0),
  payloadRadius: nonNegative('payloadRadius').default(0),
  stopTimeS: z.number({ error: 'stopTimeS must be a number' }).positive({ message: 'stopTimeS must be greater than 0' }).max(60).optional(),
  stopDistanceMm: nonNegative('stopDistanceMm').optional(),
  maxSpeedMmS: positive('maxSpeedMmS').optional(),
  payloadKg: z.number({ error: 'payloadKg must be a number' }).nonnegative({ message: 'payloadKg must not be negative' }).max(100_000).optional(),
};

const axes = (count: number, labels: string) =>
  z.array(axisSchema, { error: `axes must be a list of ${count} axes (${labels})` }).length(count, { message: `Give exactly ${count} axes (${labels})` });

export const scaraParamsSchema = z
  .object({
    family: z.literal('scara', { error: "family must be 'scara'" }),
    innerLink: positive('innerLink'),
    outerLink: positive('outerLink'),
    strokeMin: num('strokeMin'),
    strokeMax: num('strokeMax'),
    axes: axes(2, 'J1, J2'),
    ...commonFields,
  })
  .superRefine((p, ctx) => {
    if (!(p.strokeMin < p.strokeMax)) ctx.addIssue({ code: 'custom', path: ['strokeMax'], message: 'strokeMax must be greater than strokeMin' });
  });
export type ScaraParams = z.infer<typeof scaraParamsSchema>;

const armFields = {
  shoulderHeight: num('shoulderHeight'),
  shoulderOffset: nonNegative('shoulderOffset'),
  upperArm: positive('upperArm'),
  forearm: positive('forearm'),
  elbowOffset: num('elbowOffset').default(0),
};

export const articulatedParamsSchema = z.object({
  family: z.literal('articulated', { error: "family must be 'articulated'" }),
  ...armFields,
  axes: axes(3, 'J1, J2, J3'),
  ...commonFields,
});
export type ArticulatedParams = z.infer<typeof articulatedParamsSchema>;

export const fourBarParamsSchema = z.object({
  ground: positive('ground'),
  crank: positive('crank'),
  coupler: positive('coupler'),
  rocker: positive('rocker'),
  groundAngle: angle('groundAngle').default(0),
  branch: z.enum(['open', 'crossed'], { error: "branch must be 'open' or 'crossed'" }).default('open'),
  rockerToForearm: angle('rockerToForearm').default(0),
});
export type FourBarParams = z.infer<typeof fourBarParamsSchema>;

export const linkageParamsSchema = z
  .object({
    family: z.literal('linkage', { error: "family must be 'linkage'" }),
    ...armFields,
    flangeOffset: z
      .object({ horizontal: num('flangeOffset.horizontal').default(0), vertical: num('flangeOffset.vertical').default(0) })
      .default({ horizontal: 0, vertical: 0 }),
    fourBar: fourBarParamsSchema.nullable(),
    interiorAngle: z.object({ min: angle('interiorAngle.min'), max: angle('interiorAngle.max') }),
    axes: axes(3, 'J1, J2 motor, J3 motor'),
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
    if (p.axes.length !== 3) return;
    const verdict = linkageFeasibility(p);
    if (verdict === 'not-assemblable') {
      ctx.addIssue({
        code: 'custom',
        path: ['fourBar'],
        message: 'The four-bar does not assemble anywhere in the J2/J3 motor ranges: check the link lengths, the branch and the axis limits',
      });
    } else if (verdict === 'interior-angle') {
      ctx.addIssue({
        code: 'custom',
        path: ['interiorAngle'],
        message: 'No pose in the motor ranges keeps the upper arm–forearm angle within interiorAngle: widen it or check the axis limits',
      });
    }
  });
export type LinkageParams = z.infer<typeof linkageParamsSchema>;

export { chainParamsSchema };
export type { ChainParams } from '../kinematics/chain';

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
  name: z.string({ error: 'Give the model a name' }).trim().min(1, 'Give the model a name').max(120, 'Use at most 120 characters'),
  params: armParamsSchema,
});
export type ArmModelInput = z.infer<typeof ArmModelInput>;
