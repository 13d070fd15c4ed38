import { Matrix4, Vector3 } from 'three';
import { describe, expect, it } from 'vitest';
import { importDxf } from '../../../backend/src/services/dxf/importDxf';
import { DxfWriter } from '../../../samples/make-samples';
import {
  allPositions,
  d3Area,
  densePolylineDistance,
  linesOn,
  maxChordError,
  polygonsOn,
  readSample,
  shoelace,
} from './support';

type XY = [number, number];

/** Sorted "x,y" strings of a ring without its closing point (order- and start-independent). */
function cornerSet(ring: number[][], digits = 6): string[] {
  return ring
    .slice(0, -1)
    .map((p) => `${p[0].toFixed(digits)},${p[1].toFixed(digits)}`)
    .sort();
}

/** Applies a three.js matrix (general-purpose library, independent of the importer) to (x, y). */
function apply(m: Matrix4, [x, y]: XY): XY {
  const v = new Vector3(x, y, 0).applyMatrix4(m);
  return [v.x, v.y];
}

const deg = (d: number) => (d * Math.PI) / 180;

describe('outline area', () => {
  it('the sample hall outline has the drawn area (shoelace formula)', () => {
    // Hall 24 m × 16 m less a 3 m × 3 m notch: 384 − 9 = 375 m² [derived]. Shoelace formula
    // (Gauss's area formula) [pub]; cross-checked with d3.polygonArea (general-purpose library).
    const r = importDxf(readSample('fernhill-hall.dxf'));
    const [ring] = polygonsOn(r, 'OUTLINE');
    expect(shoelace(ring)).toBeCloseTo(375e6, 6);
    expect(d3Area(ring)).toBeCloseTo(375e6, 6);
  });
});

