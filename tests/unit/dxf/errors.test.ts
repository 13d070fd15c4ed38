import { describe, expect, it } from 'vitest';
import { DxfImportError, type DxfImportErrorCode } from '../../../backend/src/services/dxf/errors';
import { importDxf } from '../../../backend/src/services/dxf/importDxf';
import { DxfWriter } from '../../../samples/make-samples';
import { readSample } from './support';

/** Runs the import and returns the DxfImportError it throws (fails the test on anything else). */
function failure(input: string | Uint8Array): DxfImportError {
  try {
    importDxf(input);
  } catch (e) {
    expect(e).toBeInstanceOf(DxfImportError);
    const err = e as DxfImportError;
    expect(err.userFacing).toBe(true);
    expect(err.message).not.toMatch(/undefined|TypeError|\bat\s+\S+\.ts/);
    return err;
  }
  throw new Error('expected importDxf to throw');
}

function expectCode(input: string | Uint8Array, code: DxfImportErrorCode): DxfImportError {
  const err = failure(input);
  expect(err.code).toBe(code);
  return err;
}

/** Minimal file with the given ENTITIES section body (group lines). */
function withEntities(...groups: Array<string | number>): string {
  const body = groups.map(String).join('\n');
  return `0\nSECTION\n2\nHEADER\n9\n$INSUNITS\n70\n4\n0\nENDSEC\n0\nSECTION\n2\nENTITIES\n${body}\n0\nENDSEC\n0\nEOF\n`;
}

/** 1-based number of the first line equal to `s` (after trimming) at or after line `from`. */
function lineOf(text: string, s: string, from = 1): number {
  const lines = text.split('\n');
  for (let i = from - 1; i < lines.length; i++) if (lines[i].trim() === s) return i + 1;
  throw new Error(`no line ${s}`);
}

describe('files that are not drawings', () => {
  it('an empty file', () => {
    expectCode('', 'empty');
    expectCode('  \n\n\t\n', 'empty');
    expectCode(new Uint8Array(0), 'empty');
  });

  it('a binary DXF, as bytes or as text, is named and the planner told to save as ASCII DXF', () => {
    const head = 'AutoCAD Binary DXF\r\n\u001a\u0000';
    const bytes = new Uint8Array([...head].map((c) => c.charCodeAt(0)).concat([0, 0, 1, 2, 255, 254]));
    expect(expectCode(bytes, 'binary-dxf').message).toMatch(/ASCII DXF/);
    expect(expectCode(head + 'xyz', 'binary-dxf').message).toMatch(/ASCII DXF/);
  });

  it('random bytes, a PNG and plain prose are not DXF', () => {
    let seed = 12345;
    const random = new Uint8Array(4096).map(() => ((seed = (seed * 1103515245 + 12345) >>> 0) >>> 24) & 0xff);
    expectCode(random, 'not-dxf');
    expectCode(new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13]), 'not-dxf');
    expectCode('Dear planner,\nplease find the hall attached.\n', 'not-dxf');
    expectCode('0\nLINE\n8\n0\n', 'not-dxf'); // group codes but no section
  });
});

