/**
 * Bill of materials of guard fences: every fence polyline split into straight runs between posts,
 * each run filled with the stocked panel widths, posts at the joints, corners and wall ends,
 * doors where the fence has an opening. The same split serves a proposed guard ring and fences
 * the planner drew by hand.
 *
 * Run arithmetic (post centres at both ends of a run of centre-line length L, post width p):
 *   L = p/2 + Σ wᵢ + (n − 1)·p + p/2 = Σ (wᵢ + p)
 * so each panel "costs" its width plus one post, and the panels and posts of a run add up to L.
 */
import { pointSegmentDistance } from '../geometry/segmentDistance';
import type { Pt } from '../geometry/types';
import type { FenceSystem } from '../schemas/fenceProposal';
import type { Boundary } from '../schemas/layout';

/** A bend sharper than this between two fence segments is a corner (a corner post), degrees. */
export const CORNER_DEG = 1;
/** A fence end within this of a wall is fixed to it (a wall-fixing post), mm. */
export const WALL_TOUCH_MM = 5;
/** A cut panel narrower than this is not made; the last full panel is cut instead, mm (common practice). */
export const MIN_CUT_PANEL_MM = 100;
/** Floor anchors per post base plate (common practice for mesh-panel systems; check the maker's instructions). */
export const ANCHORS_PER_POST = 2;
/** Clear widths above this are double-leaf doors, mm (common practice). */
export const SINGLE_LEAF_MAX_MM = 1500;

export type PostKind = 'corner' | 'line' | 'wall-fixing';

/** One panel of a run: its width, and the stocked width it is cut from when it is cut. */
export interface RunPanel {
  widthMm: number;
  cutFromMm: number | null;
}

/**
 * Panels that fill a run of centre-line length L between two posts (see the file comment), mm:
 * stocked widths only when they fit exactly (largest first), otherwise the fewest panels with one
 * cut panel, never narrower than MIN_CUT_PANEL_MM when the run is long enough to avoid it.
 */
export function splitRun(lengthMm: number, widthsMm: ReadonlyArray<number>, postWidthMm: number): { panels: RunPanel[]; gapMm: number } {
  const widths = [...new Set(widthsMm)].sort((a, b) => b - a);
  const p = postWidthMm;
  const maxW = widths[0];
  const stocked = (w: number) => widths.find((s) => Math.abs(s - w) <= 1);
  const cutFrom = (w: number) => [...widths].reverse().find((s) => s >= w - 1e-6) ?? maxW;
  const panel = (w: number): RunPanel => {
    const s = stocked(w);
    return s !== undefined ? { widthMm: s, cutFromMm: null } : { widthMm: Math.round(w), cutFromMm: cutFrom(w) };
  };
  const gap = (panels: RunPanel[]) => lengthMm - panels.reduce((t, q) => t + q.widthMm + p, 0);
  // Exact fit from stocked widths, largest first: no cut panel.
  const greedy: RunPanel[] = [];
  let rem = lengthMm;
  for (const w of widths) {
    while (rem >= w + p - 1) {
      greedy.push({ widthMm: w, cutFromMm: null });
      rem -= w + p;
    }
  }
  if (Math.abs(rem) <= 1) return { panels: greedy, gapMm: rem };
  if (lengthMm <= p) return { panels: [], gapMm: lengthMm };
  // Fewest panels: n − 1 of the widest and the last one cut to what is left.
  const n = Math.max(1, Math.ceil(lengthMm / (maxW + p) - 1e-9));
  const panels: RunPanel[] = Array.from({ length: n - 1 }, () => ({ widthMm: maxW, cutFromMm: null }));
  let last = lengthMm - (n - 1) * (maxW + p) - p;
  if (last < MIN_CUT_PANEL_MM && panels.length) {
    // Too narrow to make: a narrower stocked panel before it leaves a wider last one.
    const w2 = widths.find((w) => w <= maxW + last - MIN_CUT_PANEL_MM) ?? widths[widths.length - 1];
    panels[panels.length - 1] = { widthMm: w2, cutFromMm: null };
    last += maxW - w2;
  }
  panels.push(panel(last));
  return { panels, gapMm: gap(panels) };
}

