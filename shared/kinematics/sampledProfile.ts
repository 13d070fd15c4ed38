/**
 * Sampled side reach profile: the region of the (r, z) half-plane swept by a point of an arm
 * when every axis but J1 moves over its range, found by sampling the joint space.
 *
 * Method (KINEMATICS.md, "chain"):
 * 1. sample the box of axis ranges with a Halton sequence (low-discrepancy; the radical inverse
 *    in the first primes is written here, with the 2^k corners of the box added first);
 * 2. map each sample to the arm frame and to (r, z): the point is turned by −bearing (the
 *    reach plane's bearing, 0 when J1 is held at kinematic 0), then ρ = √(x² + y²) and
 *    r = sign(x)·ρ (x ≥ 0 counts as +). Using ρ keeps the radial distance from the J1 axis exact
 *    when the point sits to one side of the plane through J1 (a lateral offset); the side
 *    distance y is reported as `lateral` (min / mean / max) so plan bands can turn their edges;
 * 3. raster the samples on cells of `cellMm`, close gaps with a 3×3 morphological closing
 *    (fills holes and slits up to two cells wide), grow by one cell (3×3 dilation) and trace the
 *    0.5 iso-line with d3-contour. A sample's whole cell then lies at least one cell inside the
 *    outline, so the polygon contains EVERY sample;
 * 4. sampling goes on in doubling batches until a batch lands entirely inside the grown raster
 *    of the samples before it (no new sample more than one cell beyond the closed raster),
 *    or `maxSamples` is reached (`converged: false`).
 *
 * Tolerance: the outline lies at most 3 cells outside the outermost samples (one cell of
 * growth, up to one of closing, half a cell of contouring, the sample's position in its cell,
 * diagonals included), so `toleranceMm = 3·cellMm`; inward, the stopping rule bounds how far
 * unsampled reach can lie beyond the outline by about one cell. Errs toward MORE reach.
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
  /** Stated tolerance of the outline, mm (default 15). The raster cell is a third of it. */
  toleranceMm?: number;
  /** Samples of the first batch (default 2048 · free axes, at least 4096). */
  initialSamples?: number;
  /** Upper bound on samples (default 400 000). */
  maxSamples?: number;
  /** Arm-frame bearing of the reach plane, degrees: points are turned by −bearing before r is taken (default 0). */
  bearingDeg?: number;
}

/** A sampled reach profile with what the sampling found. */
export interface SampledReachProfile extends ReachProfile {
  method: 'sampled';
  /** Raster cell edge, mm. */
  cellMm: number;
  /** Samples drawn (including the 2^k box corners) and how many of them assembled. */
  samples: number;
  assembled: number;
  /** True when the last batch landed inside the grown raster of the samples before it. */
  converged: boolean;
  /** Distance of the point to the side of the reach plane (turned-frame y), mm. */
  lateral: { min: number; mean: number; max: number };
}

/** The first 8 primes: Halton bases for up to 8 free axes. */
const PRIMES = [2, 3, 5, 7, 11, 13, 17, 19];

/** Radical inverse of `index` in `base` (van der Corput), the Halton coordinate: a value in [0, 1). */
export function radicalInverse(index: number, base: number): number {
  if (!Number.isInteger(index) || index < 0) throw new Error('index: expected a non-negative integer');
  if (!Number.isInteger(base) || base < 2) throw new Error('base: expected an integer ≥ 2');
  let result = 0;
  let f = 1 / base;
  let i = index;
  while (i > 0) {
    const digit = i % base;
    result += digit * f;
    i = (i - digit) / base;
    f /= base;
  }
  return result;
}