describe('block inserts', () => {
  it('a block inserted with rotation 90° and scale 2 lands where T·R·S·T(−base) puts it', () => {
    // DXF reference, INSERT: position 10, scale 41/42, rotation 50 (degrees), about the block
    // base point (BLOCK group 10) [pub]. Expected corners worked by hand and by three.js.
    const w = new DxfWriter().insunits(4).layer('MACH', 4);
    w.block('B', [10, 0], (b) => b.polyline('0', [[10, 0], [20, 0], [20, 5], [10, 5]], true));
    w.insert('MACH', 'B', [100, 200], { xScale: 2, yScale: 2, rotation: 90 });
    const r = importDxf(w.toString());
    const [ring] = polygonsOn(r, 'MACH');
    expect(cornerSet(ring)).toEqual(cornerSet([[100, 200], [100, 220], [90, 220], [90, 200], [100, 200]]));
    const m = new Matrix4()
      .makeTranslation(100, 200, 0)
      .multiply(new Matrix4().makeRotationZ(deg(90)))
      .multiply(new Matrix4().makeScale(2, 2, 1))
      .multiply(new Matrix4().makeTranslation(-10, 0, 0));
    const expected = ([[10, 0], [20, 0], [20, 5], [10, 5]] as XY[]).map((p) => apply(m, p));
    expect(cornerSet(ring, 4)).toEqual(cornerSet([...expected, expected[0]], 4));
  });

  it('nested inserts compose their transforms (checked against three.js Matrix4)', () => {
    const w = new DxfWriter().insunits(4).layer('X', 1);
    w.block('INNER', [0, 0], (b) => b.line('0', [0, 0], [10, 0]));
    w.block('OUTER', [1, 1], (b) => b.insert('0', 'INNER', [5, 5], { xScale: 3, yScale: 3, rotation: 30 }));
    w.insert('X', 'OUTER', [1000, 0], { xScale: 0.5, yScale: 2, rotation: 45 });
    const r = importDxf(w.toString());
    const lines = linesOn(r, 'X');
    expect(lines).toHaveLength(1); // layer-0 entities take the layer of the INSERT that places them
    const m = new Matrix4()
      .makeTranslation(1000, 0, 0)
      .multiply(new Matrix4().makeRotationZ(deg(45)))
      .multiply(new Matrix4().makeScale(0.5, 2, 1))
      .multiply(new Matrix4().makeTranslation(-1, -1, 0))
      .multiply(new Matrix4().makeTranslation(5, 5, 0))
      .multiply(new Matrix4().makeRotationZ(deg(30)))
      .multiply(new Matrix4().makeScale(3, 3, 1));
    const [a, b] = [apply(m, [0, 0]), apply(m, [10, 0])];
    expect(lines[0][0][0]).toBeCloseTo(a[0], 5);
    expect(lines[0][0][1]).toBeCloseTo(a[1], 5);
    expect(lines[0][1][0]).toBeCloseTo(b[0], 5);
    expect(lines[0][1][1]).toBeCloseTo(b[1], 5);
  });

  it('a negative x scale mirrors the block (and its arcs), keeping area and a counter-clockwise ring', () => {
    const w = new DxfWriter().insunits(4).layer('M', 1);
    w.block('L', [0, 0], (b) => {
      b.polyline('0', [[0, 0], [30, 0], [30, 10], [10, 10], [10, 20], [0, 20]], true);
      b.arc('0', [50, 0], 10, 0, 90);
    });
    w.insert('M', 'L', [0, 0], { xScale: -1, yScale: 1 });
    const r = importDxf(w.toString());
    const [ring] = polygonsOn(r, 'M');
    expect(cornerSet(ring)).toEqual(
      cornerSet([[0, 0], [-30, 0], [-30, 10], [-10, 10], [-10, 20], [0, 20], [0, 0]]),
    );
    expect(shoelace(ring)).toBeCloseTo(400, 9); // L shape 30×10 + 10×10 [derived]; RFC 7946 ring order
    const [arc] = linesOn(r, 'M');
    for (const [x, y] of arc) {
      expect(Math.hypot(x + 50, y)).toBeCloseTo(10, 5); // on the mirrored circle
      expect(x).toBeLessThanOrEqual(-50 + 1e-9);
      expect(y).toBeGreaterThanOrEqual(-1e-9);
    }
  });

  it('an array insert places columns × rows copies along the rotated axes', () => {
    // DXF reference, INSERT: 70 column count, 71 row count, 44/45 spacing [pub]; the array
    // turns with the insert's rotation (value from memory, common practice in CAD).
    const w = new DxfWriter().insunits(4).layer('COLS', 3);
    w.block('DOT', [0, 0], (b) => b.circle('0', [0, 0], 5));
    w.insert('COLS', 'DOT', [100, 100], { columns: 3, rows: 2, columnSpacing: 50, rowSpacing: 20, rotation: 90 });
    const r = importDxf(w.toString());
    const centres = polygonsOn(r, 'COLS')
      .map((ring) => {
        const pts = ring.slice(0, -1);
        const cx = pts.reduce((s, p) => s + p[0], 0) / pts.length;
        const cy = pts.reduce((s, p) => s + p[1], 0) / pts.length;
        return `${cx.toFixed(3)},${cy.toFixed(3)}`;
      })
      .sort();
    // cell (c, r) offset (50c, 20r) turned 90° → (−20r, 50c)
    const expected: string[] = [];
    for (let row = 0; row < 2; row++) for (let c = 0; c < 3; c++) expected.push(`${(100 - 20 * row).toFixed(3)},${(100 + 50 * c).toFixed(3)}`);
    expect(centres).toEqual(expected.sort());
    expect(r.layers.find((l) => l.name === 'COLS')?.entityCount).toBe(6);
  });

  it('a block that inserts itself is drawn once and reported, not followed for ever', () => {
    const w = new DxfWriter().insunits(4).layer('A', 1);
    w.block('LOOP', [0, 0], (b) => {
      b.line('0', [0, 0], [10, 0]);
      b.insert('0', 'LOOP', [20, 0]);
    });
    w.insert('A', 'LOOP', [0, 0]);
    const r = importDxf(w.toString());
    expect(linesOn(r, 'A')).toHaveLength(1);
    expect(r.warnings.join(' ')).toMatch(/contain themselves.*"LOOP"/);
  });
});

