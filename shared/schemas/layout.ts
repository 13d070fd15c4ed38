import { z } from 'zod';
import { finiteNumber, nonNegativeNumber, positiveId, positiveNumber, singleLineText } from './fields';

const Id = z
  .string()
  .trim()
  .min(1, 'Give it an id')
  .max(24, 'Use at most 24 characters')
  .regex(/^[A-Za-z0-9_.-]+$/, 'Use letters, digits, _ . or - only');
/** A plan-frame point [x east, y north], mm. */
const PlanXY = z.tuple([finiteNumber(), finiteNumber()]);

/** One arm placed on a layout: plan position (mm), yaw (deg CCW from +x), mount height (mm). */
export const ArmPlacement = z
  .object({
    id: Id,
    armModelId: positiveId('Choose an arm model'),
    label: singleLineText().max(60).default(''),
    /** Plan position of the J1 axis, mm (x east, y north). */
    x: finiteNumber(),
    y: finiteNumber(),
    /** Direction of J1 zero, degrees counter-clockwise from plan +x (east). */
    yaw: finiteNumber(),
    /** Height of the mounting face above finished floor level, mm. */
    mountHeight: finiteNumber().default(0),
    /** Restricting J1 limits (controller degrees) set by mechanical stops or safety-rated soft limits. */
    restrict: z
      .object({ j1Min: finiteNumber(), j1Max: finiteNumber() })
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
    x: finiteNumber(),
    y: finiteNumber(),
    z: finiteNumber(),
    approach: z.enum(['top', 'any']).default('top'),
    tag: singleLineText().max(60).default(''),
    assignedArm: Id.optional(),
  })
  .strict();
export type WorkPoint = z.infer<typeof WorkPoint>;

/** Safeguarding devices an access opening can carry (the same list as SAFEGUARD_DEVICES of shared/safety). */
export const SAFEGUARD_DEVICE_NAMES = ['interlock', 'interlock-locking', 'light-curtain', 'multi-beam', 'single-beam'] as const;
/** Shapes of a fence's mesh openings (the same list as MESH_SHAPES of shared/safety). */
export const MESH_SHAPE_NAMES = ['slot', 'square', 'round'] as const;

/**
 * The safeguard of an access opening: its device, the device's response time (s), the stop category
 * the device triggers (0 or 1; the arm model gives the stopping time of each) and what the device's
 * ISO 13855 distance needs: a light curtain's resolution (mm), a multi-beam device's beams, a
 * parallel (horizontal) detection boundary's height above the floor (mm).
 */
export const Safeguard = z
  .object({
    device: z.enum(SAFEGUARD_DEVICE_NAMES),
    responseTimeS: nonNegativeNumber().max(30),
    stopCategory: z.union([z.literal(0), z.literal(1)]),
    resolutionMm: positiveNumber().max(300).optional(),
    beams: z.number().int().min(2, 'A multi-beam device has 2 to 8 beams').max(8, 'A multi-beam device has 2 to 8 beams').optional(),
    approach: z.enum(['normal', 'parallel']).default('normal'),
    heightMm: nonNegativeNumber().refine((v) => v <= 1000, { message: 'Detection height must be at most 1000 mm (ISO 13855)' }).optional(),
  })
  .strict()
  .superRefine((g, ctx) => {
    if (g.device === 'light-curtain' && g.approach === 'normal' && g.resolutionMm === undefined) {
      ctx.addIssue({ code: 'custom', path: ['resolutionMm'], message: 'Give the light curtain its resolution (mm)' });
    }
    if (g.approach === 'parallel') {
      if (g.device !== 'light-curtain') ctx.addIssue({ code: 'custom', path: ['approach'], message: 'A parallel approach applies to light curtains only' });
      else if (g.heightMm === undefined) ctx.addIssue({ code: 'custom', path: ['heightMm'], message: 'Give the height of the detection boundary above the floor (mm)' });
      else if (g.resolutionMm !== undefined && g.heightMm < 15 * (g.resolutionMm - 50)) {
        ctx.addIssue({ code: 'custom', path: ['heightMm'], message: `With a resolution of ${g.resolutionMm} mm the detection boundary must be at least ${15 * (g.resolutionMm - 50)} mm above the floor` });
      }
    }
    if (g.beams !== undefined && g.device !== 'multi-beam') ctx.addIssue({ code: 'custom', path: ['beams'], message: 'Beams apply to a multi-beam device only' });
  });
