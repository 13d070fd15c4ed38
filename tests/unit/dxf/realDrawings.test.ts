// What real building drawings written by many programs bring: layer flags, wrong header units,
// header values and structures the parser refuses, outlines with tiny pieces, map-grid
// coordinates, formatted labels, layer names in other languages, annotation noise, size.
// Every drawing here is written in the test (DXF group codes as in the DXF reference).
import { describe, expect, it } from 'vitest';
import { checkDrawingUnit } from '@shared/geometry/drawingScale';
import { importDxf } from '../../../backend/src/services/dxf/importDxf';
import { guessLayerRole } from '../../../backend/src/services/dxf/layerRoles';
import { packResult, unpackResult } from '../../../backend/src/services/dxf/transfer';
import { moveDxfEntities } from '../../../backend/src/services/planSheet/dxfOrigin';
import { DxfWriter } from '../../../samples/make-samples';
import { entitiesDxf, lineGroups, polygonsOn, rawDxf, shoelace } from './support';

type G = Array<[number, string | number]>;

/** A closed square LWPOLYLINE of side s at (x, y) on `layer`. */
function square(layer: string, x: number, y: number, s: number): G {
  return [
    [0, 'LWPOLYLINE'], [8, layer], [90, 4], [70, 1],
    [10, x], [20, y], [10, x + s], [20, y], [10, x + s], [20, y + s], [10, x], [20, y + s],
  ];
}

describe('layer flags read from the LAYER table', () => {
  it('only "frozen" (bit 1) and a negative colour (off) hide a layer; "frozen in new viewports" (bit 2) and "locked" (bit 4) do not', () => {
    // LAYER group 70: 1 = frozen, 2 = frozen by default in new viewports, 4 = locked; group 62 < 0 = off (DXF reference, LAYER)
    const w = new DxfWriter().insunits(4);
    w.layer('WALLS', 7, 2).layer('LOCKED-WALLS', 7, 4).layer('OLD-WALLS', 7, 1).layer('HIDDEN-WALLS', -7, 0);
    for (const name of ['WALLS', 'LOCKED-WALLS', 'OLD-WALLS', 'HIDDEN-WALLS']) w.line(name, [0, 0], [10_000, 0]);
    const r = importDxf(w.toString());
    const roles = Object.fromEntries(r.layers.map((l) => [l.name, l.role]));
    expect(roles).toEqual({ WALLS: 'wall', 'LOCKED-WALLS': 'wall', 'OLD-WALLS': 'ignore', 'HIDDEN-WALLS': 'ignore' });
    expect(r.warnings).toContain('Layer "OLD-WALLS" is frozen in the drawing, so it is set to be ignored.');
    expect(r.warnings).toContain('Layer "HIDDEN-WALLS" is switched off in the drawing, so it is set to be ignored.');
    expect(r.warnings.some((s) => /"(LOCKED-)?WALLS" is/.test(s))).toBe(false);
  });
});

describe('plausibility of the drawing unit', () => {
  // a building floor spans about 2 m … 5 km (common practice); 1 in = 25.4 mm exactly (NIST SP 811)
  it('a house 870 units wide read in millimetres (0.87 m) is flagged, with inches (22 m) offered', () => {
    const r = importDxf(entitiesDxf(square('OUTLINE', 0, 0, 870)));
    expect(r.units).toBe('mm');
    expect(r.warnings).toContain(
      'This drawing is 0.87 m wide read in millimetres, too small for a building floor; in inches it would be 22 m. Check the drawing unit.',
    );
    const c = checkDrawingUnit(r.bounds, r.units);
    expect(c).toMatchObject({ plausible: false, suggestion: { units: 'in' } });
    expect(c.suggestion!.extentMm).toBeCloseTo(870 * 25.4, 6);
  });

  it('a 42 mm building is offered as metres, a 48 km one in metres as millimetres; a 24 m plan passes', () => {
    expect(checkDrawingUnit({ minX: 0, minY: 0, maxX: 42, maxY: 30 }, 'mm').suggestion).toEqual({ units: 'm', extentMm: 42_000 });
    expect(checkDrawingUnit({ minX: 0, minY: 0, maxX: 48e6, maxY: 1e6 }, 'm').suggestion).toEqual({ units: 'mm', extentMm: 48_000 });
    expect(checkDrawingUnit({ minX: 0, minY: 0, maxX: 24_000, maxY: 16_000 }, 'mm')).toMatchObject({ plausible: true, message: null });
  });
});

