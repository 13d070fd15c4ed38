import { DxfImportError } from './errors';
import { pushArc, pushBulge, pushEllipse, type CurveStats } from './curves';
import { describeEntity, type EntityRef, type PlanBuilder } from './planBuilder';
import { bsplineBreaks, bsplineProblem, catmullRom, clampedUniformKnots, deBoor, pushAdaptive, type BSpline } from './spline';
import { compose, ocsToWcs, type Affine } from './transform';

type Loose = Record<string, unknown>;
type P3 = [number, number, number];

/** Where an entity is drawn: map to plan mm, chord tolerance in the entity's units, layer. */
export interface DrawContext {
  m: Affine;
  /** Chord tolerance in local units (plan tolerance / plan scale of m). */
  tol: number;
  /** The layer the entity lands on (layer-0 entities of a block take the INSERT's layer). */
  layer: string;
  block?: string;
  curves: CurveStats;
}

const TWO_PI = 2 * Math.PI;

export function entityRef(e: Loose, block?: string): EntityRef {
  return { type: String(e.type), handle: typeof e.handle === 'string' ? e.handle : undefined, block };
}

function badValue(ref: EntityRef, what: string): never {
  throw new DxfImportError(
    'bad-coordinates',
    `The file holds ${describeEntity(ref)} whose ${what} is not a finite number. Check the drawing and export it again.`,
  );
}

/** A numeric field: `dflt` when absent; a present value must be a finite number. */
export function num(e: Loose, key: string, dflt: number, ref: EntityRef): number {
  const v = e[key];
  if (v === undefined || v === null) return dflt;
  if (typeof v !== 'number' || !Number.isFinite(v)) badValue(ref, key);
  return v;
}

/** A point field as [x, y, z]; undefined when absent; present coordinates must be finite. */
export function pt(v: unknown, ref: EntityRef, what: string): P3 | undefined {
  if (v === undefined || v === null || typeof v !== 'object') return undefined;
  const p = v as { x?: unknown; y?: unknown; z?: unknown };
  if (p.x === undefined || p.y === undefined) return undefined;
  const z = p.z === undefined ? 0 : p.z;
  if (typeof p.x !== 'number' || typeof p.y !== 'number' || typeof z !== 'number') badValue(ref, what);
  if (!Number.isFinite(p.x) || !Number.isFinite(p.y) || !Number.isFinite(z)) badValue(ref, what);
  return [p.x, p.y, z];
}

/** Extrusion direction from separate X/Y/Z fields (dxf-parser's ARC, LWPOLYLINE and ours). */
function extrusionXYZ(e: Loose, ref: EntityRef): Affine | null {
  if (e.extrusionDirectionX === undefined && e.extrusionDirectionY === undefined && e.extrusionDirectionZ === undefined) {
    return null;
  }
  return ocsToWcs(
    num(e, 'extrusionDirectionX', 0, ref),
    num(e, 'extrusionDirectionY', 0, ref),
    num(e, 'extrusionDirectionZ', 1, ref),
  );
}

/** Extrusion direction from a point field (dxf-parser's POLYLINE, SOLID, INSERT). */
export function extrusionPoint(v: unknown, ref: EntityRef): Affine | null {
  const p = pt(v, ref, 'extrusion direction');
  return p ? ocsToWcs(p[0], p[1], p[2]) : null;
}

function withOcs(ctx: DrawContext, ocs: Affine | null): Affine {
  return ocs ? compose(ctx.m, ocs) : ctx.m;
}

/** Angle sweep from a to b counter-clockwise, in (0, 2π]; 0 when a and b coincide. */
function ccwSweep(a: number, b: number): number {
  let s = (b - a) % TWO_PI;
  if (s < 0) s += TWO_PI;
  return s;
}

/**
 * The special characters of TEXT and MTEXT (DXF reference, "Control codes and special
 * characters"): %%c ⌀, %%d °, %%p ±, %%nnn the character of that number, %%% a percent sign;
 * the underline/overline/strike toggles %%u, %%o, %%k are dropped. \U+XXXX is the Unicode
 * character XXXX.
 */
function specialChars(s: string): string {
  return s
    .replace(/%%(\d{3})/g, (_m, n: string) => String.fromCharCode(Number(n)))
    .replace(/%%[cC]/g, '⌀')
    .replace(/%%[dD]/g, '°')
    .replace(/%%[pP]/g, '±')
    .replace(/%%[uUoOkK]/g, '')
    .replace(/%%%/g, '%')
    .replace(/\\U\+([0-9A-Fa-f]{4})/g, (_m, h: string) => String.fromCodePoint(Number.parseInt(h, 16)));
}