export type Safeguard = z.infer<typeof Safeguard>;

export const BOUNDARY_KINDS = ['fence', 'keepout', 'operator', 'opening'] as const;
export const Boundary = z
  .object({
    id: Id,
    kind: z.enum(BOUNDARY_KINDS),
    label: singleLineText().max(60).default(''),
    points: z.array(PlanXY).max(2000, 'At most 2000 points'),
    /** Fence height (mm above floor); required for fences. */
    height: finiteNumber().gt(0).optional(),
    /** For an opening: the fence it is cut into. */
    fenceId: Id.optional(),
    /** For an opening: the device guarding it. */
    safeguard: Safeguard.optional(),
    /** For a fence: the size e of its mesh openings (slot width, square side or round diameter), mm. */
    meshMm: positiveNumber().refine((v) => v <= 120, { message: 'Mesh size must be at most 120 mm (larger openings let a body through: draw an access opening)' }).optional(),
    /** For a fence: the shape of its mesh openings. */
    meshShape: z.enum(MESH_SHAPE_NAMES).optional(),
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
    if (z0.safeguard && z0.kind !== 'opening') {
      ctx.addIssue({ code: 'custom', path: ['safeguard'], message: 'Only an access opening carries a safeguard' });
    }
    if ((z0.meshMm !== undefined || z0.meshShape !== undefined) && z0.kind !== 'fence') {
      ctx.addIssue({ code: 'custom', path: [z0.meshMm !== undefined ? 'meshMm' : 'meshShape'], message: 'Only a fence has a mesh' });
    }
    if (z0.kind === 'fence' && (z0.meshMm === undefined) !== (z0.meshShape === undefined)) {
      ctx.addIssue({ code: 'custom', path: [z0.meshMm === undefined ? 'meshMm' : 'meshShape'], message: z0.meshMm === undefined ? 'Give the mesh size (mm) with its shape' : 'Give the mesh shape with its size' });
    }
    if (z0.kind === 'opening' && !z0.fenceId) {
      ctx.addIssue({ code: 'custom', path: ['fenceId'], message: 'Say which fence the opening is in' });
    }
  });
export type Boundary = z.infer<typeof Boundary>;

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
    boundaries: z.array(Boundary).max(2000).default([]),
    /** Heights above finished floor level at which reach bands are drawn and compared, mm. */
    workHeights: z.array(finiteNumber()).max(20).default([]),
  })
  .strict()
  .superRefine((c, ctx) => {
    uniqueIds(c.arms, 'arms', ctx);
    uniqueIds(c.workPoints, 'workPoints', ctx);
    uniqueIds(c.boundaries, 'boundaries', ctx);
    const armIds = new Set(c.arms.map((a) => a.id));
    c.workPoints.forEach((p, i) => {
      if (p.assignedArm && !armIds.has(p.assignedArm)) {
        ctx.addIssue({ code: 'custom', path: ['workPoints', i, 'assignedArm'], message: `No arm ${p.assignedArm} on this cell layout` });
      }
    });
    const fences = new Set(c.boundaries.filter((z0) => z0.kind === 'fence').map((z0) => z0.id));
    c.boundaries.forEach((z0, i) => {
      if (z0.kind === 'opening' && z0.fenceId && !fences.has(z0.fenceId)) {
        ctx.addIssue({ code: 'custom', path: ['boundaries', i, 'fenceId'], message: `No fence ${z0.fenceId} on this cell layout` });
      }
    });
  });
export type LayoutContent = z.infer<typeof LayoutContent>;

export const LayoutCreateInput = z.object({
  name: singleLineText().min(1, 'Name the cell layout').max(160),
  floorPlanId: positiveId().nullable().default(null),
  content: LayoutContent.default({ arms: [], workPoints: [], boundaries: [], workHeights: [] }),
});

export const LayoutUpdateInput = z.object({
  version: positiveId('Send the version you edited'),
  name: singleLineText().min(1, 'Name the cell layout').max(160).optional(),
  floorPlanId: positiveId().nullable().optional(),
  content: LayoutContent.optional(),
});
export type LayoutUpdateInput = z.infer<typeof LayoutUpdateInput>;

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
