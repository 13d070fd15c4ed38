/**
 * Writes the demo floor plans of samples/floor-plans/ (the invented "Fernhill Biscuit Works"
 * hall, line 3 end-of-line cell). Run with `npm run samples`.
 *
 * The files are written by the small ASCII DXF writer below rather than by dxf-writer, which
 * has no BLOCK definitions, no INSERT arrays and no R12 (AC1009) output. The writer emits the
 * group codes of the DXF reference for HEADER, TABLES (LTYPE, LAYER), BLOCKS and ENTITIES; it
 * writes no CLASSES or OBJECTS section, which DXF libraries do not need (some CAD programs
 * want the full R2000 structure and may refuse these files).
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

export type Version = 'AC1009' | 'AC1015';
export type XY = readonly [number, number];
/** A polyline vertex with the bulge of the segment that leaves it. */
export type Vertex = readonly [number, number, number?];

export interface InsertOptions {
  xScale?: number;
  yScale?: number;
  rotation?: number;
  columns?: number;
  rows?: number;
  columnSpacing?: number;
  rowSpacing?: number;
  extrusion?: readonly [number, number, number];
}

/** Formats a number for a DXF value line: up to 10 decimals, no exponent for ordinary sizes. */
export function fmt(v: number): string {
  if (!Number.isFinite(v)) return String(v);
  const r = Number(v.toFixed(10));
  return Object.is(r, -0) ? '0' : String(r);
}

/** Collects group-code/value pairs of one section or block body. */
export class GroupList {
  readonly lines: string[] = [];
  /** Adds one group: the code line and the value line. */
  g(code: number, value: string | number): this {
    this.lines.push(String(code).padStart(3, ' '), typeof value === 'number' ? fmt(value) : value);
    return this;
  }
  point(code: number, x: number, y: number, z = 0): this {
    return this.g(code, x).g(code + 10, y).g(code + 20, z);
  }
}

/**
 * A minimal ASCII DXF writer: layers, blocks (with base points), and the entities the floor
 * plans need, in R2000 (AC1015, LWPOLYLINE, handles and subclass markers) or R12 (AC1009,
 * POLYLINE/VERTEX/SEQEND, no handles) form.
 */
export class DxfWriter {
  readonly version: Version;
  private readonly header = new Map<string, Array<[number, string | number]>>();
  private readonly layers: Array<{ name: string; color: number; flags: number }> = [];
  private readonly blocks: Array<{ name: string; base: XY; body: GroupList }> = [];
  private readonly entities = new GroupList();
  private handle = 0x100;
  private target: GroupList;

  constructor(version: Version = 'AC1015') {
    this.version = version;
    this.target = this.entities;
    this.headerVar('$ACADVER', [[1, version]]);
    if (version !== 'AC1009') this.headerVar('$HANDSEED', [[5, 'FFFFF']]);
  }

  private get r12(): boolean {
    return this.version === 'AC1009';
  }

  /** Sets a header variable ($INSUNITS, $MEASUREMENT, …) as a list of groups. */
  headerVar(name: string, groups: Array<[number, string | number]>): this {
    this.header.set(name, groups);
    return this;
  }

  /** $INSUNITS code (DXF reference: 1 inches, 4 millimetres, 6 metres …). */
  insunits(code: number): this {
    return this.headerVar('$INSUNITS', [[70, code]]);
  }

  /** Adds a layer with an ACI colour number; flags 1 = frozen; a negative colour = off. */
  layer(name: string, color: number, flags = 0): this {
    this.layers.push({ name, color, flags });
    return this;
  }

  /** Defines a block: entities written inside `draw` go into it (block-local coordinates). */
  block(name: string, base: XY, draw: (w: this) => void): this {
    const body = new GroupList();
    const saved = this.target;
    this.target = body;
    try {
      draw(this);
    } finally {
      this.target = saved;
    }
    this.blocks.push({ name, base, body });
    return this;
  }

