/**
 * Sampled side reach profile: the region of the (r, z) half-plane swept by a point of an arm
 * when every axis but J1 moves over its range, found by sampling the joint space.
 *
 * Method (docs/kinematics.md, "Sampled profiles"), in the order sampleProfile() runs it:
 * 1. sample the box of axis ranges: its 2^k corners, then a Halton sweep (low-discrepancy; the
 *    radical inverse in the first primes, stepped incrementally by HaltonSequence);
 * 2. map each sample to (r, z): the point is turned by −bearing (the reach plane's bearing, 0
 *    when J1 is held at kinematic 0), then ρ = √(x² + y²) and r = sign(x)·ρ (x ≥ 0 counts as +).
 *    Using ρ keeps the radial distance from the J1 axis exact when the point sits to one side of
 *    the plane through J1 (a lateral offset); the side distance y is reported as `lateral`
 *    (min / mean / max) so plan bands can turn their edges by atan2(y, r);
 * 3. fill the interior: up to four lattice "sheets" over the two most sensitive axes (the other
 *    axes held at mid-range for the first sheet, at Halton points for the others), each lattice
 *    cell's image drawn as two triangles. Nodes are spaced so that their images lie about 12
 *    cells apart (at most 160 nodes per axis), which keeps a curved edge's sagitta well under a
 *    cell;
 * 4. refine the edge: samples in cells touching empty cells get k + 2 children each within a
 *    joint step that moves the point about 3 cells (clamped to the limits, so limit faces are
 *    sampled), round after round (at most 60), until no child of a round lands more than one
 *    cell away from what the rounds before occupied, nor off the grid (`converged`), or
 *    `maxSamples` is reached;
 * 5. close gaps of up to two cells (3×3 morphological closing), grow by one cell (3×3 dilation)
 *    and trace the 0.5 iso-line with d3-contour. A sample's whole cell lies at least one cell
 *    inside the outline, so the polygon contains EVERY sample.
 *
 * Tolerance: the raster cell is a third of `toleranceMm`. The outline lies within grown cells,
 * each within 2 cells (in r and in z) of an occupied cell (a sample's cell or one filled by a
 * sheet), so every outline point is within 3 cells in r and in z of the region (errs toward MORE
 * reach). Inward, the stopping rule leaves no reached region that the last round could find more
 * than a cell beyond the outline.
 */
import { contours } from 'd3';
import type { Polygon2, ReachProfile, Ring } from './types';

/** A point function: axis values q (the caller's units) → point in the arm frame written to out[0..2] (mm); false when the pose does not assemble. */
export type PointFn = (q: Float64Array, out: Float64Array) => boolean;

/** Range of one axis in the units the point function takes; min = max holds the axis fixed. */
export interface AxisRange {
  min: number;
  max: number;
}

export interface SampleProfileOptions {
  /**
   * Stated tolerance of the outline, mm (default: 3/400 of the first sweep's larger extent, r or
   * z, rounded up to whole mm and at least 6 mm). The raster cell is a third of it.
   */
  toleranceMm?: number;
  /** Samples of the first sweep, box corners included (default by free axes: 512 for one, 2048 for two, 4096 for three, then 8192, 12 288 and 16 384 from six). */
  initialSamples?: number;
  /** Upper bound on samples drawn (default 250 000); the 2^k box corners are drawn whatever it is. */
  maxSamples?: number;
  /** Arm-frame bearing of the reach plane, degrees: points are turned by −bearing before r is taken (default 0). */
  bearingDeg?: number;
}

/** A sampled reach profile with what the sampling found. */
export interface SampledReachProfile extends ReachProfile {
  method: 'sampled';
  /** Raster cell edge, mm. */
  cellMm: number;
  /** Poses evaluated (box corners, sweep, sheets and refinement) and how many of them assembled. */
  samples: number;
  assembled: number;
  /** True when the last refinement round found nothing more than a cell beyond what was occupied before it (always true with no free axis). */
  converged: boolean;
  /** Distance of the point to the side of the reach plane (turned-frame y), mm. */
  lateral: { min: number; mean: number; max: number };
}