describe('damaged drawings', () => {
  it('a file cut off in the middle of its entities names the last line', () => {
    const lines = readSample('fernhill-hall.dxf').split('\n');
    const cut = lineOf(lines.join('\n'), 'ENTITIES') + 40;
    const text = lines.slice(0, cut).join('\n') + '\n';
    const err = expectCode(text, 'parse-error');
    expect(err.line).toBe(cut);
    expect(err.message).toMatch(/cut off/);
  });

  it('a file whose last section is complete but which lacks the EOF marker is read, with a warning', () => {
    const text = readSample('fernhill-hall.dxf').replace(/\s*0\nEOF\n$/, '\n');
    expect(text.endsWith('ENDSEC\n')).toBe(true);
    const r = importDxf(text);
    expect(r.layers).toHaveLength(6);
    expect(r.warnings[0]).toMatch(/no end marker \(EOF\)/);
  });

  it('a group code line that is not a number gives its line number', () => {
    const text = readSample('fernhill-hall.dxf');
    const lines = text.split('\n');
    const at = lineOf(text, 'LINE') + 1; // the code line after "LINE" (its handle code, 5)
    lines[at - 1] = '  5O';
    const err = expectCode(lines.join('\n'), 'parse-error');
    expect(err.line).toBe(at);
    expect(err.message).toContain(`Line ${at}`);
  });

  it('a point whose x is not followed by its y gives the line of that point', () => {
    const text = withEntities(0, 'LINE', 8, 'A', 10, 5, 30, 0, 11, 1, 21, 1);
    const err = expectCode(text, 'parse-error');
    expect(err.line).toBe(lineOf(text, '10'));
  });

  it('structures the parser would loop on for ever are refused with their line (POLYLINE without SEQEND, foreign LAYER record, LWPOLYLINE without y)', () => {
    const noSeqend = withEntities(0, 'POLYLINE', 8, 'A', 66, 1, 70, 0, 0, 'VERTEX', 8, 'A', 10, 0, 20, 0, 0, 'LINE', 8, 'A', 10, 0, 20, 0, 11, 1, 21, 1);
    expect(expectCode(noSeqend, 'parse-error').line).toBe(lineOf(noSeqend, 'POLYLINE') - 1);

    const layerTable =
      '0\nSECTION\n2\nTABLES\n0\nTABLE\n2\nLAYER\n70\n1\n0\nLAYER\n2\nA\n70\n0\n62\n1\n0\nLINE\n0\nENDTAB\n0\nENDSEC\n' +
      '0\nSECTION\n2\nENTITIES\n0\nLINE\n8\nA\n10\n0\n20\n0\n11\n1\n21\n1\n0\nENDSEC\n0\nEOF\n';
    expect(expectCode(layerTable, 'parse-error').line).toBe(lineOf(layerTable, 'LINE') - 1);

    const lwNoY = withEntities(0, 'LWPOLYLINE', 8, 'A', 90, 2, 70, 0, 10, 0, 70, 1, 10, 5, 20, 5);
    expect(expectCode(lwNoY, 'parse-error').line).toBe(lineOf(lwNoY, '70', lineOf(lwNoY, '10')));
  });

  it('an LWPOLYLINE declaring far more vertices than it lists is refused (the parser would fill memory)', () => {
    const text = withEntities(0, 'LWPOLYLINE', 8, 'A', 90, 99999999, 70, 0, 10, 0, 20, 0, 10, 5, 20, 5);
    const err = expectCode(text, 'parse-error');
    expect(err.line).toBe(lineOf(text, 'LWPOLYLINE') - 1);
    expect(err.message).toMatch(/declares 99999999 vertices but lists 2/);
  });

  it('groups that form no section give a parse error, not an empty drawing', () => {
    expectCode('0\nSECTION\n5\nFOO\n0\nEOF\n', 'parse-error');
  });
});

describe('coordinates', () => {
  it('a coordinate of 1e300 is refused, naming the entity and its handle', () => {
    const w = new DxfWriter().insunits(4).layer('A', 1);
    w.line('A', [0, 0], [10, 10]);
    w.line('A', [0, 0], [1e300, 0]);
    const text = w.toString();
    const handles = [...text.matchAll(/\n\s*0\nLINE\n\s*5\n([0-9A-F]+)\n/g)].map((m) => m[1]);
    const err = expectCode(text, 'bad-coordinates');
    expect(err.message).toContain('LINE');
    expect(err.message).toContain(`handle ${handles[1]}`);
  });

  it.each(['NaN', 'Infinity', '-Infinity', 'abc'])('a coordinate written as %s is refused', (v) => {
    const text = withEntities(0, 'CIRCLE', 5, '2F', 8, 'A', 10, v, 20, 0, 40, 5);
    const err = expectCode(text, 'bad-coordinates');
    expect(err.message).toContain('CIRCLE entity (handle 2F)');
  });

  it('a block scaled far beyond any building is refused', () => {
    const w = new DxfWriter().insunits(6).layer('A', 1);
    w.block('B', [0, 0], (b) => b.line('0', [0, 0], [1, 0]));
    w.insert('A', 'B', [0, 0], { xScale: 1e12, yScale: 1 });
    expect(expectCode(w.toString(), 'bad-coordinates').message).toMatch(/in block "B"/);
  });
});