  private start(type: string, layer: string, subclass?: string): GroupList {
    const t = this.target;
    t.g(0, type);
    if (!this.r12) t.g(5, (this.handle++).toString(16).toUpperCase()).g(100, 'AcDbEntity');
    t.g(8, layer);
    if (!this.r12 && subclass) t.g(100, subclass);
    return t;
  }

  line(layer: string, a: XY, b: XY): this {
    this.start('LINE', layer, 'AcDbLine').point(10, a[0], a[1]).point(11, b[0], b[1]);
    return this;
  }

  /** A 2-D polyline: LWPOLYLINE in R2000, POLYLINE/VERTEX/SEQEND in R12. */
  polyline(layer: string, vertices: readonly Vertex[], closed: boolean): this {
    if (this.r12) {
      const t = this.start('POLYLINE', layer);
      t.g(66, 1).point(10, 0, 0).g(70, closed ? 1 : 0);
      for (const [x, y, bulge] of vertices) {
        this.start('VERTEX', layer).point(10, x, y);
        if (bulge) t.g(42, bulge);
        t.g(70, 0);
      }
      this.start('SEQEND', layer);
      return this;
    }
    const t = this.start('LWPOLYLINE', layer, 'AcDbPolyline');
    t.g(90, vertices.length).g(70, closed ? 1 : 0).g(43, 0);
    for (const [x, y, bulge] of vertices) {
      t.g(10, x).g(20, y);
      if (bulge) t.g(42, bulge);
    }
    return this;
  }

  /** Circular arc, angles in degrees counter-clockwise; `extrusion` (0,0,−1) mirrors it. */
  arc(layer: string, c: XY, r: number, startDeg: number, endDeg: number, extrusion?: readonly [number, number, number]): this {
    const t = this.start('ARC', layer, 'AcDbCircle');
    t.point(10, c[0], c[1]).g(40, r);
    if (extrusion) t.point(210, ...extrusion);
    if (!this.r12) t.g(100, 'AcDbArc');
    t.g(50, startDeg).g(51, endDeg);
    return this;
  }

  circle(layer: string, c: XY, r: number, extrusion?: readonly [number, number, number]): this {
    const t = this.start('CIRCLE', layer, 'AcDbCircle');
    t.point(10, c[0], c[1]).g(40, r);
    if (extrusion) t.point(210, ...extrusion);
    return this;
  }

  /** Ellipse: centre, major axis end point (relative), ratio, start/end parameters in radians. */
  ellipse(layer: string, c: XY, major: XY, ratio: number, t0 = 0, t1 = 2 * Math.PI): this {
    this.start('ELLIPSE', layer, 'AcDbEllipse')
      .point(10, c[0], c[1])
      .point(11, major[0], major[1])
      .g(40, ratio)
      .g(41, t0)
      .g(42, t1);
    return this;
  }

  /** B-spline by degree, knots and control points (optional weights), or by fit points only. */
  spline(
    layer: string,
    s: { degree: number; knots?: readonly number[]; control?: readonly XY[]; weights?: readonly number[]; fit?: readonly XY[]; closed?: boolean },
  ): this {
    const t = this.start('SPLINE', layer, 'AcDbSpline');
    t.point(210, 0, 0, 1).g(70, (s.closed ? 1 : 0) | 8 | (s.weights ? 4 : 0)).g(71, s.degree);
    t.g(72, s.knots?.length ?? 0).g(73, s.control?.length ?? 0).g(74, s.fit?.length ?? 0);
    for (const k of s.knots ?? []) t.g(40, k);
    (s.control ?? []).forEach(([x, y], i) => {
      t.point(10, x, y);
      if (s.weights) t.g(41, s.weights[i]);
    });
    for (const [x, y] of s.fit ?? []) t.point(11, x, y);
    return this;
  }

  /** Single-line text at its insertion point, height and rotation (degrees). */
  text(layer: string, p: XY, height: number, value: string, rotationDeg = 0): this {
    const t = this.start('TEXT', layer, 'AcDbText');
    t.point(10, p[0], p[1]).g(40, height).g(1, value);
    if (rotationDeg) t.g(50, rotationDeg);
    if (!this.r12) t.g(100, 'AcDbText');
    return this;
  }