/** One fence line to count: a polyline (closed when its first and last points are equal), its height and its doors. */
export interface FenceLine {
  fenceId: string;
  points: ReadonlyArray<Pt>;
  heightMm: number;
  /** Door openings on the line: their two points (clear width between them). */
  doors: ReadonlyArray<{ id: string; a: Pt; b: Pt }>;
}

export interface PlacedPanel {
  /** Number on the plan, 1… in order along the fences. */
  n: number;
  fenceId: string;
  widthMm: number;
  heightMm: number;
  cutFromMm: number | null;
  /** Centre of the panel and its direction along the fence, plan mm / degrees CCW from +x. */
  at: Pt;
  angleDeg: number;
}

export interface PlacedPost {
  kind: PostKind;
  fenceId: string;
  at: Pt;
}

export interface PlacedDoor {
  id: string;
  fenceId: string;
  widthMm: number;
  heightMm: number;
  at: Pt;
}

export interface BomLine {
  item: string;
  size: string;
  quantity: number;
}

export interface FenceParts {
  panels: PlacedPanel[];
  posts: PlacedPost[];
  doors: PlacedDoor[];
  /** One entry per straight run: centre-line length and what its panels and posts add up to, mm. */
  runs: Array<{ fenceId: string; lengthMm: number; builtMm: number }>;
  /** Length of every fence line, doors included, mm. */
  lengthMm: number;
  bom: BomLine[];
}

type Station = { s: number; kind: PostKind | null };

const dist = (a: Readonly<Pt>, b: Readonly<Pt>) => Math.hypot(b[0] - a[0], b[1] - a[1]);

/** Points with repeated neighbours removed and collinear interior points merged (bends under CORNER_DEG). */
function corners(points: ReadonlyArray<Pt>, closed: boolean): Pt[] {
  const pts: Pt[] = [];
  for (const p of points) if (!pts.length || dist(pts[pts.length - 1], p) > 1e-6) pts.push([p[0], p[1]]);
  if (closed && pts.length > 1 && dist(pts[0], pts[pts.length - 1]) <= 1e-6) pts.pop();
  const bend = (a: Pt, b: Pt, c: Pt) => {
    const u = Math.atan2(b[1] - a[1], b[0] - a[0]);
    const v = Math.atan2(c[1] - b[1], c[0] - b[0]);
    let d = Math.abs(((v - u) * 180) / Math.PI) % 360;
    if (d > 180) d = 360 - d;
    return d;
  };
  let changed = true;
  while (changed && pts.length > (closed ? 3 : 2)) {
    changed = false;
    const n = pts.length;
    for (let i = closed ? 0 : 1; i < (closed ? n : n - 1); i++) {
      const a = pts[(i - 1 + n) % n], b = pts[i], c = pts[(i + 1) % n];
      if (bend(a, b, c) < CORNER_DEG) {
        pts.splice(i, 1);
        changed = true;
        break;
      }
    }
  }
  return pts;
}

function touchesWall(p: Readonly<Pt>, walls: ReadonlyArray<readonly [Pt, Pt]>): boolean {
  return walls.some(([a, b]) => pointSegmentDistance(p[0], p[1], a[0], a[1], b[0], b[1]) <= WALL_TOUCH_MM);
}

const fmtMm = (v: number) => String(Math.round(v));

/** The door's leaf count by its clear width (common practice: above 1500 mm two leaves). */
export function doorItem(widthMm: number): string {
  return widthMm > SINGLE_LEAF_MAX_MM ? 'door, double-leaf' : 'door, single-leaf';
}

/**
 * Splits fence lines into runs, panels, posts and doors, and counts them (plan mm). `walls` are the
 * wall faces (segments) an open fence end may be fixed to.
 */