describe('nothing to draw', () => {
  it('a drawing with only unsupported entities says what it found', () => {
    const w = new DxfWriter().insunits(4).layer('H', 9);
    w.hatch('H', [[0, 0], [10, 0], [10, 10]]);
    const err = expectCode(w.toString(), 'no-entities');
    expect(err.message).toMatch(/1 HATCH/);
  });

  it('a header and an empty ENTITIES section', () => {
    expectCode(withEntities(999, 'nothing here').replace('999\nnothing here\n', ''), 'no-entities');
    expectCode('0\nSECTION\n2\nHEADER\n9\n$ACADVER\n1\nAC1015\n0\nENDSEC\n0\nEOF\n', 'no-entities');
  });

  it('an INSERT of a block that is not defined draws nothing and is reported', () => {
    const w = new DxfWriter().insunits(4).layer('A', 1);
    w.line('A', [0, 0], [1, 1]);
    w.insert('A', 'GHOST', [0, 0]);
    const r = importDxf(w.toString());
    expect(r.warnings.join(' ')).toMatch(/not defined in the file: "GHOST"/);
    expect(r.stats.skipped['INSERT (block missing)']).toBe(1);
  });
});

describe('options', () => {
  it('an unknown unit or an impossible tolerance is a programming error naming the argument', () => {
    const text = readSample('fernhill-hall.dxf');
    expect(() => importDxf(text, { units: 'furlong' as never })).toThrow(/^units: /);
    expect(() => importDxf(text, { chordToleranceMm: 0 })).toThrow(/^chordToleranceMm: /);
    expect(() => importDxf(text, { chordToleranceMm: Number.NaN })).toThrow(/^chordToleranceMm: /);
  });
});

describe('block arrays that would expand to too much', () => {
  it('a small file with a 1000 × 1000 array of a 10-line block is refused before any copy is placed, naming the count and the cap', () => {
    const w = new DxfWriter().insunits(4);
    w.block('TILE', [0, 0], (b) => {
      for (let i = 0; i < 10; i++) b.line('0', [i * 10, 0], [i * 10, 5]);
    });
    w.insert('FLOOR', 'TILE', [0, 0], { columns: 1000, rows: 1000, columnSpacing: 200, rowSpacing: 200 });
    const text = w.toString();
    expect(text.length).toBeLessThan(20_000);
    const err = expectCode(text, 'too-complex');
    // 1000 × 1000 copies × 10 lines = 10 000 000 entities, against the cap of 2 000 000
    expect(err.message).toContain('1 000 × 1 000');
    expect(err.message).toContain('10 000 000');
    expect(err.message).toContain('2 000 000');
  });

  it('nested arrays are multiplied through every level', () => {
    const w = new DxfWriter().insunits(4);
    w.block('CELL', [0, 0], (b) => b.line('0', [0, 0], [1, 1]));
    w.block('ROW', [0, 0], (b) => b.insert('0', 'CELL', [0, 0], { columns: 2000, columnSpacing: 2 }));
    w.insert('FLOOR', 'ROW', [0, 0], { rows: 2000, rowSpacing: 2 });
    // one ROW places its INSERT plus 2000 lines = 2001; 2000 rows of it = 4 002 000
    const err = expectCode(w.toString(), 'too-complex');
    expect(err.message).toContain('4 002 000');
  });

  it('an array within the cap is still drawn in full', () => {
    const w = new DxfWriter().insunits(4);
    w.block('POST', [0, 0], (b) => b.line('0', [0, 0], [100, 0]));
    w.insert('COLUMNS', 'POST', [0, 0], { columns: 30, rows: 20, columnSpacing: 1000, rowSpacing: 1000 });
    const r = importDxf(w.toString());
    // 30 × 20 copies of one 100 mm line, 1 m apart: 600 separate lines
    expect(r.geometry.features.filter((f) => f.properties?.layer === 'COLUMNS').length).toBe(600);
  });
});