describe('arcs and bulges', () => {
  it('a bulge of 1 gives a semicircle of area πr²/2 within the chord tolerance', () => {
    // DXF reference, LWPOLYLINE group 42: bulge = tan(θ/4), 1 = semicircle [pub]. An inscribed
    // polygon loses at most tol × arc length of area [derived].
    const r0 = 1000;
    const w = new DxfWriter().insunits(4).layer('B', 1);
    w.polyline('B', [[0, 0, 1], [2 * r0, 0]], true);
    const res = importDxf(w.toString(), { chordToleranceMm: 1 });
    const [ring] = polygonsOn(res, 'B');
    const exact = (Math.PI * r0 * r0) / 2;
    const area = d3Area(ring);
    expect(area).toBeLessThanOrEqual(exact);
    expect(exact - area).toBeLessThanOrEqual(1 * Math.PI * r0);
    // the arc runs counter-clockwise from (0,0) to (2000,0): below the chord, centre (1000, 0)
    for (const [x, y] of ring) {
      expect(y).toBeLessThanOrEqual(1e-9);
      if (y < -1e-9) expect(Math.hypot(x - r0, y)).toBeCloseTo(r0, 5);
    }
    // sagitta of every arc chord (the closing diameter has none)
    expect(maxChordError(ring, (x, y) => (y < -1e-9 ? r0 - Math.hypot(x - r0, y) : 0))).toBeLessThanOrEqual(1 + 1e-9);
  });

  it('a bulge of 0.5 gives the arc of sagitta b·d/2 and radius d(1 + b²)/(4b)', () => {
    // Bulge b = 2·sagitta/chord = tan(θ/4) (DXF reference, group 42) [pub]; for d = 1000 mm and
    // b = 0.5: sagitta 250 mm, radius 625 mm, centre 375 mm left of the chord [derived].
    const w = new DxfWriter().insunits(4).layer('B', 1);
    w.polyline('B', [[0, 0, 0.5], [1000, 0]], false);
    const [arc] = linesOn(importDxf(w.toString()), 'B');
    expect(arc[0]).toEqual([0, 0]);
    expect(arc[arc.length - 1]).toEqual([1000, 0]);
    for (const [x, y] of arc) expect(Math.hypot(x - 500, y - 375)).toBeCloseTo(625, 5);
    const deepest = Math.min(...arc.map(([, y]) => y));
    expect(deepest).toBeLessThanOrEqual(-249);
    expect(deepest).toBeGreaterThanOrEqual(-250 - 1e-9);
  });

  it('a negative extrusion (OCS z = −1) mirrors arcs, circles and inserts: x → −x', () => {
    // DXF reference, arbitrary axis algorithm: for N = (0, 0, −1), Ax = Wy × N = (−1, 0, 0),
    // Ay = N × Ax = (0, 1, 0) [pub], so an OCS point (x, y) lies at world (−x, y).
    const w = new DxfWriter().insunits(4).layer('E', 1);
    w.arc('E', [100, 50], 20, 0, 90, [0, 0, -1]);
    w.circle('E', [300, 0], 10, [0, 0, -1]);
    w.block('TICK', [0, 0], (b) => b.line('0', [0, 0], [10, 0]));
    w.insert('E', 'TICK', [5, 500], { extrusion: [0, 0, -1] });
    const r = importDxf(w.toString());
    const lines = linesOn(r, 'E');
    const arc = lines.find((l) => l.length > 2)!;
    const ends = [arc[0], arc[arc.length - 1]].map((p) => `${p[0]},${p[1]}`).sort();
    expect(ends).toEqual(['-100,70', '-120,50']);
    for (const [x, y] of arc) expect(Math.hypot(x + 100, y - 50)).toBeCloseTo(20, 5);
    const [circle] = polygonsOn(r, 'E');
    for (const [x, y] of circle) expect(Math.hypot(x + 300, y)).toBeCloseTo(10, 5);
    const tick = lines.find((l) => l.length === 2)!;
    expect(tick.map((p) => `${p[0]},${p[1]}`).sort()).toEqual(['-15,500', '-5,500']);
  });
});

