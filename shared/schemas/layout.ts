import { z } from 'zod';
import { finiteNumber, positiveId } from './fields';

const Id = z
  .string()
  .trim()
  .min(1, 'Give it an id')
  .max(24, 'Use at most 24 characters')
  .regex(/^[A-Za-z0-9_.-]+$/, 'Use letters, digits, _ . or - only');
/** A plan-frame point [x east, y north], mm. */
const PlanXY = z.tuple([finiteNumber('x'), finiteNumber('y')]);

/** One arm placed on a layout: plan position (mm), yaw (deg CCW from +x), mount height (mm). */
export const ArmPlacement = z
  .object({
    id: Id,
    armModelId: positiveId('Choose an arm model'),
    label: z.string().trim().max(60).default(''),
    /** Plan position of the J1 axis, mm (x east, y north). */
    x: finiteNumber('x'),
    y: finiteNumber('y'),
    /** Direction of J1 zero, degrees counter-clockwise from plan +x (east). */
    yaw: finiteNumber('Yaw'),
    /** Height of the mounting face above finished floor level, mm. */
    mountHeight: finiteNumber('Mount height').default(0),
    /** Restricting J1 limits (controller degrees) set by mechanical stops or safety-rated soft limits. */
    restrict: z
      .object({ j1Min: finiteNumber('J1 min'), j1Max: finiteNumber('J1 max') })
      .refine((r) => r.j1Min < r.j1Max, { message: 'J1 min must be below J1 max', path: ['j1Max'] })
      .optional(),
  })
  .strict();
export type ArmPlacement = z.infer<typeof ArmPlacement>;

/** A place an arm must reach (plan mm); `top` = tool pointing down onto it. */
export const WorkPoint = z
  .object({
    id: Id,
    /** Plan position, mm (x east, y north); z above finished floor level, mm. */
    x: finiteNumber('x'),
    y: finiteNumber('y'),
    z: finiteNumber('z'),
    approach: z.enum(['top', 'any']).default('top'),
    tag: z.string().trim().max(60).default(''),
    assignedArm: Id.optional(),
  })
  .strict();
export type WorkPoint = z.infer<typeof WorkPoint>;

export const ZONE_KINDS = ['fence', 'keepout', 'operator', 'opening'] as const;
export const Zone = z
  .object({
    id: Id,
    kind: z.enum(ZONE_KINDS),
    label: z.string().trim().max(60).default(''),
    points: z.array(PlanXY).max(2000, 'At most 2000 points'),
    /** Fence height (mm above floor); required for fences. */
    height: finiteNumber('Height').positive('Height must be above 0').optional(),
    /** For an opening: the fence it is cut into. */
    fenceId: Id.optional(),
    /** For an opening: the device that safeguards it (ISO 13855 inputs). */
    safeguard: z
      .object({
        device: z.enum(['interlock', 'interlock-locking', 'light-curtain', 'multi-beam', 'single-beam']),
        responseTimeS: finiteNumber('Response time').min(0).max(30),
        stopCategory: z.union([z.literal(0), z.literal(1), z.literal(2)]).optional(),
      })
      .optional(),
    /** For a fence: mesh opening (slot width, square side or round diameter), mm, and its shape. */
    meshMm: finiteNumber('Mesh size').positive('Mesh size must be above 0').optional(),
    meshShape: z.enum(['slot', 'square', 'round']).optional(),
  })
  .strict()
  .superRefine((z0, ctx) => {
    const need = z0.kind === 'keepout' || z0.kind === 'operator' ? 3 : 2;
    if (z0.points.length < need) {
      ctx.addIssue({ code: 'custom', path: ['points'], message: `A ${z0.kind === 'fence' ? 'fence' : z0.kind === 'opening' ? 'opening' : 'polygon'} needs at least ${need} points` });
    }
    if (z0.kind === 'opening' && z0.points.length !== 2) {
      ctx.addIssue({ code: 'custom', path: ['points'], message: 'An opening is one segment: exactly 2 points' });
    }
    if (z0.kind === 'fence' && z0.height === undefined) {
      ctx.addIssue({ code: 'custom', path: ['height'], message: 'Give the fence its height' });
    }
    if (z0.kind === 'opening' && !z0.fenceId) {
      ctx.addIssue({ code: 'custom', path: ['fenceId'], message: 'Say which fence the opening is in' });
    }
  });
export type Zone = z.infer<typeof Zone>;

function uniqueIds(list: ReadonlyArray<{ id: string }>, path: string, ctx: z.RefinementCtx) {
  const seen = new Set<string>();
  list.forEach((item, i) => {
    if (seen.has(item.id)) ctx.addIssue({ code: 'custom', path: [path, i, 'id'], message: `Duplicate id ${item.id}` });
    seen.add(item.id);
  });
}

/** The working copy of a layout (plan mm, degrees). */
export const LayoutContent = z
  .object({
    arms: z.array(ArmPlacement).max(500).default([]),
    workPoints: z.array(WorkPoint).max(200_000).default([]),
    zones: z.array(Zone).max(2000).default([]),
    /** Heights above finished floor level at which reach bands are drawn and compared, mm. */
    workHeights: z.array(finiteNumber('Work height')).max(20).default([]),
  })
  .strict()
  .superRefine((c, ctx) => {
    uniqueIds(c.arms, 'arms', ctx);
    uniqueIds(c.workPoints, 'workPoints', ctx);
    uniqueIds(c.zones, 'zones', ctx);
    const armIds = new Set(c.arms.map((a) => a.id));
    c.workPoints.forEach((p, i) => {
      if (p.assignedArm && !armIds.has(p.assignedArm)) {
        ctx.addIssue({ code: 'custom', path: ['workPoints', i, 'assignedArm'], message: `No arm ${p.assignedArm} on this layout` });
      }
    });
    const fences = new Set(c.zones.filter((z0) => z0.kind === 'fence').map((z0) => z0.id));
    c.zones.forEach((z0, i) => {
      if (z0.kind === 'opening' && z0.fenceId && !fences.has(z0.fenceId)) {
        ctx.addIssue({ code: 'custom', path: ['zones', i, 'fenceId'], message: `No fence ${z0.fenceId} on this layout` });
      }
    });
  });
export type LayoutContent = z.infer<typeof LayoutContent>;

export const LayoutCreateInput = z.object({
  name: z.string().trim().min(1, 'Name the layout').max(160),
  floorPlanId: positiveId().nullable().default(null),
  content: LayoutContent.default({ arms: [], workPoints: [], zones: [], workHeights: [] }),
});

export const LayoutUpdateInput = z.object({
  version: positiveId('Send the version you edited'),
  name: z.string().trim().min(1, 'Name the layout').max(160).optional(),
  floorPlanId: positiveId().nullable().optional(),
  content: LayoutContent.optional(),
});

export interface LayoutDto {
  id: number;
  projectId: number;
  floorPlanId: number | null;
  name: string;
  content: LayoutContent;
  version: number;
  createdAt: string;
  updatedAt: string;
  /** When the layout was archived (hidden from lists, read-only); null while active. */
  archivedAt: string | null;
}