/** The first 8 primes: Halton bases for up to 8 free axes. */
const PRIMES = [2, 3, 5, 7, 11, 13, 17, 19];
/** Default upper bound on samples drawn. */
const DEFAULT_MAX_SAMPLES = 250_000;
/** First-sweep sample counts by number of free axes (0 … 8). */
const DEFAULT_INITIAL = [1, 512, 2048, 4096, 8192, 12288, 16384, 16384, 16384];
/** Default tolerance: the first sweep's larger extent spans about 400 cells (31 mm for Demo Six-Axis 2000), never under 6 mm. */
const DEFAULT_CELLS_ACROSS = 400;
const MIN_DEFAULT_TOLERANCE_MM = 6;
/** Edge refinement: at most this many rounds. */
const MAX_ROUNDS = 60;
/** Lattice sheets: node spacing in cells (image chord ≤ 12 cells keeps the arc's sagitta well under a cell), nodes per axis, sheets. */
const SHEET_NODE_CELLS = 12;
const SHEET_MAX_NODES = 160;
const SHEETS = 4;
/** Empty cells around the raster's inner part, where no sample is marked. */
const PAD_CELLS = 4;

/**
 * Halton sequence in `dims` dimensions (bases 2, 3, 5, …): coordinate k of point i is the radical
 * inverse of i in the k-th prime (van der Corput), a value in [0, 1). Stepped incrementally: each
 * call of next() adds one to the index in every base's digits, amortised O(1) per coordinate.
 */
export class HaltonSequence {
  readonly dims: number;
  private index = 0;
  private readonly digits: Uint32Array[];
  private readonly values: Float64Array;

  constructor(dims: number) {
    if (!Number.isInteger(dims) || dims < 1 || dims > PRIMES.length) throw new Error(`dims: expected 1…${PRIMES.length}`);
    this.dims = dims;
    this.digits = Array.from({ length: dims }, () => new Uint32Array(64));
    this.values = new Float64Array(dims);
  }

  /** Index of the point the next call returns (the first is index 0, the origin). */
  get nextIndex(): number {
    return this.index;
  }

  /** Writes the current point (each coordinate in [0, 1)) to out and steps the index. */
  next(out: Float64Array): void {
    for (let k = 0; k < this.dims; k++) out[k] = this.values[k];
    this.index++;
    for (let k = 0; k < this.dims; k++) {
      const b = PRIMES[k];
      const digits = this.digits[k];
      let v = this.values[k];
      let weight = 1 / b;
      let pos = 0;
      while (digits[pos] === b - 1) {
        digits[pos] = 0;
        v -= (b - 1) * weight;
        weight /= b;
        pos++;
      }
      digits[pos]++;
      v += weight;
      this.values[k] = v < 0 ? 0 : v;
    }
  }
}

/** Growable store of samples: (r, z), the free-axis coordinates u ∈ [0,1]^k, running bounds and lateral statistics. */
class SampleStore {
  rz = new Float64Array(2 * 8192);
  /** Side distance y of each sample (turned frame), mm. */
  side = new Float64Array(8192);
  u: Float64Array;
  count = 0;
  rMin = Infinity;
  rMax = -Infinity;
  zMin = Infinity;
  zMax = -Infinity;
  yMin = Infinity;
  yMax = -Infinity;
  ySum = 0;

  constructor(readonly k: number) {
    this.u = new Float64Array(Math.max(1, k) * 8192);
  }

  add(r: number, z: number, y: number, u: Float64Array): void {
    const k = this.k;
    if (2 * this.count + 2 > this.rz.length) {
      const rz = new Float64Array(this.rz.length * 2);
      rz.set(this.rz);
      this.rz = rz;
      const side = new Float64Array(this.side.length * 2);
      side.set(this.side);
      this.side = side;
      const uu = new Float64Array(this.u.length * 2);
      uu.set(this.u);
      this.u = uu;
    }
    this.rz[2 * this.count] = r;
    this.rz[2 * this.count + 1] = z;
    this.side[this.count] = y;
    for (let f = 0; f < k; f++) this.u[k * this.count + f] = u[f];
    this.count++;
    if (r < this.rMin) this.rMin = r;
    if (r > this.rMax) this.rMax = r;
    if (z < this.zMin) this.zMin = z;
    if (z > this.zMax) this.zMax = z;
    if (y < this.yMin) this.yMin = y;
    if (y > this.yMax) this.yMax = y;
    this.ySum += y;
  }
}


