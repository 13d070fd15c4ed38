import { pointInPolygons } from '../geometry/pointInPolygon';
import type { Polygon2, Pt } from '../geometry/types';
import type { Boundary } from '../schemas/layout';
import { frameOf, sectionCutOf, type Frame, type SectionArm, type SectionCut, type SectionLine } from './sectionCut';
import { subtractOpenings } from './segments';
import type { PreparedFloor, StructureItem } from './types';

export { checkSectionLine, sectionCutOf, type SectionArm, type SectionCut, type SectionLine } from './sectionCut';

/**
 * The section: a side view along a line drawn on the plan. Section coordinates are s = distance
 * along the line from its start A, mm, and z = height above finished floor level, mm. Everything
 * the vertical plane through the line meets is given in (s, z): the floor, structure items with
 * their tops, fences with their heights, and each arm's space cut by the plane.
 *
 * Each arm's cut comes from sectionCut.ts.
 */

export interface SectionInput {
  line: SectionLine;
  floor: PreparedFloor | null;
  boundaries: ReadonlyArray<Boundary>;
  arms: ReadonlyArray<SectionArm>;
}

/** A structure item crossed by the section: its s-interval and top (null = full height), mm. */
export interface SectionStructure {
  id: string;
  layer: string;
  role: StructureItem['role'];
  s: [number, number];
  top: number | null;
}

/** A solid part of a fence crossed by the section, at s, with the fence's height, mm. */
export interface SectionFence {
  id: string;
  label: string;
  s: number;
  height: number;
}

/** An access opening crossed by the section, at s, mm. */
export interface SectionOpening {
  id: string;
  label: string;
  s: number;
}

/**
 * The numbers at a fence (names as in ISO 13857's reach-over tables): b = fence height, a = highest
 * point of any arm space in the section, c = horizontal distance in s from the fence to the nearest
 * arm space (0 when the space reaches the fence's s), mm. `toS` is the s of that nearest space boundary.
 */
export interface SectionDimension {
  fenceId: string;
  s: number;
  b: number;
  a: number | null;
  c: number | null;
  armId: string | null;
  toS: number | null;
}

export interface SectionResult {
  line: [[number, number], [number, number]];
  lengthMm: number;
  /** s-intervals where the line is over the floor (the whole line when the plan has no floor outline). */
  floor: Array<[number, number]>;
  structures: SectionStructure[];
  fences: SectionFence[];
  openings: SectionOpening[];
  arms: SectionCut[];
  dimensions: SectionDimension[];
}

/** Parameters s (mm along the line) where the section segment crosses segment pq. */
function crossingS(f: Frame, p: Readonly<Pt>, q: Readonly<Pt>, out: number[]): void {
  const ex = q[0] - p[0];
  const ey = q[1] - p[1];
  const den = f.dx * ey - f.dy * ex;
  if (Math.abs(den) < 1e-12) return; // parallel: the midpoint tests decide what is inside
  const wx = p[0] - f.ax;
  const wy = p[1] - f.ay;
  const s = (wx * ey - wy * ex) / den;
  const u = (wx * f.dy - wy * f.dx) / den;
  if (s >= 0 && s <= f.length && u >= 0 && u <= 1) out.push(s);
}

/** s-intervals of the section segment inside polygons (even–odd with holes), mm. */
function insideIntervals(f: Frame, polygons: ReadonlyArray<Polygon2>): Array<[number, number]> {
  const cuts = [0, f.length];
  for (const poly of polygons) for (const ring of poly) for (let i = 0; i < ring.length; i++) crossingS(f, ring[i], ring[(i + 1) % ring.length], cuts);
  cuts.sort((a, b) => a - b);
  const out: Array<[number, number]> = [];
  for (let i = 0; i + 1 < cuts.length; i++) {
    const s0 = cuts[i];
    const s1 = cuts[i + 1];
    if (s1 - s0 < 1e-9) continue;
    const m = (s0 + s1) / 2;
    if (!pointInPolygons(f.ax + f.dx * m, f.ay + f.dy * m, polygons)) continue;
    const last = out[out.length - 1];
    if (last && s0 - last[1] <= 1e-9) last[1] = s1;
    else out.push([s0, s1]);
  }
  return out;
}