  /** Multi-line text (R2000 only); "\\P" breaks lines. */
  mtext(layer: string, p: XY, height: number, value: string, width = 0): this {
    if (this.r12) throw new Error('mtext: R12 has no MTEXT');
    this.start('MTEXT', layer, 'AcDbMText').point(10, p[0], p[1]).g(40, height).g(41, width).g(71, 1).g(1, value);
    return this;
  }

  /** A solid-filled HATCH bounded by one closed polyline path (R2000 only). */
  hatch(layer: string, boundary: readonly XY[]): this {
    if (this.r12) throw new Error('hatch: R12 has no HATCH');
    const t = this.start('HATCH', layer, 'AcDbHatch');
    t.point(10, 0, 0).point(210, 0, 0, 1).g(2, 'SOLID').g(70, 1).g(71, 0).g(91, 1);
    t.g(92, 2).g(72, 0).g(73, 1).g(93, boundary.length);
    for (const [x, y] of boundary) t.g(10, x).g(20, y);
    t.g(97, 0).g(75, 0).g(76, 1).g(98, 0);
    return this;
  }

  /** Block reference, with column/row array and mirror by negative scale. */
  insert(layer: string, name: string, p: XY, o: InsertOptions = {}): this {
    const t = this.start('INSERT', layer, 'AcDbBlockReference');
    t.g(2, name).point(10, p[0], p[1]);
    if (o.xScale !== undefined) t.g(41, o.xScale);
    if (o.yScale !== undefined) t.g(42, o.yScale);
    if (o.xScale !== undefined || o.yScale !== undefined) t.g(43, 1);
    if (o.rotation) t.g(50, o.rotation);
    if (o.columns && o.columns > 1) t.g(70, o.columns);
    if (o.rows && o.rows > 1) t.g(71, o.rows);
    if (o.columnSpacing) t.g(44, o.columnSpacing);
    if (o.rowSpacing) t.g(45, o.rowSpacing);
    if (o.extrusion) t.point(210, ...o.extrusion);
    return this;
  }

  /** The whole file, "\n" line ends, ending with 0/EOF. */
  toString(): string {
    const out = new GroupList();
    out.g(0, 'SECTION').g(2, 'HEADER');
    for (const [name, groups] of this.header) {
      out.g(9, name);
      for (const [c, v] of groups) out.g(c, v);
    }
    out.g(0, 'ENDSEC');

    out.g(0, 'SECTION').g(2, 'TABLES');
    out.g(0, 'TABLE').g(2, 'LTYPE').g(70, 1);
    out.g(0, 'LTYPE').g(2, 'CONTINUOUS').g(70, 0).g(3, 'Solid line').g(72, 65).g(73, 0).g(40, 0);
    out.g(0, 'ENDTAB');
    out.g(0, 'TABLE').g(2, 'LAYER').g(70, this.layers.length + 1);
    for (const l of [{ name: '0', color: 7, flags: 0 }, ...this.layers]) {
      out.g(0, 'LAYER');
      if (!this.r12) out.g(100, 'AcDbSymbolTableRecord').g(100, 'AcDbLayerTableRecord');
      out.g(2, l.name).g(70, l.flags).g(62, l.color).g(6, 'CONTINUOUS');
    }
    out.g(0, 'ENDTAB');
    out.g(0, 'ENDSEC');

    out.g(0, 'SECTION').g(2, 'BLOCKS');
    for (const b of this.blocks) {
      out.g(0, 'BLOCK');
      if (!this.r12) out.g(5, (this.handle++).toString(16).toUpperCase()).g(100, 'AcDbEntity');
      out.g(8, '0');
      if (!this.r12) out.g(100, 'AcDbBlockBegin');
      out.g(2, b.name).g(70, 0).point(10, b.base[0], b.base[1]).g(3, b.name).g(1, '');
      for (const l of b.body.lines) out.lines.push(l);
      out.g(0, 'ENDBLK');
      if (!this.r12) out.g(5, (this.handle++).toString(16).toUpperCase()).g(100, 'AcDbEntity');
      out.g(8, '0');
      if (!this.r12) out.g(100, 'AcDbBlockEnd');
    }
    out.g(0, 'ENDSEC');

    out.g(0, 'SECTION').g(2, 'ENTITIES');
    for (const l of this.entities.lines) out.lines.push(l);
    out.g(0, 'ENDSEC');
    out.g(0, 'EOF');
    return out.lines.join('\n') + '\n';
  }
}