/** 3×3 square dilation (max) or erosion (min) of a binary raster, as a row pass then a column pass (border cells repeat their own value outward). */
function morph3(src: Uint8Array, w: number, h: number, dilate: boolean, tmp: Uint8Array, out: Uint8Array): Uint8Array {
  for (let j = 0; j < h; j++) {
    const row = j * w;
    if (w === 1) {
      tmp[row] = src[row];
      continue;
    }
    const end = row + w - 1;
    if (dilate) {
      tmp[row] = src[row] | src[row + 1];
      for (let c = row + 1; c < end; c++) tmp[c] = src[c - 1] | src[c] | src[c + 1];
      tmp[end] = src[end - 1] | src[end];
    } else {
      tmp[row] = src[row] & src[row + 1];
      for (let c = row + 1; c < end; c++) tmp[c] = src[c - 1] & src[c] & src[c + 1];
      tmp[end] = src[end - 1] & src[end];
    }
  }
  if (h === 1) {
    out.set(tmp.subarray(0, w));
    return out;
  }
  const last = (h - 1) * w;
  for (let i = 0; i < w; i++) {
    out[i] = dilate ? tmp[i] | tmp[i + w] : tmp[i] & tmp[i + w];
    out[last + i] = dilate ? tmp[last + i] | tmp[last - w + i] : tmp[last + i] & tmp[last - w + i];
  }
  for (let c = w; c < last; c++) out[c] = dilate ? tmp[c - w] | tmp[c] | tmp[c + w] : tmp[c - w] & tmp[c] & tmp[c + w];
  return out;
}

interface Sheet {
  /** Sample index of each lattice node (−1 when it did not assemble), n0 × n1 nodes. */
  nodes: Int32Array;
  n0: number;
  n1: number;
}

/**
 * Raster of the samples on a padded grid of square cells. `stamp` holds, per cell, 0 when
 * empty, else the refinement round in which it was first occupied + 1 (samples, and cells
 * covered by the filled images of lattice sheets); `rep` one sample per sampled cell.
 */
class Raster {
  r0 = 0;
  z0 = 0;
  w = 0;
  h = 0;
  stamp = new Uint16Array(0);
  rep = new Int32Array(0);
  private readonly sheets: Sheet[] = [];

  constructor(readonly cell: number, private readonly store: SampleStore) {}

  /** Lays the grid over the store's bounds with a margin, marks every sample and refills the sheets. */
  layOut(): void {
    const { store, cell } = this;
    const margin = PAD_CELLS * cell + 0.03 * Math.max(store.rMax - store.rMin, store.zMax - store.zMin);
    this.r0 = store.rMin - margin;
    this.z0 = store.zMin - margin;
    this.w = Math.ceil((store.rMax - store.rMin + 2 * margin) / cell) + 1;
    this.h = Math.ceil((store.zMax - store.zMin + 2 * margin) / cell) + 1;
    this.stamp = new Uint16Array(this.w * this.h);
    this.rep = new Int32Array(this.w * this.h).fill(-1);
    for (let s = 0; s < store.count; s++) this.mark(s, 1);
    for (const sheet of this.sheets) this.fillSheet(sheet);
  }

  /** Cell index of (r, z), or −1 when it falls outside the grid's inner part. */
  cellOf(r: number, z: number): number {
    const i = Math.floor((r - this.r0) / this.cell);
    const j = Math.floor((z - this.z0) / this.cell);
    if (i < PAD_CELLS || j < PAD_CELLS || i >= this.w - PAD_CELLS || j >= this.h - PAD_CELLS) return -1;
    return j * this.w + i;
  }

  /** Marks sample s with a round stamp; returns its cell when newly occupied, −2 when occupied before, −1 off the grid. */
  mark(s: number, stamp: number): number {
    const c = this.cellOf(this.store.rz[2 * s], this.store.rz[2 * s + 1]);
    if (c < 0) return -1;
    this.rep[c] = s;
    if (this.stamp[c] !== 0) return -2;
    this.stamp[c] = stamp;
    return c;
  }

  /** True when no cell of the 3×3 block around c was occupied before round stamp `stamp`. */
  isolated(c: number, stamp: number): boolean {
    const { w, stamp: st } = this;
    for (let dj = -w; dj <= w; dj += w) {
      for (let di = -1; di <= 1; di++) {
        const v = st[c + dj + di];
        if (v !== 0 && v < stamp) return false;
      }
    }
    return true;
  }

  /** True when a cell touches an empty cell (8-neighbourhood). */
  onEdge(c: number): boolean {
    const { w, stamp: st } = this;
    return st[c - 1] === 0 || st[c + 1] === 0 || st[c - w] === 0 || st[c + w] === 0 ||
      st[c - w - 1] === 0 || st[c - w + 1] === 0 || st[c + w - 1] === 0 || st[c + w + 1] === 0;
  }