function polylineCrossings(f: Frame, line: ReadonlyArray<Readonly<Pt>>): number[] {
  const out: number[] = [];
  for (let i = 0; i + 1 < line.length; i++) crossingS(f, line[i], line[i + 1], out);
  return [...new Set(out)].sort((a, b) => a - b);
}

function structuresCrossed(f: Frame, floor: PreparedFloor | null): SectionStructure[] {
  const out: SectionStructure[] = [];
  for (const item of floor?.structures ?? []) {
    const top = Number.isFinite(item.top) ? item.top : null;
    const base = { id: item.id, layer: item.layer, role: item.role, top };
    for (const s of insideIntervals(f, item.polygons)) out.push({ ...base, s });
    for (const l of item.lines) for (const s of polylineCrossings(f, l)) out.push({ ...base, s: [s, s] });
  }
  return out.sort((a, b) => a.s[0] - b.s[0] || (a.id < b.id ? -1 : 1));
}

/**
 * The side view along a section line (plan mm): floor extent, structure pieces, fences and
 * openings crossed, each arm's space cut by the vertical plane, and the b/a/c numbers at each
 * fence, all in section coordinates (s along the line from its start, z above the floor), mm.
 */
export function sectionOf(input: Readonly<SectionInput>): SectionResult {
  const f = frameOf(input.line);
  const floor = input.floor && input.floor.outline.length ? insideIntervals(f, input.floor.outline) : [[0, f.length] as [number, number]];
  const structures = structuresCrossed(f, input.floor);

  const fences: SectionFence[] = [];
  const openings: SectionOpening[] = [];
  const openingBoundaries = input.boundaries.filter((z) => z.kind === 'opening');
  for (const z of input.boundaries) {
    if (z.kind === 'fence') {
      const cuts = openingBoundaries.filter((o) => o.fenceId === z.id).map((o) => [o.points[0], o.points[1]] as const);
      for (const part of subtractOpenings(z.points, cuts)) {
        for (const s of polylineCrossings(f, part)) fences.push({ id: z.id, label: z.label || z.id, s, height: z.height ?? 0 });
      }
    } else if (z.kind === 'opening') {
      for (const s of polylineCrossings(f, z.points)) openings.push({ id: z.id, label: z.label || z.id, s });
    }
  }
  fences.sort((a, b) => a.s - b.s);
  openings.sort((a, b) => a.s - b.s);

  const arms: SectionCut[] = [];
  for (const arm of input.arms) {
    const cut = sectionCutOf(input.line, arm);
    if (cut) arms.push(cut);
  }
  const a = arms.length ? Math.max(...arms.map((c) => c.zMax)) : null;
  const dimensions: SectionDimension[] = fences.map((fence) => {
    let best: { c: number; armId: string; toS: number } | null = null;
    for (const cut of arms) {
      for (const [s0, s1] of cut.spans) {
        const cand = fence.s < s0 ? { c: s0 - fence.s, toS: s0 } : fence.s > s1 ? { c: fence.s - s1, toS: s1 } : { c: 0, toS: fence.s };
        if (!best || cand.c < best.c) best = { ...cand, armId: cut.id };
      }
    }
    return { fenceId: fence.id, s: fence.s, b: fence.height, a, c: best?.c ?? null, armId: best?.armId ?? null, toS: best?.toS ?? null };
  });

  const [[ax, ay], [bx, by]] = input.line;
  return { line: [[ax, ay], [bx, by]], lengthMm: f.length, floor, structures, fences, openings, arms, dimensions };
}