/**
 * Halton sequence in `dims` dimensions (bases 2, 3, 5, …), stepped incrementally: each call of
 * next() adds one to the index in every base's digits, amortised O(1) per coordinate.
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
      const uu = new Float64Array(this.u.length * 2);
      uu.set(this.u);
      this.u = uu;
    }
    this.rz[2 * this.count] = r;
    this.rz[2 * this.count + 1] = z;
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

const PAD_CELLS = 4;

/** 3×3 square dilation (max) or erosion (min) of a binary raster, as a row pass then a column pass. */
function morph3(src: Uint8Array, w: number, h: number, dilate: boolean, tmp: Uint8Array, out: Uint8Array): Uint8Array {
  for (let j = 0; j < h; j++) {
    const row = j * w;
    for (let i = 0; i < w; i++) {
      const c = src[row + i];
      const l = i > 0 ? src[row + i - 1] : c;
      const r = i < w - 1 ? src[row + i + 1] : c;
      tmp[row + i] = dilate ? c | l | r : c & l & r;
    }
  }
  for (let j = 0; j < h; j++) {
    const row = j * w;
    for (let i = 0; i < w; i++) {
      const c = tmp[row + i];
      const u = j > 0 ? tmp[row - w + i] : c;
      const d = j < h - 1 ? tmp[row + w + i] : c;
      out[row + i] = dilate ? c | u | d : c & u & d;
    }
  }
  return out;
}

/**
 * Raster of the samples on a padded grid of square cells: `marks` (sampled cells, with one
 * representative sample per cell), `closed` (3×3 closing of marks) and `grown` (closed + one cell).
 */
class Raster {
  r0 = 0;
  z0 = 0;
  w = 0;
  h = 0;
  marks = new Uint8Array(0);
  rep = new Int32Array(0);
  closed = new Uint8Array(0);
  grown = new Uint8Array(0);
  private tmp = new Uint8Array(0);
  private tmp2 = new Uint8Array(0);

  constructor(readonly cell: number, private readonly store: SampleStore) {}

  /** Lays the grid over the store's bounds with a margin and marks every sample. */
  layOut(): void {
    const { store, cell } = this;
    const margin = PAD_CELLS * cell + 0.1 * Math.max(store.rMax - store.rMin, store.zMax - store.zMin);
    this.r0 = store.rMin - margin;
    this.z0 = store.zMin - margin;
    this.w = Math.ceil((store.rMax - store.rMin + 2 * margin) / cell) + 1;
    this.h = Math.ceil((store.zMax - store.zMin + 2 * margin) / cell) + 1;
    const size = this.w * this.h;
    this.marks = new Uint8Array(size);
    this.rep = new Int32Array(size).fill(-1);
    this.closed = new Uint8Array(size);
    this.grown = new Uint8Array(size);
    this.tmp = new Uint8Array(size);
    this.tmp2 = new Uint8Array(size);
    for (let s = 0; s < store.count; s++) this.mark(s);
  }

  /** Cell index of (r, z), or −1 when it falls outside the grid or in its outer pad. */
  cellOf(r: number, z: number): number {
    const i = Math.floor((r - this.r0) / this.cell);
    const j = Math.floor((z - this.z0) / this.cell);
    if (i < PAD_CELLS || j < PAD_CELLS || i >= this.w - PAD_CELLS || j >= this.h - PAD_CELLS) return -1;
    return j * this.w + i;
  }

  /** Marks sample s; returns its cell, or −2 when the cell was already marked, −1 when off the grid. */
  mark(s: number): number {
    const c = this.cellOf(this.store.rz[2 * s], this.store.rz[2 * s + 1]);
    if (c < 0) return -1;
    const fresh = this.marks[c] === 0;
    this.marks[c] = 1;
    this.rep[c] = s;
    return fresh ? c : -2;
  }

  /** Recomputes closed (3×3 closing) and grown (one more 3×3 dilation). */
  update(): void {
    const { w, h } = this;
    morph3(this.marks, w, h, true, this.tmp, this.tmp2);
    morph3(this.tmp2, w, h, false, this.tmp, this.closed);
    morph3(this.closed, w, h, true, this.tmp, this.grown);
  }

  /** True when a marked cell touches an empty cell of the closed raster (an edge of the region or of a hole). */
  onEdge(c: number): boolean {
    const { w, closed } = this;
    return closed[c - 1] === 0 || closed[c + 1] === 0 || closed[c - w] === 0 || closed[c + w] === 0 ||
      closed[c - w - 1] === 0 || closed[c - w + 1] === 0 || closed[c + w - 1] === 0 || closed[c + w + 1] === 0;
  }