  /** Cells that hold a sample and touch an empty cell, in cell order: the edge that refinement starts from. */
  sampledEdgeCells(): number[] {
    const cells: number[] = [];
    for (let c = 0; c < this.rep.length; c++) if (this.rep[c] >= 0 && this.onEdge(c)) cells.push(c);
    return cells;
  }

  /** Adds a lattice sheet and fills the images of its cells (two triangles per cell, segments for a 1-D lattice). */
  addSheet(sheet: Sheet): void {
    this.sheets.push(sheet);
    this.fillSheet(sheet);
  }

  private fillSheet({ nodes, n0, n1 }: Sheet): void {
    const { rz, side } = this.store;
    const { r0, z0, cell } = this;
    const halfCell = cell / 2;
    // r = sign(x)·ρ jumps by 2|y| where x changes sign off the plane through J1: never fill across it
    const jumps2 = (s: number, t: number): boolean =>
      rz[2 * s] >= 0 !== rz[2 * t] >= 0 && (Math.abs(side[s]) > halfCell || Math.abs(side[t]) > halfCell);
    const jumps4 = (s: number, t: number, u: number, v: number): boolean => {
      const p = (rz[2 * s] >= 0 ? 1 : 0) + (rz[2 * t] >= 0 ? 1 : 0) + (rz[2 * u] >= 0 ? 1 : 0) + (rz[2 * v] >= 0 ? 1 : 0);
      if (p === 0 || p === 4) return false;
      return Math.abs(side[s]) > halfCell || Math.abs(side[t]) > halfCell || Math.abs(side[u]) > halfCell || Math.abs(side[v]) > halfCell;
    };
    // Grid coordinates of every node, once (a node is shared by up to four lattice cells).
    const gx = new Float64Array(nodes.length);
    const gy = new Float64Array(nodes.length);
    for (let m = 0; m < nodes.length; m++) {
      const s = nodes[m];
      if (s < 0) continue;
      gx[m] = (rz[2 * s] - r0) / cell;
      gy[m] = (rz[2 * s + 1] - z0) / cell;
    }
    if (n1 === 1) {
      for (let a = 0; a + 1 < n0; a++) {
        const s = nodes[a], t = nodes[a + 1];
        if (s >= 0 && t >= 0 && !jumps2(s, t)) this.fillSegment(gx[a], gy[a], gx[a + 1], gy[a + 1]);
      }
      return;
    }
    for (let a = 0; a + 1 < n0; a++) {
      for (let b = 0; b + 1 < n1; b++) {
        const m00 = a * n1 + b, m10 = m00 + n1, m01 = m00 + 1, m11 = m10 + 1;
        const s00 = nodes[m00], s10 = nodes[m10];
        const s01 = nodes[m01], s11 = nodes[m11];
        if (s00 >= 0 && s10 >= 0 && !jumps2(s00, s10)) this.fillSegment(gx[m00], gy[m00], gx[m10], gy[m10]);
        if (s00 >= 0 && s01 >= 0 && !jumps2(s00, s01)) this.fillSegment(gx[m00], gy[m00], gx[m01], gy[m01]);
        if (s00 < 0 || s10 < 0 || s01 < 0 || s11 < 0 || jumps4(s00, s10, s01, s11)) continue;
        this.fillTriangle(gx[m00], gy[m00], gx[m10], gy[m10], gx[m11], gy[m11]);
        this.fillTriangle(gx[m00], gy[m00], gx[m11], gy[m11], gx[m01], gy[m01]);
      }
    }
  }

