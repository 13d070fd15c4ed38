import { COUNTED_ONLY_TYPES } from './parse';

/**
 * The ENTITIES section read straight off the text, one entity at a time, into the same loose
 * objects dxf-parser (with this module's extra handlers, parse.ts) makes of it: no array of
 * lines, no object per group, values parsed only where an entity needs them. Used on text that
 * scanGroups has checked (every group code a whole number, LWPOLYLINE and POLYLINE shapes
 * sound). Anything the parser would refuse or read in a way not followed here throws
 * StreamBail, and the caller reads the section with dxf-parser instead (its own messages).
 */
export class StreamBail extends Error {
  constructor(why: string) {
    super(why);
    this.name = 'StreamBail';
  }
}

type Loose = Record<string, unknown>;
interface Point {
  x: number;
  y: number;
  z?: number;
}

/** Exact powers of ten (every one up to 1e22 is a float64 exactly). */
const POW10 = [1, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15, 1e16, 1e17, 1e18, 1e19, 1e20, 1e21, 1e22];

const isBlank = (c: number) => c === 32 || c === 9;

/**
 * A cursor over group-code/value pairs ("\n" line ends, see sniffDxf) that keeps where the last
 * groups began, so that it can step back as dxf-parser's scanner does.
 */
export class GroupReader {
  /** Code of the group read last, and where its value line lies (untrimmed). */
  code = 0;
  private vs = 0;
  private ve = 0;
  /** Where the next group begins. */
  pos: number;
  /** Start of the group read last. */
  at = 0;
  private readonly starts = new Float64Array(4);
  private count = 0;

  constructor(private readonly text: string, from: number) {
    this.pos = from;
  }

  /** Reads the next group; returns its code. */
  next(): number {
    const t = this.text;
    const p = this.pos;
    const codeEnd = t.indexOf('\n', p);
    if (codeEnd === -1) throw new StreamBail('end of text inside the ENTITIES section');
    let i = p;
    while (isBlank(t.charCodeAt(i))) i++;
    let neg = false;
    if (t.charCodeAt(i) === 45) {
      neg = true;
      i++;
    }
    let code = 0;
    for (let c = t.charCodeAt(i); c >= 48 && c <= 57; c = t.charCodeAt(++i)) code = code * 10 + (c - 48);
    const valueStart = codeEnd + 1;
    let valueEnd = t.indexOf('\n', valueStart);
    if (valueEnd === -1) valueEnd = t.length;
    this.code = neg ? -code : code;
    this.vs = valueStart;
    this.ve = valueEnd;
    this.at = p;
    this.starts[this.count++ & 3] = p;
    this.pos = valueEnd + 1;
    return this.code;
  }

  /** Steps back `n` groups (at most 3): the next read gives the group read `n` reads ago. */
  rewind(n = 1): void {
    this.count -= n;
    this.pos = this.starts[this.count & 3];
  }

  /** The value trimmed, as a string (dxf-parser's value of codes 0–9 and other text groups). */
  str(): string {
    return this.text.slice(this.vs, this.ve).trim();
  }

  /** True when the value is `s` (after trimming), without making a string. */
  is(s: string): boolean {
    const t = this.text;
    let a = this.vs;
    let b = this.ve;
    while (a < b && isBlank(t.charCodeAt(a))) a++;
    while (b > a && isBlank(t.charCodeAt(b - 1))) b--;
    if (b - a !== s.length) return b - a > s.length && this.str() === s; // other blanks: compare trimmed
    return t.startsWith(s, a);
  }

  /** Digits read by lead(): their value and count, the sign, and where they end. */
  private m = 0;
  private digits = 0;
  private neg = false;
  private i = 0;

  /** Reads blanks, a sign and digits from the start of the value (see the fields above); returns the code of the character after them. */
  private lead(): number {
    const t = this.text;
    let i = this.vs;
    while (i < this.ve && isBlank(t.charCodeAt(i))) i++;
    let c = t.charCodeAt(i);
    this.neg = c === 45;
    if (c === 45 || c === 43) c = t.charCodeAt(++i);
    let m = 0;
    let digits = 0;
    while (c >= 48 && c <= 57) {
      m = m * 10 + (c - 48);
      digits++;
      c = t.charCodeAt(++i);
    }
    this.m = m;
    this.digits = digits;
    this.i = i;
    return c;
  }

  /** True when only blanks follow position this.i (whose character is c) up to the end of the value. */
  private blankToEnd(c: number): boolean {
    const t = this.text;
    let i = this.i;
    while (i < this.ve && isBlank(c)) c = t.charCodeAt(++i);
    return i === this.ve;
  }