  /** Outline of the grown raster (d3-contour marching squares at 0.5), arm-frame (r, z) mm. */
  trace(): Polygon2[] {
    const { r0, z0, cell, w, h } = this;
    const [multi] = contours().size([w, h]).thresholds([0.5])(this.grown as unknown as number[]);
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
 * Sampled side reach profile of a point function over axis ranges (Halton sampling refined at
 * the region's edge, raster, morphological closing, d3-contour), arm-frame (r, z), mm. Hold J1
 * fixed (min = max) at the value whose reach-plane bearing is `opts.bearingDeg` (default 0).
 */
export function sampleProfile(pointFn: PointFn, axes: readonly AxisRange[], opts: SampleProfileOptions = {}): SampledReachProfile {
  if (axes.length === 0) throw new Error('axes: expected at least one axis range');
  axes.forEach((ax, i) => {
    if (!Number.isFinite(ax.min) || !Number.isFinite(ax.max) || ax.min > ax.max) throw new Error(`axes[${i}]: expected finite min ≤ max`);
  });
  const toleranceMm = opts.toleranceMm ?? DEFAULT_TOLERANCE_MM;
  if (!(toleranceMm > 0) || !Number.isFinite(toleranceMm)) throw new Error('toleranceMm: expected a positive number');
  const bearing = ((opts.bearingDeg ?? 0) * Math.PI) / 180;
  const cb = Math.cos(bearing), sb = Math.sin(bearing);
  const cell = toleranceMm / 3;
  const free = axes.map((ax, i) => (ax.max > ax.min ? i : -1)).filter((i) => i >= 0);
  const k = free.length;
  if (k > PRIMES.length) throw new Error(`axes: at most ${PRIMES.length} free axes`);
  const maxSamples = opts.maxSamples ?? 250_000;
  const initial = Math.min(maxSamples, opts.initialSamples ?? DEFAULT_INITIAL[Math.min(k, DEFAULT_INITIAL.length - 1)]);

  const q = Float64Array.from(axes, (ax) => ax.min);
  const u = new Float64Array(Math.max(k, 1));
  const p = new Float64Array(3);
  const store = new SampleStore(k);
  let drawn = 0;

  /** Evaluates the pose u (free-axis coordinates in [0,1]); true when it assembled and was stored. */
  const evaluate = (uu: Float64Array): boolean => {
    drawn++;
    for (let f = 0; f < k; f++) {
      const ax = axes[free[f]];
      q[free[f]] = ax.min + uu[f] * (ax.max - ax.min);
    }
    if (!pointFn(q, p)) return false;
    const x = cb * p[0] + sb * p[1];
    const y = -sb * p[0] + cb * p[1];
    const rho = Math.sqrt(x * x + y * y);
    store.add(x >= 0 ? rho : -rho, p[2], y, uu);
    return true;
  };

  // 1. the corners of the joint box, then a Halton sweep of the whole box
  for (let mask = 0; mask < 1 << k; mask++) {
    for (let f = 0; f < k; f++) u[f] = (mask >> f) & 1;
    evaluate(u);
  }
  const halton = k > 0 ? new HaltonSequence(k) : null;
  if (halton) {
    halton.next(u); // skip the origin, already a corner
    while (drawn < initial) {
      halton.next(u);
      evaluate(u);
    }
  }
  if (store.count === 0) throw new Error('pointFn: no pose over the axis ranges assembles');

  // 2. refine at the edge: children of edge samples within a joint step that moves the point ≈ 3 cells
  const raster = new Raster(cell, store);
  raster.layOut();
  raster.update();
  let converged = k === 0;
  if (halton) {
    const step = jointSteps(store, k, 3 * cell, evaluateAt(pointFn, axes, free, q, p, cb, sb));
    const offsets = new HaltonSequence(k);
    const child = new Float64Array(k);
    const childrenPerParent = 2 * k + 2;
    let frontier: number[] = [];
    for (let c = 0; c < raster.marks.length; c++) if (raster.marks[c] && raster.onEdge(c)) frontier.push(c);
    for (let round = 0; round < MAX_ROUNDS && frontier.length > 0 && drawn < maxSamples; round++) {
      const fresh: number[] = [];
      let escaped = false;
      let relayout = false;
      for (const c of frontier) {
        const parent = raster.rep[c];
        for (let m = 0; m < childrenPerParent && drawn < maxSamples; m++) {
          offsets.next(u);
          for (let f = 0; f < k; f++) {
            const v = store.u[k * parent + f] + (2 * u[f] - 1) * step[f];
            child[f] = v < 0 ? 0 : v > 1 ? 1 : v;
          }
          if (!evaluate(child)) continue;
          const s = store.count - 1;
          const cellIndex = raster.cellOf(store.rz[2 * s], store.rz[2 * s + 1]);
          if (cellIndex < 0) {
            relayout = true;
            escaped = true;
            continue;
          }
          if (!raster.grown[cellIndex]) escaped = true;
          if (raster.mark(s) >= 0) fresh.push(cellIndex);
        }
      }
      if (relayout) raster.layOut();
      raster.update();
      if (!escaped) {
        converged = true;
        break;
      }
      frontier = relayout
        ? Array.from(raster.marks.keys()).filter((c) => raster.marks[c] && raster.onEdge(c))
        : fresh.filter((c) => raster.onEdge(c));
    }
  }

  const polygons = raster.trace();
  return {
    polygons,
    toleranceMm,
    method: 'sampled',
    ...profileExtent(polygons),
    cellMm: cell,
    samples: drawn,
    assembled: store.count,
    converged,
    lateral: { min: store.yMin, mean: store.ySum / store.count, max: store.yMax },
  };
}

const DEFAULT_TOLERANCE_MM = 15;
/** First-sweep sample counts by number of free axes (0 … 8). */
const DEFAULT_INITIAL = [1, 512, 2048, 8192, 16384, 24576, 32768, 32768, 32768];
const MAX_ROUNDS = 60;

/** (r, z) of pose u ∈ [0,1]^k, or null when it does not assemble (used for finite differences). */
function evaluateAt(pointFn: PointFn, axes: readonly AxisRange[], free: number[], q: Float64Array, p: Float64Array, cb: number, sb: number) {
  return (uu: Float64Array): [number, number] | null => {
    for (let f = 0; f < free.length; f++) {
      const ax = axes[free[f]];
      q[free[f]] = ax.min + uu[f] * (ax.max - ax.min);
    }
    if (!pointFn(q, p)) return null;
    const x = cb * p[0] + sb * p[1];
    const y = -sb * p[0] + cb * p[1];
    const rho = Math.sqrt(x * x + y * y);
    return [x >= 0 ? rho : -rho, p[2]];
  };
}

/**
 * Step per free axis (in [0,1] units) that moves the (r, z) point by about `targetMm`: the largest
 * finite-difference sensitivity over a few hundred stored samples, so a step never moves the point
 * by much more than the target.
 */
function jointSteps(store: SampleStore, k: number, targetMm: number, at: (uu: Float64Array) => [number, number] | null): Float64Array {
  const h = 1e-4;
  const sens = new Float64Array(k);
  const uu = new Float64Array(k);
  const probes = Math.min(store.count, 256);
  const stride = Math.max(1, Math.floor(store.count / probes));
  for (let s = 0; s < store.count; s += stride) {
    for (let f = 0; f < k; f++) uu[f] = store.u[k * s + f];
    const base = at(uu);
    if (!base) continue;
    for (let f = 0; f < k; f++) {
      const keep = uu[f];
      uu[f] = keep + (keep + h <= 1 ? h : -h);
      const moved = at(uu);
      uu[f] = keep;
      if (!moved) continue;
      const d = Math.hypot(moved[0] - base[0], moved[1] - base[1]) / h;
      if (d > sens[f]) sens[f] = d;
    }
  }
  return sens.map((d) => (d > 0 ? Math.min(1, targetMm / d) : 1));
}