  /** Fills the cells whose centres lie in a triangle (grid units); lattice edges are drawn as segments apart. */
  private fillTriangle(ax: number, ay: number, bx: number, by: number, cx: number, cy: number): void {
    const { w, h, stamp } = this;
    const jLo = Math.max(PAD_CELLS, Math.ceil(Math.min(ay, by, cy) - 0.5));
    const jHi = Math.min(h - PAD_CELLS - 1, Math.floor(Math.max(ay, by, cy) - 0.5));
    for (let j = jLo; j <= jHi; j++) {
      const yc = j + 0.5;
      // Where the row through yc meets each edge (a horizontal edge counts with both ends).
      let lo = Infinity;
      let hi = -Infinity;
      if ((ay <= yc && yc <= by) || (by <= yc && yc <= ay)) {
        if (ay === by) {
          lo = Math.min(lo, ax, bx);
          hi = Math.max(hi, ax, bx);
        } else {
          const x = ax + ((yc - ay) * (bx - ax)) / (by - ay);
          if (x < lo) lo = x;
          if (x > hi) hi = x;
        }
      }
      if ((by <= yc && yc <= cy) || (cy <= yc && yc <= by)) {
        if (by === cy) {
          lo = Math.min(lo, bx, cx);
          hi = Math.max(hi, bx, cx);
        } else {
          const x = bx + ((yc - by) * (cx - bx)) / (cy - by);
          if (x < lo) lo = x;
          if (x > hi) hi = x;
        }
      }
      if ((cy <= yc && yc <= ay) || (ay <= yc && yc <= cy)) {
        if (cy === ay) {
          lo = Math.min(lo, cx, ax);
          hi = Math.max(hi, cx, ax);
        } else {
          const x = cx + ((yc - cy) * (ax - cx)) / (ay - cy);
          if (x < lo) lo = x;
          if (x > hi) hi = x;
        }
      }
      const iLo = Math.max(PAD_CELLS, Math.ceil(lo - 0.5));
      const iHi = Math.min(w - PAD_CELLS - 1, Math.floor(hi - 0.5));
      // Sheets are filled right after layOut, while every stamp is 0 or 1: a plain fill keeps them.
      for (let c = j * w + iLo, end = j * w + iHi; c <= end; c++) stamp[c] = 1;
    }
  }

  /** Fills the cells a segment (grid units) passes through, in steps of at most half a cell. */
  private fillSegment(x1: number, y1: number, x2: number, y2: number): void {
    const { w, h, stamp } = this;
    const steps = Math.ceil(2 * Math.max(Math.abs(x2 - x1), Math.abs(y2 - y1))) + 1;
    const dx = x2 - x1, dy = y2 - y1;
    for (let t = 0; t <= steps; t++) {
      const i = Math.floor(x1 + (dx * t) / steps);
      const j = Math.floor(y1 + (dy * t) / steps);
      if (i < PAD_CELLS || j < PAD_CELLS || i >= w - PAD_CELLS || j >= h - PAD_CELLS) continue;
      stamp[j * w + i] = 1; // every stamp is 0 or 1 while sheets are filled (see fillTriangle)
    }
  }

  /** Occupied cells closed (3×3 closing) and grown by one cell (3×3 dilation), then traced (d3-contour at 0.5), arm-frame (r, z) mm. */
  trace(): Polygon2[] {
    const { r0, z0, cell, w, h } = this;
    const size = w * h;
    const occupied = new Uint8Array(size);
    for (let c = 0; c < size; c++) if (this.stamp[c] !== 0) occupied[c] = 1;
    const tmp = new Uint8Array(size), a = new Uint8Array(size);
    morph3(occupied, w, h, true, tmp, a);
    morph3(a, w, h, false, tmp, occupied);
    const grown = morph3(occupied, w, h, true, tmp, a);
    const [multi] = contours().size([w, h]).thresholds([0.5])(grown as unknown as number[]);
    return multi.coordinates.map((poly) =>
      poly.map((ring): Ring => ring.slice(0, -1).map(([gx, gy]) => [r0 + gx * cell, z0 + gy * cell] as [number, number])),
    );
  }
}

/** Extent of a polygon set: largest and smallest |r| (0 when a boundary edge meets the axis), z range. */
function profileExtent(polygons: Polygon2[]): { maxReach: number; minReach: number; zMin: number; zMax: number } {
  let maxReach = 0, minReach = Infinity, zMin = Infinity, zMax = -Infinity;
  for (const poly of polygons) {
    for (const ring of poly) {
      for (let k = 0; k < ring.length; k++) {
        const [r, z] = ring[k];
        const [r2] = ring[(k + 1) % ring.length];
        maxReach = Math.max(maxReach, Math.abs(r));
        minReach = Math.min(minReach, r * r2 <= 0 ? 0 : Math.min(Math.abs(r), Math.abs(r2)));
        zMin = Math.min(zMin, z);
        zMax = Math.max(zMax, z);
      }
    }
  }
  return { maxReach, minReach: Number.isFinite(minReach) ? minReach : 0, zMin, zMax };
}