describe('units', () => {
  it('inches become millimetres by 25.4 exactly', () => {
    // 1 in = 25.4 mm exactly (international yard and pound agreement, 1959; NIST SP 811) [pub]
    const w = new DxfWriter().insunits(1).layer('L', 1);
    w.line('L', [0, 0], [10, 1.5]);
    const r = importDxf(w.toString());
    expect(r.units).toBe('in');
    expect(r.unitsSource).toBe('header');
    expect(linesOn(r, 'L')[0]).toEqual([[0, 0], [254, 38.1]]);
  });

  it('$INSUNITS 6 (metres) scales by 1000', () => {
    const w = new DxfWriter().insunits(6).layer('L', 1);
    w.line('L', [0, 0], [3, 2.25]);
    const r = importDxf(w.toString());
    expect(r.units).toBe('m');
    expect(r.insunits).toBe(6);
    expect(linesOn(r, 'L')[0]).toEqual([[0, 0], [3000, 2250]]);
    expect(r.bounds).toEqual({ minX: 0, minY: 0, maxX: 3000, maxY: 2250 });
  });

  it('the unit can be chosen after the import: the file read again gives geometry, labels and bounds in that unit', () => {
    const w = new DxfWriter().layer('L', 1); // no $INSUNITS: read as millimetres, with a warning
    w.line('L', [0, 0], [100, 50]);
    w.text('L', [10, 10], 2, 'A');
    const text = w.toString();
    const r = importDxf(text);
    expect(r.unitsSource).toBe('default');
    expect(r.warnings.some((s) => /read as millimetres/.test(s))).toBe(true);
    // 1 in = 25.4 mm exactly (international inch, 1959).
    const inches = importDxf(text, { units: 'in' });
    expect(inches.units).toBe('in');
    expect(inches.unitsSource).toBe('chosen');
    expect(linesOn(inches, 'L')[0]).toEqual([[0, 0], [2540, 1270]]);
    const label = inches.geometry.features.find((f) => f.geometry.type === 'Point')!;
    expect(label.geometry).toEqual({ type: 'Point', coordinates: [254, 254] });
    expect(label.properties.textHeight).toBeCloseTo(50.8, 9);
    expect(inches.bounds).toEqual({ minX: 0, minY: 0, maxX: 2540, maxY: 1270 });
    expect(inches.warnings.some((s) => /read as millimetres/.test(s))).toBe(false);
  });
});