export function fenceParts(lines: ReadonlyArray<FenceLine>, system: Readonly<FenceSystem>, walls: ReadonlyArray<readonly [Pt, Pt]> = []): FenceParts {
  const p = system.postWidthMm;
  const panels: PlacedPanel[] = [];
  const posts: PlacedPost[] = [];
  const doors: PlacedDoor[] = [];
  const runs: FenceParts['runs'] = [];
  let lengthMm = 0;
  for (const line of lines) {
    const closed = line.points.length > 3 && dist(line.points[0], line.points[line.points.length - 1]) <= 1e-6;
    const pts = corners(line.points, closed);
    if (pts.length < 2) continue;
    const path = closed ? [...pts, pts[0]] : pts;
    // Arc length at every vertex.
    const sAt: number[] = [0];
    for (let i = 1; i < path.length; i++) sAt.push(sAt[i - 1] + dist(path[i - 1], path[i]));
    const total = sAt[sAt.length - 1];
    lengthMm += total;
    const pointAt = (s: number): { at: Pt; angleDeg: number } => {
      let i = 1;
      while (i < path.length - 1 && sAt[i] < s) i++;
      const a = path[i - 1], b = path[i];
      const seg = sAt[i] - sAt[i - 1] || 1;
      const t = Math.min(1, Math.max(0, (s - sAt[i - 1]) / seg));
      return { at: [a[0] + (b[0] - a[0]) * t, a[1] + (b[1] - a[1]) * t], angleDeg: (Math.atan2(b[1] - a[1], b[0] - a[0]) * 180) / Math.PI };
    };
    const project = (q: Readonly<Pt>): number => {
      let best = Infinity, bestS = 0;
      for (let i = 1; i < path.length; i++) {
        const a = path[i - 1], b = path[i];
        const L = sAt[i] - sAt[i - 1];
        const t = L > 0 ? Math.min(1, Math.max(0, ((q[0] - a[0]) * (b[0] - a[0]) + (q[1] - a[1]) * (b[1] - a[1])) / (L * L))) : 0;
        const d = Math.hypot(a[0] + (b[0] - a[0]) * t - q[0], a[1] + (b[1] - a[1]) * t - q[1]);
        if (d < best) {
          best = d;
          bestS = sAt[i - 1] + t * L;
        }
      }
      return bestS;
    };
    // Stations: posts at corners and ends, and on both sides of every door (outside its clear width).
    const stations: Station[] = [];
    const endKind = (q: Pt): PostKind => (touchesWall(q, walls) ? 'wall-fixing' : 'line');
    stations.push({ s: 0, kind: closed ? 'corner' : endKind(path[0]) });
    for (let i = 1; i < path.length - 1; i++) stations.push({ s: sAt[i], kind: 'corner' });
    if (!closed) stations.push({ s: total, kind: endKind(path[path.length - 1]) });
    const doorSpans: Array<[number, number]> = [];
    for (const d of line.doors) {
      const s0 = project(d.a), s1 = project(d.b);
      const lo = Math.min(s0, s1), hi = Math.max(s0, s1);
      const width = hi - lo;
      if (width < 1) continue;
      doorSpans.push([lo - p / 2, hi + p / 2]);
      stations.push({ s: lo - p / 2, kind: 'line' }, { s: hi + p / 2, kind: 'line' });
      doors.push({ id: d.id, fenceId: line.fenceId, widthMm: Math.round(width), heightMm: line.heightMm, at: pointAt((lo + hi) / 2).at });
    }
    stations.sort((u, v) => u.s - v.s);
    // Merge stations closer than a post width (a door post on a corner is the corner post).
    const merged: Station[] = [];
    for (const st of stations) {
      const last = merged[merged.length - 1];
      if (last && st.s - last.s < p / 2) {
        if (st.kind === 'corner' || st.kind === 'wall-fixing') last.kind = st.kind;
        continue;
      }
      merged.push({ ...st });
    }
    if (closed && merged.length > 1 && total - merged[merged.length - 1].s < p / 2) merged.pop();
    for (const st of merged) posts.push({ kind: st.kind ?? 'line', fenceId: line.fenceId, at: pointAt(st.s).at });
    const ends = closed ? [...merged, { s: total, kind: merged[0].kind }] : merged;
    for (let k = 0; k + 1 < ends.length; k++) {
      const s0 = ends[k].s, s1 = ends[k + 1].s;
      const mid = (s0 + s1) / 2;
      if (doorSpans.some(([lo, hi]) => mid > lo && mid < hi)) continue;
      const L = s1 - s0;
      if (L <= 1) continue;
      const split = splitRun(L, system.panelWidthsMm, p);
      let s = s0 + p / 2;
      let built = 0;
      split.panels.forEach((pn, i) => {
        const pos = pointAt(s + pn.widthMm / 2);
        panels.push({ n: panels.length + 1, fenceId: line.fenceId, widthMm: pn.widthMm, heightMm: line.heightMm, cutFromMm: pn.cutFromMm, at: pos.at, angleDeg: pos.angleDeg });
        s += pn.widthMm + p;
        built += pn.widthMm + p;
        if (i < split.panels.length - 1) posts.push({ kind: 'line', fenceId: line.fenceId, at: pointAt(s - p / 2).at });
      });
      runs.push({ fenceId: line.fenceId, lengthMm: L, builtMm: built });
    }
  }
  return { panels, posts, doors, runs, lengthMm, bom: countBom(panels, posts, doors, system) };
}