/**
 * Evaluates poses given as free-axis coordinates u ∈ [0,1]^k: axis values by linear
 * interpolation over each free axis' range (fixed axes stay at their value), the arm-frame point
 * from the point function, then (r, z) in the reach plane (step 2 of the method). Counts every
 * pose it draws and keeps those that assemble in its store.
 */
class JointSampler {
  readonly k: number;
  readonly store: SampleStore;
  /** Poses drawn so far, assembled or not. */
  drawn = 0;
  private readonly q: Float64Array;
  private readonly p = new Float64Array(3);
  private readonly cb: number;
  private readonly sb: number;

  constructor(
    private readonly pointFn: PointFn,
    private readonly axes: readonly AxisRange[],
    private readonly free: readonly number[],
    bearingDeg: number,
  ) {
    const bearing = (bearingDeg * Math.PI) / 180;
    this.cb = Math.cos(bearing);
    this.sb = Math.sin(bearing);
    this.k = free.length;
    this.q = Float64Array.from(axes, (ax) => ax.min);
    this.store = new SampleStore(this.k);
  }

  /** Draws pose u and stores its (r, z), side distance and u; true when it assembled. */
  evaluate(u: Float64Array): boolean {
    this.drawn++;
    if (!this.placePoint(u)) return false;
    const p = this.p;
    const x = this.cb * p[0] + this.sb * p[1];
    const y = -this.sb * p[0] + this.cb * p[1];
    const rho = Math.sqrt(x * x + y * y);
    this.store.add(x >= 0 ? rho : -rho, p[2], y, u);
    return true;
  }

  /** (r, z) of pose u, neither counted nor stored (for finite differences); null when it does not assemble. */
  profilePointOf(u: Float64Array): [number, number] | null {
    if (!this.placePoint(u)) return null;
    const p = this.p;
    const x = this.cb * p[0] + this.sb * p[1];
    const y = -this.sb * p[0] + this.cb * p[1];
    const rho = Math.sqrt(x * x + y * y);
    return [x >= 0 ? rho : -rho, p[2]];
  }

  /** Sets the free axes of q from u and writes the arm-frame point to p; false when the pose does not assemble. */
  private placePoint(u: Float64Array): boolean {
    for (let f = 0; f < this.k; f++) {
      const i = this.free[f];
      const ax = this.axes[i];
      this.q[i] = ax.min + u[f] * (ax.max - ax.min);
    }
    return this.pointFn(this.q, this.p);
  }
}

/** Throws a short message naming the argument when the axis ranges or the tolerance are unusable. */
function checkProfileInputs(axes: readonly AxisRange[], opts: SampleProfileOptions): void {
  if (axes.length === 0) throw new Error('axes: expected at least one axis range');
  axes.forEach((ax, i) => {
    if (!Number.isFinite(ax.min) || !Number.isFinite(ax.max) || ax.min > ax.max) throw new Error(`axes[${i}]: expected finite min ≤ max`);
  });
  if (opts.toleranceMm !== undefined && (!(opts.toleranceMm > 0) || !Number.isFinite(opts.toleranceMm))) {
    throw new Error('toleranceMm: expected a positive number');
  }
}

/** Indices of the axes that move (min < max); at most one per Halton base. */
function findFreeAxes(axes: readonly AxisRange[]): number[] {
  const free = axes.map((ax, i) => (ax.max > ax.min ? i : -1)).filter((i) => i >= 0);
  if (free.length > PRIMES.length) throw new Error(`axes: at most ${PRIMES.length} free axes`);
  return free;
}

/** Step 1a: draws the 2^k corners of the joint box. */
function sampleBoxCorners(sampler: JointSampler): void {
  const k = sampler.k;
  const u = new Float64Array(Math.max(k, 1));
  for (let mask = 0; mask < 1 << k; mask++) {
    for (let f = 0; f < k; f++) u[f] = (mask >> f) & 1;
    sampler.evaluate(u);
  }
}

/** Step 1b: draws Halton points of the joint box (past the origin, a corner) until `count` poses are drawn in all. */
function sweepJointBox(sampler: JointSampler, count: number): void {
  const halton = new HaltonSequence(sampler.k);
  const u = new Float64Array(sampler.k);
  halton.next(u);
  while (sampler.drawn < count) {
    halton.next(u);
    sampler.evaluate(u);
  }
}

/** Default stated tolerance, mm, from the first sweep's larger extent (r or z). */
function chooseTolerance(store: SampleStore): number {
  const extent = Math.max(store.rMax - store.rMin, store.zMax - store.zMin);
  return Math.max(MIN_DEFAULT_TOLERANCE_MM, Math.ceil((3 * extent) / DEFAULT_CELLS_ACROSS));
}