describe('drawings that need not be refused', () => {
  it('boolean header values written as 2 (groups 290–299) are read, not refused', () => {
    const text = entitiesDxf(square('OUTLINE', 0, 0, 10_000), [[9, '$INSUNITS'], [70, 4], [9, '$LWDISPLAY'], [290, 2], [9, '$XEDIT'], [290, -1]]);
    const r = importDxf(text);
    expect(polygonsOn(r, 'OUTLINE')).toHaveLength(1);
    expect(r.notes.ignored.join(' ')).toMatch(/2 yes\/no values were written as another number than 0 or 1/);
  });

  it('a header variable the plan does not use, written damaged, does not refuse the drawing; the unit is still read', () => {
    // $EXTMIN written y first: the parser sets y on a point it has not begun, and throws
    const text = entitiesDxf(square('OUTLINE', 0, 0, 12), [[9, '$INSUNITS'], [70, 6], [9, '$EXTMIN'], [20, 0], [10, 0], [30, 0]]);
    const r = importDxf(text);
    expect(r.units).toBe('m');
    expect(r.bounds.maxX).toBe(12_000);
  });

  it('an unnamed block that nothing inserts is left out, and the drawing is read', () => {
    const text = rawDxf([
      [0, 'SECTION'], [2, 'HEADER'], [9, '$INSUNITS'], [70, 4], [0, 'ENDSEC'],
      [0, 'SECTION'], [2, 'BLOCKS'], [0, 'BLOCK'], [8, '0'], [70, 0], [10, 0], [20, 0], [30, 0],
      ...lineGroups('0', [0, 0], [5, 5]), [0, 'ENDBLK'], [8, '0'], [0, 'ENDSEC'],
      [0, 'SECTION'], [2, 'ENTITIES'], ...square('OUTLINE', 0, 0, 10_000), [0, 'ENDSEC'], [0, 'EOF'],
    ]);
    const r = importDxf(text);
    expect(polygonsOn(r, 'OUTLINE')).toHaveLength(1);
    expect(r.notes.ignored).toContain('1 block definition has no name, so nothing can place it; left out.');
  });

  it('a file with only a TABLES section says it holds no drawing entities (not that it is damaged)', () => {
    const text = rawDxf([
      [0, 'SECTION'], [2, 'TABLES'], [0, 'TABLE'], [2, 'LAYER'], [70, 1], [0, 'LAYER'], [2, 'WALLS'], [70, 0], [62, 7], [0, 'ENDTAB'],
      [0, 'ENDSEC'], [0, 'EOF'],
    ]);
    expect(() => importDxf(text)).toThrow(expect.objectContaining({ code: 'no-entities' }));
  });

  it('an old file whose points run 10, 11, 20, 21 is read with each point in its place', () => {
    const text = entitiesDxf([[0, 'LINE'], [8, 'WALLS'], [10, 1000], [11, 9000], [20, 2000], [21, 2000], [0, 'LINE'], [8, 'WALLS'], [10, 9000], [20, 2000], [11, 9000], [21, 7000]]);
    const r = importDxf(text);
    const lines = r.geometry.features.filter((f) => f.properties.layer === 'WALLS');
    expect(lines).toHaveLength(1); // the two lines meet at (9000, 2000) and join
    expect(lines[0].geometry).toEqual({ type: 'LineString', coordinates: [[1000, 2000], [9000, 2000], [9000, 7000]] });
    expect(r.notes.ignored).toContain('Coordinates written in an old order (x, x, y, y) were read in their proper order.');
  });
});

describe('outlines through pieces shorter than the join tolerance', () => {
  it('a square whose corners hold 0.4 mm pieces closes into one ring; gaps closed are counted', () => {
    // four sides ending 0.2 mm short of each corner, and a 0.4 mm piece across each corner
    const s = 10_000;
    const e = 0.2;
    const g: G = [
      ...lineGroups('OUTLINE', [e, 0], [s - e, 0]), ...lineGroups('OUTLINE', [s - e, 0], [s, e]),
      ...lineGroups('OUTLINE', [s, e], [s, s - e]), ...lineGroups('OUTLINE', [s, s - e], [s - e, s]),
      ...lineGroups('OUTLINE', [s - e, s], [e, s]), ...lineGroups('OUTLINE', [e, s], [0, s - e]),
      ...lineGroups('OUTLINE', [0, s - e], [0, e]), ...lineGroups('OUTLINE', [0, e], [e, 0]),
    ];
    const r = importDxf(entitiesDxf(g));
    const rings = polygonsOn(r, 'OUTLINE');
    expect(rings).toHaveLength(1);
    // shoelace formula: no vertex moves by more than the 1 mm tolerance, so the area differs from
    // the square's by at most perimeter × 1 mm
    expect(Math.abs(Math.abs(shoelace(rings[0])) - s * s)).toBeLessThanOrEqual(4 * s * 1);
    expect(r.gaps.closed).toBeGreaterThanOrEqual(4);
    expect(r.gaps.open).toBe(0);
  });

  it('the ends an outline leaves open are counted and placed', () => {
    const g: G = [...lineGroups('OUTLINE', [0, 0], [10_000, 0]), ...lineGroups('OUTLINE', [10_000, 0], [10_000, 8_000])];
    const r = importDxf(entitiesDxf(g));
    expect(r.gaps.open).toBe(2);
    expect(r.gaps.ends.map((p) => [p.x, p.y]).sort((a, b) => a[0] - b[0])).toEqual([[0, 0], [10_000, 8_000]]);
    expect(r.warnings).toContain('2 line ends on layer "OUTLINE" meet nothing within 1 mm (marked on the preview).');
  });
});