describe('ellipses and splines', () => {
  it('an ELLIPSE is drawn within the chord tolerance of the analytic curve', () => {
    // Ellipse c + a·cos t·û + b·sin t·v̂ (DXF reference, ELLIPSE: 11 major axis end point
    // relative to the centre, 40 ratio, 41/42 parameters) [pub].
    const a = 2000;
    const b = 1000;
    const th = deg(30);
    const u: XY = [a * Math.cos(th), a * Math.sin(th)];
    const v: XY = [-b * Math.sin(th), b * Math.cos(th)];
    const c: XY = [500, 300];
    const w = new DxfWriter().insunits(4).layer('E', 1);
    w.ellipse('E', c, u, b / a);
    w.ellipse('E', [0, 5000], [a, 0], b / a, 0, Math.PI / 2);
    const r = importDxf(w.toString());
    const [ring] = polygonsOn(r, 'E');
    const curve = (t: number): XY => [c[0] + u[0] * Math.cos(t) + v[0] * Math.sin(t), c[1] + u[1] * Math.cos(t) + v[1] * Math.sin(t)];
    const dist = densePolylineDistance(curve, 0, 2 * Math.PI, 40000);
    for (const p of ring) expect(dist(p[0], p[1])).toBeLessThan(1e-3);
    expect(maxChordError(ring, dist)).toBeLessThanOrEqual(1.0 + 1e-3);
    // area πab within tol × perimeter (Ramanujan's perimeter approximation) [pub]
    const h = ((a - b) / (a + b)) ** 2;
    const perimeter = Math.PI * (a + b) * (1 + (3 * h) / (10 + Math.sqrt(4 - 3 * h)));
    expect(Math.PI * a * b - d3Area(ring)).toBeGreaterThanOrEqual(0);
    expect(Math.PI * a * b - d3Area(ring)).toBeLessThanOrEqual(perimeter * 1);
    // the quarter ellipse runs from c + u to c + v
    const [quarter] = linesOn(r, 'E');
    expect(quarter[0]).toEqual([2000, 5000]);
    expect(quarter[quarter.length - 1][0]).toBeCloseTo(0, 6);
    expect(quarter[quarter.length - 1][1]).toBeCloseTo(6000, 6);
  });

  it('a clamped cubic SPLINE follows its Bézier curve (Bernstein form) within the tolerance', () => {
    // Knots 0,0,0,0,1,1,1,1 make a cubic B-spline a Bézier curve, B(t) = Σ C(3,i)(1−t)^(3−i) t^i P_i [pub].
    const P: XY[] = [[0, 0], [1000, 2000], [3000, 2000], [4000, 0]];
    const w = new DxfWriter().insunits(4).layer('S', 1);
    w.spline('S', { degree: 3, knots: [0, 0, 0, 0, 1, 1, 1, 1], control: P });
    const r = importDxf(w.toString());
    const [line] = linesOn(r, 'S');
    const bez = (t: number): XY => {
      const s = 1 - t;
      const k = [s * s * s, 3 * s * s * t, 3 * s * t * t, t * t * t];
      return [k.reduce((acc, ki, i) => acc + ki * P[i][0], 0), k.reduce((acc, ki, i) => acc + ki * P[i][1], 0)];
    };
    const dist = densePolylineDistance(bez, 0, 1, 40000);
    expect(line[0]).toEqual([0, 0]);
    expect(line[line.length - 1]).toEqual([4000, 0]);
    for (const p of line) expect(dist(p[0], p[1])).toBeLessThan(1e-3);
    expect(maxChordError(line, dist)).toBeLessThanOrEqual(1 + 1e-3);
  });

  it('a rational quadratic SPLINE written by dxf-writer draws a quarter circle', async () => {
    // Quarter circle as a rational quadratic: control (r,0), (r,r), (0,r), weights 1, √2/2, 1
    // (Piegl & Tiller, The NURBS Book, §7.2) [pub]. The file comes from dxf-writer, an
    // independent DXF writer.
    const { default: Drawing } = await import('dxf-writer');
    const d = new Drawing();
    d.setUnits('Millimeters');
    // drawSpline exists in dxf-writer 1.18 but is missing from its type declarations
    const withSpline = d as unknown as { drawSpline(c: number[][], deg: number, knots: number[], weights: number[]): void };
    withSpline.drawSpline([[1000, 0], [1000, 1000], [0, 1000]], 2, [0, 0, 0, 1, 1, 1], [1, Math.SQRT1_2, 1]);
    const r = importDxf(d.toDxfString());
    const [line] = linesOn(r, '0');
    for (const [x, y] of line) expect(Math.hypot(x, y)).toBeCloseTo(1000, 5);
    expect(maxChordError(line, (x, y) => 1000 - Math.hypot(x, y))).toBeLessThanOrEqual(1 + 1e-9);
    expect(line[0]).toEqual([1000, 0]);
    expect(line[line.length - 1]).toEqual([0, 1000]);
  });

  it('a SPLINE stored by fit points only passes through them', () => {
    const fit: XY[] = [[0, 0], [1000, 800], [2500, 600], [4000, 1500]];
    const w = new DxfWriter().insunits(4).layer('S', 1);
    w.spline('S', { degree: 3, fit });
    const r = importDxf(w.toString());
    const [line] = linesOn(r, 'S');
    for (const [fx, fy] of fit) {
      expect(Math.min(...line.map(([x, y]) => Math.hypot(x - fx, y - fy)))).toBeLessThan(1e-6);
    }
  });
});