/**
 * Largest sensitivity |∂(r, z)/∂u| per free axis (mm per unit of the axis' range) by finite
 * differences over a few hundred stored samples.
 */
function measureSensitivities(sampler: JointSampler): Float64Array {
  const { store, k } = sampler;
  const h = 1e-4;
  const sens = new Float64Array(k);
  const uu = new Float64Array(k);
  const probes = Math.min(store.count, 256);
  const stride = Math.max(1, Math.floor(store.count / probes));
  for (let s = 0; s < store.count; s += stride) {
    for (let f = 0; f < k; f++) uu[f] = store.u[k * s + f];
    const base = sampler.profilePointOf(uu);
    if (!base) continue;
    for (let f = 0; f < k; f++) {
      const keep = uu[f];
      uu[f] = keep + (keep + h <= 1 ? h : -h);
      const moved = sampler.profilePointOf(uu);
      uu[f] = keep;
      if (!moved) continue;
      const d = Math.hypot(moved[0] - base[0], moved[1] - base[1]) / h;
      if (d > sens[f]) sens[f] = d;
    }
  }
  return sens;
}

/** Free-axis indices, most sensitive first (a stable sort: ties keep axis order). */
function rankAxes(sens: Float64Array): number[] {
  return Array.from({ length: sens.length }, (_, f) => f).sort((a, b) => sens[b] - sens[a]);
}

/** Step 3: draws the lattice sheets over the one or two lead axes, each filling the interior between its nodes. */
function sampleSheets(sampler: JointSampler, sens: Float64Array, cell: number, maxSamples: number): Sheet[] {
  const order = rankAxes(sens);
  const lead = order.slice(0, 2);
  const rest = order.slice(2);
  const nodeSpan = SHEET_NODE_CELLS * cell;
  const counts = lead.map((f) => Math.min(SHEET_MAX_NODES, Math.max(2, Math.ceil(sens[f] / nodeSpan) + 1)));
  const n0 = counts[0], n1 = counts[1] ?? 1;
  // The other axes sit at mid-range for the first sheet, at Halton points 1, 2, … for the next.
  const restSeq = rest.length > 0 ? new HaltonSequence(rest.length) : null;
  const restU = new Float64Array(Math.max(1, rest.length)).fill(0.5);
  const u = new Float64Array(sampler.k);
  const sheets: Sheet[] = [];
  for (let m = 0; m < (restSeq ? SHEETS : 1) && sampler.drawn + n0 * n1 <= maxSamples; m++) {
    if (m > 0 && restSeq) {
      restSeq.next(restU);
      if (m === 1) restSeq.next(restU); // past the origin (a corner of the box)
    }
    for (let r = 0; r < rest.length; r++) u[rest[r]] = restU[r];
    sheets.push(sampleSheet(sampler, u, lead, n0, n1));
  }
  return sheets;
}

/** Draws one n0 × n1 lattice over the lead axes (u holds the other axes' values). */
function sampleSheet(sampler: JointSampler, u: Float64Array, lead: readonly number[], n0: number, n1: number): Sheet {
  const nodes = new Int32Array(n0 * n1);
  for (let a = 0; a < n0; a++) {
    for (let b = 0; b < n1; b++) {
      u[lead[0]] = a / (n0 - 1);
      if (lead.length > 1) u[lead[1]] = b / (n1 - 1);
      nodes[a * n1 + b] = sampler.evaluate(u) ? sampler.store.count - 1 : -1;
    }
  }
  return { nodes, n0, n1 };
}

/** Joint step per free axis (fraction of its range) that moves the point by about 3 cells, at most the whole range. */
function childSteps(sens: Float64Array, cell: number): Float64Array {
  return sens.map((d) => (d > 0 ? Math.min(1, (3 * cell) / d) : 1));
}

/** What one refinement round found: newly occupied cells, whether one of them is isolated, whether a child fell off the grid. */
interface RoundResult {
  fresh: number[];
  escaped: boolean;
  offGrid: boolean;
}

/**
 * Step 4: refines the edge round after round; true when a round converged (no child isolated
 * from what was occupied before, none off the grid), false when the rounds, the frontier or
 * the sample budget ran out first.
 */