describe('drawings far from their origin', () => {
  it('a site plan at map-grid northings of 5,000 km is moved to a local origin, whole metres', () => {
    const x0 = 512_345_678.9; // mm east
    const y0 = 5_012_345_678.25; // mm north (≈ 5,012 km)
    const r = importDxf(entitiesDxf(square('OUTLINE', x0, y0, 30_000)));
    expect(r.origin).toEqual({ x: 512_345_000, y: 5_012_345_000 });
    expect(r.bounds.minX).toBeCloseTo(678.9, 5);
    expect(r.bounds.minY).toBeCloseTo(678.25, 5);
    expect(r.bounds.maxX - r.bounds.minX).toBeCloseTo(30_000, 5);
    expect(r.warnings.join(' ')).toMatch(/moved by 512345 m east and 5012345 m north/);
    // a coordinate beyond what float64 places to 0.1 mm is still refused
    expect(() => importDxf(entitiesDxf(lineGroups('WALLS', [0, 0], [1e15, 0])))).toThrow(expect.objectContaining({ code: 'bad-coordinates' }));
  });

  it('the export moves a layout back by the offset (and leaves it as it is at 0, 0)', () => {
    const text = entitiesDxf([...lineGroups('ARMS', [100, 200], [300, 400]), [0, 'CIRCLE'], [8, 'ARMS'], [10, 50], [20, 60], [30, 0], [40, 200]]);
    expect(moveDxfEntities(text, 0, 0)).toBe(text);
    const here = importDxf(text);
    const moved = importDxf(moveDxfEntities(text, 512_345_000, 5_012_345_000));
    // read back, the importer moves it to a local origin again: origin + local = where it was + offset
    expect(moved.origin.x + moved.bounds.minX).toBeCloseTo(here.bounds.minX + 512_345_000, 4);
    expect(moved.origin.y + moved.bounds.maxY).toBeCloseTo(here.bounds.maxY + 5_012_345_000, 4);
  });
});

describe('labels', () => {
  it('MTEXT formatting codes and TEXT escapes come out as what they mean', () => {
    // MTEXT inline codes and TEXT control codes as the DXF reference lists them
    const w = new DxfWriter().insunits(4);
    w.polyline('OUTLINE', [[0, 0], [10_000, 0], [10_000, 8_000], [0, 8_000]], true);
    w.mtext('TEXT', [100, 100], 250, '{\\fArial|b1|i0|c0|p34;\\H1.5x;\\C1;Press} line\\P\\pxi-3,l3,t3;Item \\S1/2; in');
    w.text('TEXT', [100, 500], 250, 'Pipe %%c50 at 45%%d, %%p1 mm, 20 \\U+00B0C');
    const labels = importDxf(w.toString()).geometry.features.filter((f) => f.geometry.type === 'Point').map((f) => f.properties.text);
    expect(labels).toEqual(['Press line\nItem 1/2 in', 'Pipe ⌀50 at 45°, ±1 mm, 20 °C']);
  });
});

describe('layer roles', () => {
  it('walls, columns and machines named in French, German, Spanish, Dutch and Italian, and discipline-prefixed names', () => {
    const cases: Record<string, string> = {
      'Murs porteurs': 'wall', Wände: 'wall', Außenwand: 'wall', MUROS: 'wall', muren: 'wall', Pareti: 'wall',
      Poteaux: 'column', Stützen: 'column', Columnas: 'column', kolommen: 'column', Pilastri: 'column',
      Maschinen: 'obstacle', Máquinas: 'obstacle', macchine: 'obstacle',
      'A-WALL-FULL': 'wall', 'S-COLS': 'column', 'A-FLOR-OTLN': 'outline', 'A-EQPM-FIXD': 'obstacle', 'A-WALL-PATT': 'ignore', 'A-ANNO-DIMS': 'ignore',
      Cotation: 'ignore', Bemaßung: 'ignore',
    };
    expect(Object.fromEntries(Object.keys(cases).map((n) => [n, guessLayerRole(n)]))).toEqual(cases);
  });
});