  /**
   * The value as parseFloat reads it (codes 10–59, 110–149, 210–239, …). Plain decimals of up to
   * 15 digits are read here: digits / 10^decimals is then one correctly rounded division of two
   * exact float64 values, the same number parseFloat gives; anything else goes to parseFloat.
   */
  float(): number {
    const t = this.text;
    let c = this.lead();
    let m = this.m;
    let decimals = 0;
    if (c === 46) {
      let i = this.i;
      c = t.charCodeAt(++i);
      while (c >= 48 && c <= 57) {
        m = m * 10 + (c - 48);
        decimals++;
        c = t.charCodeAt(++i);
      }
      this.i = i;
    }
    const n = this.digits + decimals;
    if (n === 0 || n > 15 || !this.blankToEnd(c)) return Number.parseFloat(t.slice(this.vs, this.ve));
    const v = decimals === 0 ? m : m / POW10[decimals];
    return this.neg ? -v : v;
  }

  /** The value as parseInt reads it (codes 60–99, 160–179, 270–289, …). */
  int(): number {
    const c = this.lead();
    if (this.digits === 0 || this.digits > 15 || !this.blankToEnd(c)) return Number.parseInt(this.text.slice(this.vs, this.ve));
    return this.neg ? -this.m : this.m;
  }
}

/** dxf-parser's point: x from the group just read, y from the next (which must be code + 10), z when the one after is code + 20. */
function readPoint(r: GroupReader): Point {
  const code = r.code;
  const p: Point = { x: r.float(), y: Number.NaN };
  if (r.next() !== code + 10) throw new StreamBail('point without its y');
  p.y = r.float();
  if (r.next() !== code + 20) {
    r.rewind();
    return p;
  }
  p.z = r.float();
  return p;
}

/** The groups every entity shares, as dxf-parser reads them (only those the import uses are kept). */
function readCommon(e: Loose, r: GroupReader): void {
  switch (r.code) {
    case 5:
      e.handle = r.str();
      break;
    case 8:
      e.layer = r.str();
      break;
    case 60:
      e.visible = r.int() === 0;
      break;
    case 67:
      e.inPaperSpace = r.int() !== 0;
      break;
    case 101:
      // embedded object (DXF 2018): the rest of the entity is skipped
      while (r.next() !== 0) {
        // passed over
      }
      r.rewind();
      break;
    default:
  }
}

/** ARC, CIRCLE, LWPOLYLINE, TEXT, ELLIPSE: the extrusion direction as three numbers; false for another code. */
function extrusionXYZ(e: Loose, r: GroupReader): boolean {
  if (r.code === 210) e.extrusionDirectionX = r.float();
  else if (r.code === 220) e.extrusionDirectionY = r.float();
  else if (r.code === 230) e.extrusionDirectionZ = r.float();
  else return false;
  return true;
}

// Each reader below takes the groups of one entity up to the next code-0 group, as the parser's
// handler of its type does; groups it does not name go to readCommon.

function line(e: Loose, r: GroupReader): Loose {
  const vertices: Point[] = [];
  e.vertices = vertices;
  while (r.next() !== 0) {
    if (r.code === 10) vertices.unshift(readPoint(r));
    else if (r.code === 11) vertices.push(readPoint(r));
    else if (r.code === 210) readPoint(r);
    else readCommon(e, r);
  }
  return e;
}

/** dxf-parser's LWPOLYLINE vertex list, step for step (a 10 past the declared count starts the list again). */
function lwVertices(n: number, r: GroupReader): Loose[] {
  if (!n || n <= 0) throw new StreamBail('LWPOLYLINE without a vertex count');
  const vertices: Loose[] = [];
  for (let i = 0; i < n; i++) {
    const v: Loose = {};
    let started = false;
    for (;;) {
      const code = r.code;
      if (code === 0) break;
      if (code === 10) {
        if (started) break;
        v.x = r.float();
        started = true;
      } else if (code === 20) v.y = r.float();
      else if (code === 30) v.z = r.float();
      else if (code === 42) {
        const b = r.float();
        if (b !== 0) v.bulge = b;
      } else if (code !== 40 && code !== 41) {
        r.rewind();
        if (started) vertices.push(v);
        r.rewind();
        return vertices;
      }
      r.next();
    }
    vertices.push(v);
  }
  r.rewind();
  return vertices;
}

function lwPolyline(e: Loose, r: GroupReader): Loose {
  e.vertices = [];
  let n = 0;
  while (r.next() !== 0) {
    const code = r.code;
    if (code === 10) e.vertices = lwVertices(n, r);
    else if (code === 90) n = r.int();
    else if (code === 70) e.shape = (r.int() & 1) === 1;
    else if (code === 38) e.elevation = r.float();
    else if (!extrusionXYZ(e, r)) readCommon(e, r);
  }
  return e;
}