describe('joining', () => {
  it('four LINEs whose ends meet within the tolerance become one closed ring', () => {
    // Rectangle 3000 × 2000 = 6 m² [derived]; lines drawn out of order, one reversed, with 0.4 mm gaps.
    const w = new DxfWriter().insunits(4).layer('OUTLINE', 5);
    w.line('OUTLINE', [3000, 2000], [0, 2000.4]);
    w.line('OUTLINE', [0, 0], [3000, 0]);
    w.line('OUTLINE', [0, 2000], [0, 0.3]);
    w.line('OUTLINE', [3000, 2000.2], [3000, 0.1]); // reversed
    const r = importDxf(w.toString());
    const rings = polygonsOn(r, 'OUTLINE');
    expect(rings).toHaveLength(1);
    expect(linesOn(r, 'OUTLINE')).toHaveLength(0);
    expect(shoelace(rings[0])).toBeGreaterThan(0); // counter-clockwise (RFC 7946)
    expect(Math.abs(d3Area(rings[0]) - 6e6)).toBeLessThan(0.5 * 10000);
    const f = r.geometry.features.find((x) => x.properties.layer === 'OUTLINE')!;
    expect(f.properties).toMatchObject({ entity: 'JOINED', closed: true, parts: 4 });
    expect(r.warnings.some((s) => /floor boundary/.test(s))).toBe(false);
  });

  it('ends farther apart than the tolerance stay open, and the boundary warning says so', () => {
    const w = new DxfWriter().insunits(4).layer('OUTLINE', 5);
    w.line('OUTLINE', [0, 0], [3000, 0]);
    w.line('OUTLINE', [3000, 0], [3000, 2000]);
    w.line('OUTLINE', [3000, 2000], [0, 2000]);
    w.line('OUTLINE', [0, 2000], [0, 5]); // 5 mm short
    const r = importDxf(w.toString());
    expect(polygonsOn(r, 'OUTLINE')).toHaveLength(0);
    expect(r.warnings.join(' ')).toMatch(/"OUTLINE".*no closed outline/);
  });

  it('a ring with a line leaving one corner still closes; the tail stays a line', () => {
    const w = new DxfWriter().insunits(4).layer('W', 8);
    w.line('W', [0, 0], [100, 0]);
    w.line('W', [100, 0], [100, 100]);
    w.line('W', [100, 100], [0, 100]);
    w.line('W', [0, 100], [0, 0]);
    w.line('W', [100, 100], [200, 200]);
    const r = importDxf(w.toString());
    expect(polygonsOn(r, 'W')).toHaveLength(1);
    expect(linesOn(r, 'W')).toEqual([[[100, 100], [200, 200]]]);
  });

  it('a self-crossing outline is reported', () => {
    const w = new DxfWriter().insunits(4).layer('OUTLINE', 5);
    w.polyline('OUTLINE', [[0, 0], [1000, 1000], [1000, 0], [0, 1000]], true);
    const r = importDxf(w.toString());
    expect(r.warnings.join(' ')).toMatch(/crosses itself/);
  });
});

describe('large files', () => {
  it('a file read in pieces keeps every entity whole, POLYLINE vertices included', () => {
    // Far more than one parsing piece (ENTITY_CHUNK_CHARS) of R12 polylines: each square must
    // come back with its four corners and its area, wherever the pieces were cut.
    const w = new DxfWriter('AC1009').layer('R', 1);
    const n = 4000;
    for (let i = 0; i < n; i++) {
      const x = (i % 100) * 100;
      const y = Math.floor(i / 100) * 100;
      w.polyline('R', [[x, y], [x + 50, y], [x + 50, y + 50], [x, y + 50]], true);
    }
    const text = w.toString();
    expect(text.length).toBeGreaterThan(4 * 250_000);
    const r = importDxf(text);
    const rings = polygonsOn(r, 'R');
    expect(rings).toHaveLength(n);
    for (const ring of rings) {
      expect(ring).toHaveLength(5);
      expect(d3Area(ring)).toBe(2500);
    }
    expect(r.layers[0].entityCount).toBe(n);
  });
});

describe('output', () => {
  it('a file written by dxf-writer imports with its rectangle, circle and arc intact', async () => {
    const { default: Drawing } = await import('dxf-writer');
    const d = new Drawing();
    d.setUnits('Millimeters');
    d.drawRect(0, 0, 100, 50);
    d.drawCircle(300, 10, 40);
    d.drawArc(0, 500, 10, 0, 90);
    const r = importDxf(d.toDxfString());
    expect(r.units).toBe('mm');
    const rings = polygonsOn(r, '0');
    expect(rings.map((x) => Math.round(d3Area(x))).sort((a, b) => a - b)[1]).toBe(5000);
    const circle = rings.find((x) => x.length > 5)!;
    for (const [x, y] of circle) expect(Math.hypot(x - 300, y - 10)).toBeCloseTo(40, 5);
    const [arc] = linesOn(r, '0');
    expect(arc[0]).toEqual([10, 500]);
    expect(arc[arc.length - 1]).toEqual([0, 510]);
  });

  it('every coordinate is finite and rounded to the nanometre grid', () => {
    const r = importDxf(readSample('fernhill-hall-rounded.dxf'));
    for (const [x, y] of allPositions(r)) {
      expect(Number.isFinite(x) && Number.isFinite(y)).toBe(true);
      expect(Math.abs(x * 1e6 - Math.round(x * 1e6))).toBeLessThan(1e-3);
    }
  });
});