describe('notes', () => {
  it('attribute definitions, viewports and paper-space items are ignored on purpose, and hatches count per placed copy', () => {
    const text = rawDxf([
      [0, 'SECTION'], [2, 'HEADER'], [9, '$INSUNITS'], [70, 4], [0, 'ENDSEC'],
      [0, 'SECTION'], [2, 'BLOCKS'],
      [0, 'BLOCK'], [8, '0'], [2, 'TAG'], [70, 2], [10, 0], [20, 0], [30, 0], [3, 'TAG'],
      [0, 'ATTDEF'], [8, '0'], [10, 0], [20, 0], [30, 0], [40, 100], [1, ''], [3, 'Number'], [2, 'NO'], [70, 0],
      [0, 'HATCH'], [8, '0'], [10, 0], [20, 0], [30, 0], [2, 'SOLID'], [70, 1], [71, 0], [91, 0], [75, 0], [76, 1], [98, 0],
      ...square('0', 0, 0, 500),
      [0, 'ENDBLK'], [8, '0'],
      [0, 'ENDSEC'],
      [0, 'SECTION'], [2, 'ENTITIES'],
      ...square('OUTLINE', 0, 0, 10_000),
      [0, 'INSERT'], [8, 'MACHINES'], [2, 'TAG'], [10, 1000], [20, 1000], [30, 0],
      [0, 'INSERT'], [8, 'MACHINES'], [2, 'TAG'], [10, 3000], [20, 1000], [30, 0],
      [0, 'INSERT'], [8, 'MACHINES'], [2, 'TAG'], [10, 5000], [20, 1000], [30, 0],
      [0, 'VIEWPORT'], [8, '0'], [67, 1], [10, 0], [20, 0], [30, 0], [40, 100], [41, 100], [68, 1], [69, 1],
      [0, 'LINE'], [8, 'TITLE-BLOCK'], [67, 1], [10, 0], [20, 0], [30, 0], [11, 100], [21, 0], [31, 0],
      [0, 'ENDSEC'], [0, 'EOF'],
    ]);
    const r = importDxf(text);
    expect(r.stats.skipped['HATCH (not supported)']).toBe(3);
    expect(r.stats.skipped['ATTDEF (not supported)']).toBe(3);
    expect(r.notes.unread).toEqual([]);
    expect(r.notes.ignored).toEqual(
      expect.arrayContaining([
        '3 HATCH entities were skipped (not supported).',
        '3 ATTDEF entities were skipped (not supported).',
        '1 VIEWPORT entity was skipped (on a paper-space layout).',
        '1 LINE entity was skipped (on a paper-space layout).',
      ]),
    );
    expect(r.warnings.some((s) => /skipped/.test(s))).toBe(false);
  });
});

describe('big drawings', { timeout: 60_000 }, () => {
  it('140,000 lines that join into nothing are all kept (no spread of an unbounded array)', () => {
    // a spread of more than about 120,000 arguments overflows V8's call stack
    const n = 140_000;
    let body = '';
    for (let i = 0; i < n; i++) {
      const x = (i % 400) * 100;
      const y = Math.floor(i / 400) * 100;
      body += `0\nLINE\n8\nMACHINES\n10\n${x}\n20\n${y}\n11\n${x + 50}\n21\n${y}\n`;
    }
    const text = `0\nSECTION\n2\nHEADER\n9\n$INSUNITS\n70\n4\n0\nENDSEC\n0\nSECTION\n2\nENTITIES\n${body}0\nENDSEC\n0\nEOF\n`;
    const r = importDxf(text);
    expect(r.geometry.features).toHaveLength(n);
  });

  it('the result crosses from the worker as typed arrays and comes back the same', () => {
    const w = new DxfWriter().insunits(4);
    w.polyline('OUTLINE', [[0, 0], [10_000, 0], [10_000, 8_000], [0, 8_000]], true);
    w.line('WALLS', [0, 4000], [6000, 4000]);
    w.text('TEXT', [100, 500], 250, 'Cell A', 30);
    const r = importDxf(w.toString());
    const packed = packResult(r);
    expect(packed.coords).toBeInstanceOf(Float64Array);
    expect(packed.coords.length).toBe(2 * (5 + 2 + 1));
    expect(structuredClone(unpackResult(packed))).toEqual(structuredClone(r));
  });
});