/** Codes of MTEXT that take a value up to ";" and only format: paragraph, font, height, colour, … */
const MTEXT_VALUE_CODES = new Set(['p', 'A', 'a', 'C', 'c', 'F', 'f', 'H', 'h', 'Q', 'q', 'T', 't', 'W', 'w']);
/** Codes of MTEXT that toggle a style and take no value. */
const MTEXT_TOGGLES = new Set(['L', 'l', 'O', 'o', 'K', 'k']);

/**
 * Plain text of an MTEXT string (DXF reference, MTEXT inline codes): \P (and \X, \N) break
 * the line, \~ is a non-breaking space, stacked fractions \Sa/b; \Sa#b; \Sa^b; read "a/b" (a
 * one-sided stack reads as its one part), formatting codes (\p…; \f…; \H…; \C…; …) and
 * grouping braces are dropped, \\ \{ \} are the characters themselves.
 */
export function mtextPlain(s: string): string {
  let out = '';
  const n = s.length;
  let i = 0;
  while (i < n) {
    const c = s[i];
    if (c === '{' || c === '}') {
      i++;
      continue;
    }
    if (c !== '\\' || i + 1 >= n) {
      out += c;
      i++;
      continue;
    }
    const k = s[i + 1];
    i += 2;
    if (k === 'P' || k === 'X' || k === 'N') out += '\n';
    else if (k === '~') out += '\u00a0';
    else if (MTEXT_TOGGLES.has(k)) continue;
    else if (MTEXT_VALUE_CODES.has(k)) {
      const end = s.indexOf(';', i);
      i = end === -1 ? n : end + 1;
    } else if (k === 'S') {
      let end = i;
      while (end < n && s[end] !== ';') end += s[end] === '\\' ? 2 : 1;
      const body = s.slice(i, end).replace(/\\(.)/g, '$1');
      i = end + 1;
      const m = /^(.*?)[\^#/](.*)$/.exec(body);
      const top = (m ? m[1] : body).trim();
      const bottom = (m ? m[2] : '').trim();
      out += top && bottom ? `${top}/${bottom}` : top || bottom;
    } else if (k === 'U' && s[i] === '+') {
      out += '\\U';
    } else if (k === 'M' && s[i] === '+') {
      i = Math.min(n, i + 6); // \M+nXXXX: a character in an Asian code page, not shown
    } else out += k;
  }
  return specialChars(out).trim();
}

/** Plain text of a TEXT string: special characters (%%c, %%d, %%p, %%nnn, \U+XXXX) as what they mean. */
function textPlain(s: string): string {
  return specialChars(s).trim();
}

/** Points of a polyline with bulges (x, y, bulge per vertex) in its OCS at height z. */
function bulgedPolyline(vs: Array<[number, number, number]>, closed: boolean, z: number, ctx: DrawContext): number[] {
  const out: number[] = [vs[0][0], vs[0][1], z];
  const n = vs.length;
  const last = closed ? n : n - 1;
  for (let i = 0; i < last; i++) {
    const a = vs[i];
    const b = vs[(i + 1) % n];
    pushBulge(out, a[0], a[1], b[0], b[1], a[2], z, ctx.tol, ctx.curves);
  }
  return out;
}

/**
 * What a handler makes of one entity: a path (x, y, z triples in the frame `m` maps to plan mm;
 * `note` is counted as a skip reason although the path is drawn), a label, or why it is skipped.
 */
type Drawing =
  | { kind: 'path'; closed: boolean; pts: number[]; m: Affine; note?: string }
  | { kind: 'label'; text: string; at: P3; dir: P3; up: P3; m: Affine }
  | { kind: 'skip'; reason: string };

/** Reads one entity of its type; throws 'bad-coordinates' for a present field that is not finite. */
type EntityHandler = (e: Loose, ctx: DrawContext, ref: EntityRef) => Drawing;

const skipped = (reason: string): Drawing => ({ kind: 'skip', reason });

function path(closed: boolean, pts: number[], m: Affine, note?: string): Drawing {
  return { kind: 'path', closed, pts, m, note };
}

/** (x, y, bulge) of each vertex with a position, in file order. */
function bulgeVertices(vertices: readonly unknown[], ref: EntityRef): Array<[number, number, number]> {
  const vs: Array<[number, number, number]> = [];
  for (const v of vertices) {
    const p = pt(v, ref, 'vertex');
    if (!p) continue;
    vs.push([p[0], p[1], num(v as Loose, 'bulge', 0, ref)]);
  }
  return vs;
}

/** The points of a list field that hold a position, in file order. */
function points(list: unknown, ref: EntityRef, what: string): P3[] {
  const ps: P3[] = [];
  for (const v of Array.isArray(list) ? list : []) {
    const p = pt(v, ref, what);
    if (p) ps.push(p);
  }
  return ps;
}

function lineDrawing(e: Loose, ctx: DrawContext, ref: EntityRef): Drawing {
  const vs = Array.isArray(e.vertices) ? e.vertices : [];
  const p = pt(vs[0], ref, 'start point');
  const q = pt(vs[1], ref, 'end point');
  if (!p || !q) return skipped('incomplete');
  return path(false, [p[0], p[1], p[2], q[0], q[1], q[2]], ctx.m);
}

/** LWPOLYLINE: 2-D vertices with bulges at one elevation, in the OCS of its extrusion direction. */
function lwPolylineDrawing(e: Loose, ctx: DrawContext, ref: EntityRef): Drawing {
  const vs = bulgeVertices(Array.isArray(e.vertices) ? e.vertices : [], ref);
  if (vs.length < 2) return skipped('incomplete');
  const z = num(e, 'elevation', 0, ref);
  const closed = e.shape === true;
  const pts = bulgedPolyline(vs, closed, z, ctx);
  return path(closed, pts, withOcs(ctx, extrusionXYZ(e, ref)));
}

/** POLYLINE: a 3-D polyline in world coordinates, or a 2-D one with bulges in its OCS; meshes are not drawn. */
function polylineDrawing(e: Loose, ctx: DrawContext, ref: EntityRef): Drawing {
  if (e.is3dPolygonMesh === true || e.isPolyfaceMesh === true) return skipped('mesh, not supported');
  const closed = e.shape === true;
  const raw = (Array.isArray(e.vertices) ? e.vertices : []).filter((v: Loose) => v && v.splineControlPoint !== true);
  if (e.is3dPolyline === true) {
    const pts = points(raw, ref, 'vertex').flat();
    if (pts.length < 6) return skipped('incomplete');
    return path(closed, pts, ctx.m);
  }
  const vs: Array<[number, number, number]> = [];
  let z = 0;
  for (const v of raw) {
    const p = pt(v, ref, 'vertex');
    if (!p) continue;
    z = p[2];
    vs.push([p[0], p[1], num(v as Loose, 'bulge', 0, ref)]);
  }
  if (vs.length < 2) return skipped('incomplete');
  const pts = bulgedPolyline(vs, closed, z, ctx);
  return path(closed, pts, withOcs(ctx, extrusionPoint(e.extrusionDirection, ref)));
}

/** Centre and radius of an ARC or CIRCLE, or why it cannot be drawn. */
function readCircle(e: Loose, ref: EntityRef): { c: P3; r: number } | Drawing {
  const c = pt(e.center, ref, 'centre');
  const r = num(e, 'radius', Number.NaN, ref);
  if (!c || Number.isNaN(r)) return skipped('incomplete');
  if (!(r > 0)) return skipped('zero size');
  return { c, r };
}

function circleDrawing(e: Loose, ctx: DrawContext, ref: EntityRef): Drawing {
  const circle = readCircle(e, ref);
  if ('kind' in circle) return circle;
  const { c, r } = circle;
  const m = withOcs(ctx, extrusionXYZ(e, ref));
  const out: number[] = [];
  pushArc(out, c[0], c[1], r, 0, TWO_PI, c[2], ctx.tol, true, ctx.curves);
  return path(true, out, m);
}

/** ARC: counter-clockwise from the start angle to the end angle (radians in dxf-parser's output). */
function arcDrawing(e: Loose, ctx: DrawContext, ref: EntityRef): Drawing {
  const circle = readCircle(e, ref);
  if ('kind' in circle) return circle;
  const { c, r } = circle;
  const m = withOcs(ctx, extrusionXYZ(e, ref));
  const a0 = num(e, 'startAngle', 0, ref);
  const sweep = ccwSweep(a0, num(e, 'endAngle', TWO_PI, ref));
  if (sweep < 1e-12) return skipped('zero size');
  const out: number[] = [];
  pushArc(out, c[0], c[1], r, a0, sweep, c[2], ctx.tol, true, ctx.curves);
  return path(false, out, m);
}

/** ELLIPSE: centre and major axis in world coordinates, minor axis from the ratio and the normal. */
function ellipseDrawing(e: Loose, ctx: DrawContext, ref: EntityRef): Drawing {
  const c = pt(e.center, ref, 'centre');
  const u = pt(e.majorAxisEndPoint, ref, 'major axis');
  if (!c || !u) return skipped('incomplete');
  const k = num(e, 'axisRatio', 1, ref);
  const nx = num(e, 'extrusionDirectionX', 0, ref);
  const ny = num(e, 'extrusionDirectionY', 0, ref);
  const nz = num(e, 'extrusionDirectionZ', 1, ref);
  const nl = Math.hypot(nx, ny, nz) || 1;
  // minor half-axis: ratio · (N × major), N the unit normal of the ellipse's plane
  const v: P3 = [
    (k * (ny * u[2] - nz * u[1])) / nl,
    (k * (nz * u[0] - nx * u[2])) / nl,
    (k * (nx * u[1] - ny * u[0])) / nl,
  ];
  const t0 = num(e, 'startAngle', 0, ref);
  const t1 = num(e, 'endAngle', TWO_PI, ref);
  let sweep = ccwSweep(t0, t1);
  const full = sweep < 1e-9 || Math.abs(sweep - TWO_PI) < 1e-9 || Math.abs(t1 - t0) >= TWO_PI - 1e-9;
  if (full) sweep = TWO_PI;
  if (!(Math.hypot(u[0], u[1], u[2]) > 0)) return skipped('zero size');
  const out: number[] = [];
  pushEllipse(out, c, u, v, full ? 0 : t0, sweep, ctx.tol, ctx.curves);
  return path(full, out, ctx.m);
}

/** The finite numbers of a list field; throws 'bad-coordinates' naming `what` for any other value. */
function finiteList(list: unknown, ref: EntityRef, what: string): number[] {
  return (Array.isArray(list) ? list : []).map((x: unknown) => {
    if (typeof x !== 'number' || !Number.isFinite(x)) badValue(ref, what);
    return x;
  });
}

/**
 * SPLINE: the B-spline of its control points, knots and weights; knots that do not fit are
 * rebuilt (clamped uniform, noted) when there are no fit points, else the fit points are drawn
 * as a Catmull-Rom curve.
 */
function splineDrawing(e: Loose, ctx: DrawContext, ref: EntityRef): Drawing {
  const ctrl = points(e.controlPoints, ref, 'control point');
  const fit = points(e.fitPoints, ref, 'fit point');
  const knots = finiteList(e.knotValues, ref, 'knot');
  const weights = finiteList(e.weights, ref, 'weight');
  const degree = num(e, 'degreeOfSplineCurve', 3, ref);
  const closedFlag = e.closed === true || e.periodic === true;
  const out: number[] = [];
  let note: string | undefined;
  let spline: BSpline | null = null;
  if (ctrl.length >= 2) {
    spline = { degree, knots, points: ctrl };
    if (weights.length === ctrl.length && weights.every((w) => w > 0)) spline.weights = weights;
    const problem = bsplineProblem(spline);
    if (problem === 'knots' && Number.isInteger(degree) && degree >= 1 && degree <= 11 && ctrl.length >= degree + 1) {
      if (fit.length < 2) {
        spline.knots = clampedUniformKnots(ctrl.length, degree);
        note = 'knots rebuilt, drawn approximately';
      } else spline = null;
    } else if (problem) spline = null;
  }
  if (spline) {
    const s = spline;
    pushAdaptive(out, (t) => deBoor(s, t), bsplineBreaks(s), ctx.tol, true, ctx.curves);
  } else if (fit.length >= 2) {
    const pts = fit.filter((p, i) => i === 0 || p[0] !== fit[i - 1][0] || p[1] !== fit[i - 1][1] || p[2] !== fit[i - 1][2]);
    if (pts.length < 2) return skipped('zero size');
    const closedFit = closedFlag && pts.length >= 3;
    const { f, segments } = catmullRom(pts, closedFit);
    const breaks: number[] = [];
    for (let i = 0; i <= segments; i++) breaks.push(i);
    pushAdaptive(out, f, breaks, ctx.tol, true, ctx.curves);
  } else {
    return skipped('unreadable');
  }
  // An unflagged spline whose ends meet is closed later, by the joining of chains.
  return path(closedFlag, out, ctx.m, note);
}

/** SOLID: three or four corners in its OCS; the corners run 1, 2, 4, 3 around the outline (DXF reference). */
function solidDrawing(e: Loose, ctx: DrawContext, ref: EntityRef): Drawing {
  const ps = points(e.points, ref, 'corner');
  if (ps.length < 3) return skipped('incomplete');
  const ring = ps.length >= 4 ? [ps[0], ps[1], ps[3], ps[2]] : ps;
  return path(true, ring.flat(), withOcs(ctx, extrusionPoint(e.extrusionDirection, ref)));
}

/** 3DFACE: three or four corners in world coordinates, in order around the outline. */
function faceDrawing(e: Loose, ctx: DrawContext, ref: EntityRef): Drawing {
  const ps = points(e.vertices, ref, 'corner');
  if (ps.length < 3) return skipped('incomplete');
  return path(true, ps.flat(), ctx.m);
}

/** TEXT: at its alignment point when aligned, else its insertion point; rotation in degrees, in its OCS. */
function textDrawing(e: Loose, ctx: DrawContext, ref: EntityRef): Drawing {
  const aligned = num(e, 'halign', 0, ref) !== 0 || num(e, 'valign', 0, ref) !== 0;
  const p = (aligned ? pt(e.endPoint, ref, 'alignment point') : undefined) ?? pt(e.startPoint, ref, 'insertion point');
  const text = typeof e.text === 'string' ? textPlain(e.text) : '';
  if (!p) return skipped('incomplete');
  if (text === '') return skipped('empty');
  const h = num(e, 'textHeight', 0, ref);
  const r = (num(e, 'rotation', 0, ref) * Math.PI) / 180;
  const m = withOcs(ctx, extrusionXYZ(e, ref));
  return { kind: 'label', text, at: p, dir: [Math.cos(r), Math.sin(r), 0], up: [-Math.sin(r) * h, Math.cos(r) * h, 0], m };
}

/** MTEXT: formatting codes dropped; the x-axis direction (group 11, WCS) wins over the rotation (group 50, radians). */
function mtextDrawing(e: Loose, ctx: DrawContext, ref: EntityRef): Drawing {
  const p = pt(e.position, ref, 'insertion point');
  const text = typeof e.text === 'string' ? mtextPlain(e.text) : '';
  if (!p) return skipped('incomplete');
  if (text === '') return skipped('empty');
  const h = num(e, 'height', 0, ref);
  let d = pt(e.directionVector, ref, 'direction');
  if (!d || Math.hypot(d[0], d[1], d[2]) === 0) {
    const r = num(e, 'rotation', 0, ref);
    d = [Math.cos(r), Math.sin(r), 0];
  }
  const dl = Math.hypot(d[0], d[1], d[2]);
  const dir: P3 = [d[0] / dl, d[1] / dl, d[2] / dl];
  return { kind: 'label', text, at: p, dir, up: [-dir[1] * h, dir[0] * h, 0], m: ctx.m };
}

/** The handler of each entity type this module draws (INSERT is placed by blocks.ts). */
const ENTITY_HANDLERS: ReadonlyMap<string, EntityHandler> = new Map([
  ['LINE', lineDrawing],
  ['LWPOLYLINE', lwPolylineDrawing],
  ['POLYLINE', polylineDrawing],
  ['ARC', arcDrawing],
  ['CIRCLE', circleDrawing],
  ['ELLIPSE', ellipseDrawing],
  ['SPLINE', splineDrawing],
  ['SOLID', solidDrawing],
  ['3DFACE', faceDrawing],
  ['TEXT', textDrawing],
  ['MTEXT', mtextDrawing],
]);

/**
 * Draws one non-INSERT entity into the builder through the handler of its type: lines and
 * polylines (bulges as arcs), arcs, circles, ellipses, splines, solids and faces as paths; TEXT
 * and MTEXT as labels. OCS entities are carried to world coordinates by their extrusion
 * direction first. Every entity not drawn is counted here, by type and reason ("not supported"
 * for a type without a handler).
 */
export function drawEntity(e: Loose, ctx: DrawContext, b: PlanBuilder): void {
  const type = String(e.type);
  const handler = ENTITY_HANDLERS.get(type);
  if (!handler) {
    b.skip(type, 'not supported');
    return;
  }
  const ref = entityRef(e, ctx.block);
  const d = handler(e, ctx, ref);
  if (d.kind === 'skip') {
    b.skip(type, d.reason);
  } else if (d.kind === 'label') {
    b.label(ref, ctx.layer, d.text, d.at, d.dir, d.up, d.m);
  } else {
    if (d.note) b.skip(type, d.note);
    b.path(ref, ctx.layer, d.closed, d.pts, d.m);
  }
}