function vertex(r: GroupReader): Loose {
  const v: Loose = { type: 'VERTEX' };
  while (r.next() !== 0) {
    const code = r.code;
    if (code === 10) v.x = r.float();
    else if (code === 20) v.y = r.float();
    else if (code === 30) v.z = r.float();
    else if (code === 42) {
      const b = r.float();
      if (b !== 0) v.bulge = b;
    } else if (code === 70) v.splineControlPoint = (r.int() & 16) !== 0;
    else if (code !== 40 && code !== 41 && code !== 50 && !(code >= 71 && code <= 74)) readCommon(v, r);
  }
  return v;
}

/** POLYLINE with its VERTEX entities up to SEQEND (scanGroups has checked that SEQEND comes). */
function polyline(e: Loose, r: GroupReader): Loose {
  while (r.next() !== 0) {
    const code = r.code;
    if (code === 70) {
      const f = r.int();
      e.shape = (f & 1) !== 0;
      e.is3dPolyline = (f & 8) !== 0;
      e.is3dPolygonMesh = (f & 16) !== 0;
      e.isPolyfaceMesh = (f & 64) !== 0;
    } else if (code === 210) e.extrusionDirection = readPoint(r);
    else if (!(code === 10 || code === 20 || code === 30 || (code >= 39 && code <= 41) || (code >= 71 && code <= 75))) readCommon(e, r);
  }
  const vertices: Loose[] = [];
  for (;;) {
    if (r.is('VERTEX')) vertices.push(vertex(r));
    else if (r.is('SEQEND')) {
      const end: Loose = {};
      while (r.next() !== 0) readCommon(end, r);
      break;
    } else throw new StreamBail('POLYLINE not closed by SEQEND');
  }
  e.vertices = vertices;
  return e;
}

function arc(e: Loose, r: GroupReader): Loose {
  while (r.next() !== 0) {
    const code = r.code;
    if (code === 10) e.center = readPoint(r);
    else if (code === 40) e.radius = r.float();
    else if (code === 50) e.startAngle = (Math.PI / 180) * r.float();
    else if (code === 51) e.endAngle = (Math.PI / 180) * r.float();
    else if (!extrusionXYZ(e, r)) readCommon(e, r);
  }
  return e;
}

function circle(e: Loose, r: GroupReader): Loose {
  while (r.next() !== 0) {
    const code = r.code;
    if (code === 10) e.center = readPoint(r);
    else if (code === 40) e.radius = r.float();
    else if (!extrusionXYZ(e, r)) readCommon(e, r);
  }
  return e;
}

function ellipse(e: Loose, r: GroupReader): Loose {
  while (r.next() !== 0) {
    const code = r.code;
    if (code === 10) e.center = readPoint(r);
    else if (code === 11) e.majorAxisEndPoint = readPoint(r);
    else if (code === 40) e.axisRatio = r.float();
    else if (code === 41) e.startAngle = r.float();
    else if (code === 42) e.endAngle = r.float();
    else if (!extrusionXYZ(e, r)) readCommon(e, r);
  }
  return e;
}

function spline(e: Loose, r: GroupReader): Loose {
  const push = (key: string, v: unknown) => {
    const list = (e[key] as unknown[] | undefined) ?? [];
    list.push(v);
    e[key] = list;
  };
  while (r.next() !== 0) {
    const code = r.code;
    if (code === 10) push('controlPoints', readPoint(r));
    else if (code === 11) push('fitPoints', readPoint(r));
    else if (code === 12 || code === 13 || code === 210) readPoint(r);
    else if (code === 40) push('knotValues', r.float());
    else if (code === 41) push('weights', r.float());
    else if (code === 70) {
      const f = r.int();
      e.closed = (f & 1) !== 0;
      e.periodic = (f & 2) !== 0;
    } else if (code === 71) e.degreeOfSplineCurve = r.int();
    else readCommon(e, r);
  }
  return e;
}

function solid(e: Loose, r: GroupReader): Loose {
  const points: Point[] = [];
  e.points = points;
  while (r.next() !== 0) {
    const code = r.code;
    if (code >= 10 && code <= 13) points[code - 10] = readPoint(r);
    else if (code === 210) e.extrusionDirection = readPoint(r);
    else readCommon(e, r);
  }
  return e;
}

/**
 * dxf-parser's 3DFACE corners, step for step: up to five corners from codes 1n/2n/3n; a group of
 * another code ends the list and is itself passed over.
 */
function faceVertices(r: GroupReader): Loose[] {
  const vertices: Loose[] = [];
  for (let i = 0; i <= 4; i++) {
    const v: Loose = {};
    let started = false;
    for (;;) {
      const code = r.code;
      if (code === 0) break;
      if (code >= 10 && code <= 13) {
        if (started) break;
        v.x = r.float();
        started = true;
      } else if (code >= 20 && code <= 23) v.y = r.float();
      else if (code >= 30 && code <= 33) v.z = r.float();
      else return vertices;
      r.next();
    }
    vertices.push(v);
  }
  r.rewind();
  return vertices;
}