/** Rounded corners: each corner of a closed ring replaced by a tangent arc of radius r (bulges). */
export function filletRing(ring: readonly XY[], r: number): Vertex[] {
  const out: Vertex[] = [];
  const n = ring.length;
  for (let i = 0; i < n; i++) {
    const p = ring[(i + n - 1) % n];
    const c = ring[i];
    const q = ring[(i + 1) % n];
    const din = [c[0] - p[0], c[1] - p[1]];
    const dout = [q[0] - c[0], q[1] - c[1]];
    const li = Math.hypot(din[0], din[1]);
    const lo = Math.hypot(dout[0], dout[1]);
    const ui = [din[0] / li, din[1] / li];
    const uo = [dout[0] / lo, dout[1] / lo];
    const cross = ui[0] * uo[1] - ui[1] * uo[0];
    const turn = Math.atan2(cross, ui[0] * uo[0] + ui[1] * uo[1]); // signed turning angle
    const d = r * Math.tan(Math.abs(turn) / 2); // tangent length
    out.push([c[0] - ui[0] * d, c[1] - ui[1] * d, Math.tan(turn / 4)]);
    out.push([c[0] + uo[0] * d, c[1] + uo[1] * d, 0]);
  }
  return out;
}

export type HallVariant = 'mm' | 'inches' | 'r12' | 'rounded';

/** Hall outline (mm, counter-clockwise from the south-west corner): 24 m × 16 m less a 3 m × 3 m notch at the north-east. */
export const HALL_OUTLINE: readonly XY[] = [
  [0, 0],
  [24000, 0],
  [24000, 13000],
  [21000, 13000],
  [21000, 16000],
  [0, 16000],
];

/** Corner radius of the rounded variant, mm. */
export const HALL_CORNER_RADIUS = 1000;

