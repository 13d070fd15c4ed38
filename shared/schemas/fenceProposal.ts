import { z } from 'zod';
import { finiteNumber } from './fields';
import { LayoutContent } from './layout';

/** Mesh shapes of a fence panel (ISO 13857's opening shapes). */
export const FENCE_MESH_SHAPES = ['slot', 'square', 'round'] as const;

/** A length in mm from `min` to `max` (its label and unit come from labels.ts). */
const mm = (min: number, max: number) => finiteNumber().min(min).max(max);

/**
 * The fence system a guard ring is built from (mm). Defaults are a common mesh-panel system; the
 * planner replaces them with the system actually ordered.
 */
export const FenceSystemInput = z
  .object({
    /** Panel widths the supplier stocks, mm. */
    panelWidthsMm: z
      .array(mm(100, 3000))
      .min(1, 'Give at least one panel width')
      .max(20, 'Give at most 20 panel widths')
      .default([200, 300, 500, 700, 1000, 1200, 1500]),
    /** Panel height above the floor, mm (ISO 10218-2: a fixed perimeter guard is at least 1400 mm). */
    panelHeightMm: mm(1400, 3000).default(2000),
    /** Mesh opening: slot width, square side or round diameter, mm (ISO 13857 covers up to 120 mm). */
    meshMm: mm(1, 120).default(20),
    meshShape: z.enum(FENCE_MESH_SHAPES).default('square'),
    /** Width of a post across the fence line, mm. */
    postWidthMm: mm(20, 300).default(60),
    /** Kept beyond the ISO 13857 distance as the planner's margin, mm (150 mm is common practice). */
    clearanceMm: mm(0, 3000).default(150),
    /** Clear door widths on offer (a single-leaf and a double-leaf door, say), mm. */
    doorWidthsMm: z
      .array(mm(500, 6000))
      .min(1, 'Give at least one door width')
      .max(6, 'Give at most 6 door widths')
      .default([1000, 2000]),
    /** Whether walls of the floor plan may close part of the ring (no panels along them). */
    useWalls: z.boolean().default(true),
  })
  .strict();
export type FenceSystemInput = z.input<typeof FenceSystemInput>;
export type FenceSystem = z.output<typeof FenceSystemInput>;

/** The fence system with every default filled in. */
export const DEFAULT_FENCE_SYSTEM: FenceSystem = FenceSystemInput.parse({});

/** The proposal request: the fence system, and optionally the editor's unsaved layout content. */
export const FenceProposalRequest = FenceSystemInput.extend({ content: LayoutContent.optional() });