function face(e: Loose, r: GroupReader): Loose {
  e.vertices = [];
  while (r.next() !== 0) {
    if (r.code === 10) e.vertices = faceVertices(r);
    else if (r.code !== 70) readCommon(e, r);
  }
  return e;
}

function text(e: Loose, r: GroupReader): Loose {
  while (r.next() !== 0) {
    const code = r.code;
    if (code === 10) e.startPoint = readPoint(r);
    else if (code === 11) e.endPoint = readPoint(r);
    else if (code === 40) e.textHeight = r.float();
    else if (code === 50) e.rotation = r.float();
    else if (code === 1) e.text = r.str();
    else if (code === 72) e.halign = r.int();
    else if (code === 73) e.valign = r.int();
    else if (code !== 41 && !extrusionXYZ(e, r)) readCommon(e, r);
  }
  return e;
}

function mtext(e: Loose, r: GroupReader): Loose {
  while (r.next() !== 0) {
    const code = r.code;
    if (code === 1 || code === 3) {
      const s = r.str();
      e.text = e.text ? (e.text as string) + s : s;
    } else if (code === 10) e.position = readPoint(r);
    else if (code === 11) e.directionVector = readPoint(r);
    else if (code === 40) e.height = r.float();
    else if (code === 50) e.rotation = r.float();
    else if (code !== 41 && code !== 71 && code !== 72) readCommon(e, r);
  }
  return e;
}

/** INSERT groups read as numbers, by code. */
const INSERT_NUMBERS: ReadonlyMap<number, string> = new Map([
  [41, 'xScale'], [42, 'yScale'], [43, 'zScale'], [44, 'columnSpacing'], [45, 'rowSpacing'], [50, 'rotation'],
]);

function insert(e: Loose, r: GroupReader): Loose {
  while (r.next() !== 0) {
    const code = r.code;
    const key = INSERT_NUMBERS.get(code);
    if (key !== undefined) e[key] = r.float();
    else if (code === 2) e.name = r.str();
    else if (code === 10) e.position = readPoint(r);
    else if (code === 70) e.columnCount = r.int();
    else if (code === 71) e.rowCount = r.int();
    else if (code === 210) e.extrusionDirection = readPoint(r);
    else readCommon(e, r);
  }
  return e;
}

/** A type that is not drawn: its layer, visibility and paper-space flag, and its points read as the parser reads them. */
function pointsAt(codes: ReadonlySet<number>) {
  return (e: Loose, r: GroupReader): Loose => {
    while (r.next() !== 0) {
      if (codes.has(r.code)) readPoint(r);
      else readCommon(e, r);
    }
    return e;
  };
}

/** Counted-only types (parse.ts): layer, visibility, paper space and an embedded object, nothing else. */
function countedOnly(e: Loose, r: GroupReader): Loose {
  while (r.next() !== 0) {
    const code = r.code;
    if (code === 8 || code === 60 || code === 67 || code === 101) readCommon(e, r);
  }
  return e;
}

type Reader = (e: Loose, r: GroupReader) => Loose;

/** One reader per type the parser reads (dxf-parser's own handlers and parse.ts's). */
const READERS: ReadonlyMap<string, Reader> = new Map<string, Reader>([
  ['LINE', line],
  ['LWPOLYLINE', lwPolyline],
  ['POLYLINE', polyline],
  ['ARC', arc],
  ['CIRCLE', circle],
  ['ELLIPSE', ellipse],
  ['SPLINE', spline],
  ['SOLID', solid],
  ['3DFACE', face],
  ['TEXT', text],
  ['MTEXT', mtext],
  ['INSERT', insert],
  ['POINT', pointsAt(new Set([10, 210]))],
  ['ATTDEF', pointsAt(new Set([10, 11]))],
  ['DIMENSION', pointsAt(new Set([10, 11, 12, 13, 14, 15, 16]))],
  ...[...COUNTED_ONLY_TYPES].map((t): [string, Reader] => [t, countedOnly]),
]);

/**
 * Calls `each` with every entity of an ENTITIES section body, in file order, as the parser would
 * list it (types it does not read are passed over): `from` is the start of the body, which ends at
 * its 0/ENDSEC group. `each` gets the entity and the offset of its first line.
 */
export function streamEntities(text: string, from: number, each: (e: Loose, at: number) => void, until = Number.POSITIVE_INFINITY): void {
  const r = new GroupReader(text, from);
  r.next();
  for (;;) {
    if (r.code !== 0) {
      r.next();
      continue;
    }
    const at = r.at;
    if (at >= until) return;
    const type = r.str();
    if (type === 'ENDSEC') return;
    const read = READERS.get(type);
    if (!read) {
      r.next();
      continue;
    }
    const e = read({ type }, r);
    each(e, at);
  }
}