/** The BOM table: panels by width × height (cut panels apart), posts by kind, doors by width with their interlocks, floor anchors. */
function countBom(panels: ReadonlyArray<PlacedPanel>, posts: ReadonlyArray<PlacedPost>, doors: ReadonlyArray<PlacedDoor>, system: Readonly<FenceSystem>): BomLine[] {
  const counts = new Map<string, BomLine & { order: number }>();
  const add = (item: string, size: string, order: number, n = 1) => {
    const key = `${item}|${size}`;
    const c = counts.get(key);
    if (c) c.quantity += n;
    else counts.set(key, { item, size, quantity: n, order });
  };
  for (const pn of panels) {
    if (pn.cutFromMm == null) add('panel', `${fmtMm(pn.widthMm)} × ${fmtMm(pn.heightMm)} mm`, 1e6 - pn.widthMm);
    else add('panel, cut', `${fmtMm(pn.cutFromMm)} × ${fmtMm(pn.heightMm)} mm cut to ${fmtMm(pn.widthMm)} mm`, 2e6 - pn.widthMm);
  }
  const postOrder: Record<PostKind, number> = { corner: 1, line: 2, 'wall-fixing': 3 };
  for (const po of posts) add(`post, ${po.kind}`, `${fmtMm(system.postWidthMm)} mm`, 3e6 + postOrder[po.kind]);
  for (const d of doors) {
    add(doorItem(d.widthMm), `${fmtMm(d.widthMm)} × ${fmtMm(d.heightMm)} mm clear`, 4e6 + d.widthMm);
    add('interlock', 'door switch', 5e6);
  }
  if (posts.length) add('floor anchor', `${ANCHORS_PER_POST} per post`, 6e6, posts.length * ANCHORS_PER_POST);
  return [...counts.values()].sort((a, b) => a.order - b.order || a.size.localeCompare(b.size)).map(({ item, size, quantity }) => ({ item, size, quantity }));
}

/** Fence lines of a layout's fences (hand-drawn or accepted), with the openings cut into them as doors. */
export function fenceLinesOf(boundaries: ReadonlyArray<Boundary>): FenceLine[] {
  return boundaries
    .filter((z) => z.kind === 'fence' && z.points.length >= 2)
    .map((f) => ({
      fenceId: f.id,
      points: f.points.map(([x, y]) => [x, y] as Pt),
      heightMm: f.height ?? 0,
      doors: boundaries.filter((o) => o.kind === 'opening' && o.fenceId === f.id && o.points.length === 2).map((o) => ({ id: o.id, a: [o.points[0][0], o.points[0][1]] as Pt, b: [o.points[1][0], o.points[1][1]] as Pt })),
    }));
}

/** The bill of materials as CSV (notes as `# ` lines, then item, size, quantity), RFC 4180 quoting. */
export function bomCsv(bom: ReadonlyArray<BomLine>, notes: ReadonlyArray<string> = []): string {
  const q = (v: string | number) => {
    const s = String(v);
    return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
  };
  // Notes (what, when, cautions) as `# ` lines before the header, one quoted cell each.
  const noteLines = notes.map((n) => `"# ${n.replace(/"/g, '""')}"`);
  return [...noteLines, 'item,size,quantity', ...bom.map((b) => [q(b.item), q(b.size), q(b.quantity)].join(','))].join('\r\n') + '\r\n';
}