function refineEdge(sampler: JointSampler, raster: Raster, step: Float64Array, maxSamples: number): boolean {
  const offsets = new HaltonSequence(sampler.k);
  let frontier = raster.sampledEdgeCells();
  for (let round = 1; round <= MAX_ROUNDS && frontier.length > 0 && sampler.drawn < maxSamples; round++) {
    const { fresh, escaped, offGrid } = sampleChildren(sampler, raster, frontier, round + 1, step, offsets, maxSamples);
    if (!escaped && !offGrid) return true;
    if (offGrid) {
      raster.layOut(); // every stamp restarts at 1; the new frontier is the whole edge
      frontier = raster.sampledEdgeCells();
    } else {
      frontier = fresh.filter((c) => raster.onEdge(c));
    }
  }
  return false;
}

/** Draws k + 2 children around the sample of each frontier cell (offsets from the Halton sequence `offsets`) and marks them with `stamp`. */
function sampleChildren(
  sampler: JointSampler,
  raster: Raster,
  frontier: readonly number[],
  stamp: number,
  step: Float64Array,
  offsets: HaltonSequence,
  maxSamples: number,
): RoundResult {
  const { k, store } = sampler;
  const offset = new Float64Array(k);
  const child = new Float64Array(k);
  const childrenPerParent = k + 2;
  const result: RoundResult = { fresh: [], escaped: false, offGrid: false };
  for (const c of frontier) {
    const parent = raster.rep[c];
    for (let m = 0; m < childrenPerParent && sampler.drawn < maxSamples; m++) {
      offsets.next(offset);
      // store.u is read afresh each time: it is replaced when the store grows
      for (let f = 0; f < k; f++) {
        const v = store.u[k * parent + f] + (2 * offset[f] - 1) * step[f];
        child[f] = v < 0 ? 0 : v > 1 ? 1 : v;
      }
      if (!sampler.evaluate(child)) continue;
      const cellIndex = raster.mark(store.count - 1, stamp);
      if (cellIndex === -1) result.offGrid = true;
      if (cellIndex >= 0) {
        result.fresh.push(cellIndex);
        if (raster.isolated(cellIndex, stamp)) result.escaped = true;
      }
    }
  }
  return result;
}

/** Steps 3 and 4 for at least one free axis: sheets fill the interior, refinement finds the edge; true when refinement converged. */
function fillAndRefine(sampler: JointSampler, raster: Raster, maxSamples: number): boolean {
  const sens = measureSensitivities(sampler);
  const sheets = sampleSheets(sampler, sens, raster.cell, maxSamples);
  raster.layOut();
  for (const sheet of sheets) raster.addSheet(sheet);
  return refineEdge(sampler, raster, childSteps(sens, raster.cell), maxSamples);
}

/**
 * Sampled side reach profile of a point function over axis ranges (Halton sampling refined at
 * the region's edge, raster, morphological closing, d3-contour), arm-frame (r, z), mm. Hold J1
 * fixed (min = max) at the value whose reach-plane bearing is `opts.bearingDeg` (default 0).
 */
export function sampleProfile(pointFn: PointFn, axes: readonly AxisRange[], opts: SampleProfileOptions = {}): SampledReachProfile {
  checkProfileInputs(axes, opts);
  const free = findFreeAxes(axes);
  const k = free.length;
  const maxSamples = opts.maxSamples ?? DEFAULT_MAX_SAMPLES;
  const initial = Math.min(maxSamples, opts.initialSamples ?? DEFAULT_INITIAL[Math.min(k, DEFAULT_INITIAL.length - 1)]);
  const sampler = new JointSampler(pointFn, axes, free, opts.bearingDeg ?? 0);

  sampleBoxCorners(sampler);
  if (k > 0) sweepJointBox(sampler, initial);
  const { store } = sampler;
  if (store.count === 0) throw new Error('pointFn: no pose over the axis ranges assembles');
  const toleranceMm = opts.toleranceMm ?? chooseTolerance(store);
  const raster = new Raster(toleranceMm / 3, store);
  let converged = true;
  if (k === 0) raster.layOut();
  else converged = fillAndRefine(sampler, raster, maxSamples);

  const polygons = raster.trace();
  return {
    polygons,
    toleranceMm,
    method: 'sampled',
    ...profileExtent(polygons),
    cellMm: raster.cell,
    samples: sampler.drawn,
    assembled: store.count,
    converged,
    lateral: { min: store.yMin, mean: store.ySum / store.count, max: store.yMax },
  };
}