/** The Fernhill hall in one of its variants, as DXF text. */
export function fernhillHall(variant: HallVariant): string {
  const w = new DxfWriter(variant === 'r12' ? 'AC1009' : 'AC1015');
  const k = variant === 'inches' ? 1 / 25.4 : 1; // drawing units per mm
  const P = (x: number, y: number): XY => [x * k, y * k];
  if (variant === 'inches') w.insunits(1).headerVar('$MEASUREMENT', [[70, 0]]);
  else if (variant !== 'r12') w.insunits(4).headerVar('$MEASUREMENT', [[70, 1]]);
  w.layer('OUTLINE', 5).layer('WALLS', 8).layer('DOORS', 30).layer('COLUMNS', 3).layer('MACHINES', 4).layer('TEXT', 2);
  if (variant !== 'r12') w.layer('HATCH', 9);

  // one column, 400 × 400 mm, base point at its centre
  w.block('COLUMN', [0, 0], (b) => {
    b.polyline('0', [P(-200, -200), P(200, -200), P(200, 200), P(-200, 200)], true);
  });
  // wrapper infeed: 6000 × 1200 mm frame, belt centre line, drive roller; base point (1000, 500)
  w.block('WRAPPER_INFEED', P(1000, 500), (b) => {
    b.polyline('0', [P(1000, 500), P(7000, 500), P(7000, 1700), P(1000, 1700)], true);
    b.line('0', P(1000, 1100), P(7000, 1100));
    b.circle('0', P(6500, 1100), 150 * k);
  });
  // case erector: 2500 × 1800 mm body and a 600 × 1100 mm blank magazine; base point (250, 250)
  w.block('CASE_ERECTOR', P(250, 250), (b) => {
    b.polyline('0', [P(250, 250), P(2750, 250), P(2750, 2050), P(250, 2050)], true);
    b.polyline('0', [P(2750, 600), P(3350, 600), P(3350, 1700), P(2750, 1700)], true);
  });

  const outline: Vertex[] =
    variant === 'rounded' ? filletRing(HALL_OUTLINE, HALL_CORNER_RADIUS) : HALL_OUTLINE.map(([x, y]) => [x, y] as Vertex);
  w.polyline('OUTLINE', outline.map(([x, y, b]) => [x * k, y * k, b] as Vertex), true);

  // office/store partition in the north-west: a wall as one closed polyline, one as four lines
  w.polyline('WALLS', [P(0, 9000), P(7000, 9000), P(7000, 9150), P(0, 9150)], true);
  w.line('WALLS', P(6850, 9150), P(7000, 9150));
  w.line('WALLS', P(7000, 9150), P(7000, 14800));
  w.line('WALLS', P(7000, 14800), P(6850, 14800));
  w.line('WALLS', P(6850, 14800), P(6850, 9150));
  // door leaf and swing in the 1200 mm opening north of that wall
  w.line('DOORS', P(6925, 14800), P(6925, 15800));
  w.arc('DOORS', P(6925, 14800), 1000 * k, 90, 180);

  // columns on the 8 m grid: three single inserts, and one insert with a 3-column array
  for (const x of [4000, 12000, 20000]) w.insert('COLUMNS', 'COLUMN', P(x, 4000));
  w.insert('COLUMNS', 'COLUMN', P(4000, 12000), { columns: 3, columnSpacing: 8000 * k });

  // machines as rotated inserts
  w.insert('MACHINES', 'WRAPPER_INFEED', P(16000, 7000), { rotation: 180 });
  w.insert('MACHINES', 'CASE_ERECTOR', P(19000, 2000), { rotation: 90 });

  w.text('TEXT', P(8000, 15000), 300 * k, 'FERNHILL BISCUIT WORKS - LINE 3 END-OF-LINE CELL');
  w.text('TEXT', P(10500, 6200), 200 * k, 'WRAPPER INFEED');
  w.text('TEXT', P(18300, 2300), 200 * k, 'CASE ERECTOR', 90);
  if (variant === 'r12') w.text('TEXT', P(1000, 12500), 250 * k, 'OFFICE / STORE');
  else w.mtext('TEXT', P(1000, 12500), 250 * k, 'Office\\PStore');
  if (variant !== 'r12') w.hatch('HATCH', [P(0, 9150), P(6850, 9150), P(6850, 16000), P(0, 16000)]);
  return w.toString();
}

/** File name of each variant in samples/floor-plans/. */
export const SAMPLE_FILES: Record<HallVariant, string> = {
  mm: 'fernhill-hall.dxf',
  inches: 'fernhill-hall-inches.dxf',
  r12: 'fernhill-hall-r12.dxf',
  rounded: 'fernhill-hall-rounded.dxf',
};

/** Writes every variant into `dir`; returns the paths written. */
export function writeSamples(dir: string): string[] {
  mkdirSync(dir, { recursive: true });
  const written: string[] = [];
  for (const [variant, file] of Object.entries(SAMPLE_FILES) as Array<[HallVariant, string]>) {
    const p = path.join(dir, file);
    writeFileSync(p, fernhillHall(variant));
    written.push(p);
  }
  return written;
}

if (process.argv[1] && import.meta.url === pathToFileURL(path.resolve(process.argv[1])).href) {
  const dir = path.join(path.dirname(fileURLToPath(import.meta.url)), 'floor-plans');
  for (const p of writeSamples(dir)) console.log(`wrote ${path.relative(process.cwd(), p)}`);
}
