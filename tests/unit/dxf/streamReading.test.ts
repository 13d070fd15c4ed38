// The ENTITIES section read straight off the text (importDxf's way) against dxf-parser's reading
// of it (the way before, kept as the fallback): every sample, a file holding every entity type the
// import reads, a large generated plan read in many pieces, and damaged files must give the same
// result — GeoJSON, layers, units, warnings, notes — or the same error (code, message, line).
// The parser's reading is the reference here: dxf-parser 1.1.2, a general-purpose library.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { isDxfImportError } from '../../../backend/src/services/dxf/errors';
import { importDxfReading, type ImportOptions } from '../../../backend/src/services/dxf/importDxf';
import { GroupReader, streamEntities, StreamBail } from '../../../backend/src/services/dxf/entityStream';
import { ENTITY_CHUNK_CHARS, scanGroups } from '../../../backend/src/services/dxf/groupScan';
import { sniffDxf } from '../../../backend/src/services/dxf/sniff';
import { DxfWriter, SAMPLE_FILES } from '../../../samples/make-samples';
import { entitiesDxf, lineGroups, mutate, mutation, rawDxf, readSample } from './support';

type Outcome = { result: unknown } | { error: { name: string; code?: string; message: string; line?: number } };

function outcome(text: string, reading: 'stream' | 'parser', opts: ImportOptions = {}): Outcome {
  try {
    return { result: importDxfReading(text, opts, reading) };
  } catch (e) {
    if (isDxfImportError(e)) return { error: { name: e.name, code: e.code, message: e.message, line: e.line } };
    return { error: { name: e instanceof Error ? e.name : typeof e, message: e instanceof Error ? e.message : String(e) } };
  }
}

function expectSame(text: string, opts: ImportOptions = {}): Outcome {
  const streamed = outcome(text, 'stream', opts);
  expect(streamed).toStrictEqual(outcome(text, 'parser', opts));
  return streamed;
}

/** True when the stream reader reads the whole ENTITIES section itself (so the comparison is not the parser against itself). */
function streamsWhole(text: string): boolean {
  const t = sniffDxf(text);
  const span = scanGroups(t).entities;
  if (!span) return false;
  let n = 0;
  try {
    streamEntities(t, span.start, () => n++);
  } catch (e) {
    if (e instanceof StreamBail) return false;
    throw e;
  }
  return n > 0;
}

type Groups = Array<[number, string | number]>;

/** One entity of every type the import reads, and of several it counts or leaves out. */
function everyType(): Groups {
  return [
    ...lineGroups('WALLS', [0, 0], [5000, 0]),
    [0, 'LINE'], [5, '1A'], [8, 'WALLS'], [11, 5000], [21, 4000], [10, 5000], [20, 0], [210, 0], [220, 0], [230, 1],
    [0, 'LWPOLYLINE'], [5, '2B'], [100, 'AcDbEntity'], [8, 'OUTLINE'], [90, 4], [70, 1], [38, 0],
    [10, 0], [20, 0], [42, 0.25], [10, 8000], [20, 0], [10, 8000], [20, 6000], [40, 10], [41, 10], [42, -0.5], [10, 0], [20, 6000],
    [0, 'LWPOLYLINE'], [8, 'MIRRORED'], [90, 2], [10, 100], [20, 100], [10, 900], [20, 100], [210, 0], [220, 0], [230, -1],
    [0, 'POLYLINE'], [8, 'RACKS'], [66, 1], [10, 0], [20, 0], [30, 0], [70, 1],
    [0, 'VERTEX'], [8, 'RACKS'], [10, 100], [20, 100], [30, 0], [42, 0.3],
    [0, 'VERTEX'], [8, 'RACKS'], [10, 900], [20, 100], [30, 0],
    [0, 'VERTEX'], [8, 'RACKS'], [10, 900], [20, 700], [30, 0], [70, 16],
    [0, 'VERTEX'], [8, 'RACKS'], [10, 100], [20, 700], [30, 0],
    [0, 'SEQEND'], [8, 'RACKS'],
    [0, 'POLYLINE'], [8, 'PIPES'], [66, 1], [70, 8],
    [0, 'VERTEX'], [10, 0], [20, 0], [30, 100], [70, 32],
    [0, 'VERTEX'], [10, 3000], [20, 500], [30, 200], [70, 32],
    [0, 'SEQEND'],
    [0, 'POLYLINE'], [8, 'MESH'], [66, 1], [70, 16], [0, 'VERTEX'], [10, 0], [20, 0], [30, 0], [0, 'SEQEND'],
    [0, 'ARC'], [8, 'MACHINES'], [10, 2000], [20, 2000], [30, 0], [40, 500], [50, 10], [51, 200],
    [0, 'ARC'], [8, 'MACHINES'], [10, 2000], [20, 2000], [40, 300], [50, 0], [51, 90], [210, 0], [220, 0], [230, -1],
    [0, 'CIRCLE'], [8, 'COLUMNS'], [10, 3000], [20, 3000], [40, 200],
    [0, 'CIRCLE'], [8, 'COLUMNS'], [10, 3000], [20, 3000], [40, 0],
    [0, 'ELLIPSE'], [8, 'MACHINES'], [10, 4000], [20, 1000], [30, 0], [11, 600], [21, 0], [31, 0], [40, 0.5], [41, 0], [42, 3],
    [0, 'SPLINE'], [8, 'PIPES'], [70, 8], [71, 3], [72, 8], [73, 4],
    [40, 0], [40, 0], [40, 0], [40, 0], [40, 1], [40, 1], [40, 1], [40, 1],
    [10, 0], [20, 0], [30, 0], [10, 1000], [20, 2000], [30, 0], [10, 2000], [20, -1000], [30, 0], [10, 3000], [20, 0], [30, 0],
    [12, 1], [22, 0], [32, 0], [210, 0], [220, 0], [230, 1],
    [0, 'SPLINE'], [8, 'PIPES'], [70, 1], [71, 3], [74, 4], [11, 0], [21, 0], [11, 1000], [21, 1000], [11, 2000], [21, 0], [11, 1000], [21, -1000],
    [0, 'SOLID'], [8, 'FILL'], [10, 0], [20, 0], [11, 100], [21, 0], [12, 0], [22, 100], [13, 100], [23, 100],
    [0, 'SOLID'], [8, 'FILL'], [10, 0], [20, 0], [11, 100], [21, 0], [12, 0], [22, 100],
    [0, '3DFACE'], [8, 'FACES'], [10, 0], [20, 0], [30, 0], [11, 500], [21, 0], [31, 0], [12, 500], [22, 500], [32, 0], [13, 0], [23, 500], [33, 0],
    [0, '3DFACE'], [10, 0], [20, 0], [30, 0], [11, 500], [21, 0], [31, 0], [12, 500], [22, 500], [32, 0], [13, 0], [23, 700], [33, 0], [8, 'FACES'], [62, 3],
    [0, 'TEXT'], [8, 'TEXT'], [10, 100], [20, 200], [40, 250], [1, 'Bay %%c12 %%d'], [50, 30],
    [0, 'TEXT'], [8, 'TEXT'], [10, 100], [20, 200], [11, 500], [21, 200], [72, 1], [40, 250], [1, ' Centred '],
    [0, 'TEXT'], [8, 'TEXT'], [10, 100], [20, 200], [1, '   '],
    [0, 'MTEXT'], [8, 'TEXT'], [10, 1000], [20, 1000], [40, 300], [3, '{\\fArial;Dock '], [1, 'door\\P\\S1/2;}'], [11, 0], [21, 1], [31, 0],
    [0, 'MTEXT'], [8, 'TEXT'], [10, 1000], [20, 1000], [40, 300], [1, 'Turned'], [50, 0.5],
    [0, 'INSERT'], [8, 'RACKS'], [2, 'RACK'], [10, 10000], [20, 0], [30, 0], [41, 2], [42, -1], [50, 45], [70, 3], [71, 2], [44, 3000], [45, 1500],
    [0, 'INSERT'], [8, 'RACKS'], [2, 'rack'], [10, 20000], [20, 0], [210, 0], [220, 0], [230, -1],
    [0, 'INSERT'], [8, 'CELLS'], [66, 1], [2, 'CELL'], [10, 30000], [20, 0],
    [0, 'ATTRIB'], [8, 'CELLS'], [1, 'R1'], [10, 30000], [20, 0], [0, 'SEQEND'],
    [0, 'INSERT'], [8, 'CELLS'], [2, 'NOWHERE'], [10, 0], [20, 0],
    [0, 'INSERT'], [8, 'CELLS'], [2, 'SELF'], [10, 0], [20, 0],
    [0, 'POINT'], [8, 'MARKS'], [10, 1], [20, 2], [30, 0],
    [0, 'DIMENSION'], [8, 'DIMS'], [2, '*D1'], [10, 0], [20, 0], [13, 0], [23, 0], [14, 100], [24, 0], [70, 0],
    [0, 'ATTDEF'], [8, 'CELLS'], [10, 0], [20, 0], [11, 0], [21, 0], [2, 'TAG'],
    [0, 'HATCH'], [8, 'FILL'], [10, 0], [20, 0], [30, 0], [91, 1], [92, 2], [93, 2],
    [0, 'VIEWPORT'], [8, '0'], [67, 1], [10, 0], [20, 0],
    [0, 'LEGACYTHING'], [8, 'WALLS'], [10, 0], [20, 0],
    [0, 'LINE'], [8, 'WALLS'], [67, 1], [10, 0], [20, 0], [11, 10], [21, 0],
    [0, 'LINE'], [8, 'WALLS'], [60, 1], [10, 0], [20, 0], [11, 10], [21, 0],
    [0, 'LINE'], [8, 'WALLS'], [10, 0], [20, 9000], [11, 5000], [21, 9000], [101, 'Embedded Object'], [70, 1], [10, 1], [20, 1],
    [0, 'LINE'], [10, 0], [20, 9000], [11, 0], [21, 9500], [62, 1],
  ];
}

/** BLOCKS section for everyType(): a rack, a cell that places a rack, a block that places itself. */
function everyTypeFile(): string {
  const blocks: Groups = [
    [0, 'SECTION'], [2, 'BLOCKS'],
    [0, 'BLOCK'], [8, '0'], [2, 'RACK'], [70, 0], [10, 0], [20, 0], [30, 0],
    [0, 'LWPOLYLINE'], [8, '0'], [90, 4], [70, 1], [10, 0], [20, 0], [10, 2700], [20, 0], [10, 2700], [20, 1100], [10, 0], [20, 1100],
    [0, 'LINE'], [8, 'SHELVES'], [10, 0], [20, 550], [11, 2700], [21, 550],
    [0, 'ENDBLK'],
    [0, 'BLOCK'], [8, '0'], [2, 'CELL'], [70, 2], [10, 500], [20, 500], [30, 0],
    [0, 'CIRCLE'], [8, '0'], [10, 1000], [20, 1000], [40, 400],
    [0, 'INSERT'], [8, '0'], [2, 'RACK'], [10, 600], [20, 600], [41, 0.5], [42, 0.5],
    [0, 'ATTDEF'], [8, '0'], [10, 0], [20, 0], [2, 'NAME'],
    [0, 'ENDBLK'],
    [0, 'BLOCK'], [8, '0'], [2, 'SELF'], [70, 0], [10, 0], [20, 0],
    [0, 'LINE'], [8, '0'], [10, 0], [20, 0], [11, 100], [21, 100],
    [0, 'INSERT'], [8, '0'], [2, 'SELF'], [10, 50], [20, 0],
    [0, 'ENDBLK'],
    [0, 'ENDSEC'],
  ];
  const text = entitiesDxf(everyType());
  const at = text.indexOf('0\nSECTION\n2\nENTITIES\n');
  return text.slice(0, at) + rawDxf(blocks) + text.slice(at);
}

/** A generated plan of many pieces (the parser reads the section in pieces of ENTITY_CHUNK_CHARS). */
function largePlan(): string {
  const w = new DxfWriter().insunits(4);
  w.layer('OUTLINE', 5).layer('WALLS', 8).layer('RACKS', 4).layer('MACHINES', 6).layer('TEXT', 2);
  w.block('RACK', [0, 0], (b) => {
    b.polyline('0', [[0, 0], [2700, 0], [2700, 1100], [0, 1100]], true);
    b.line('0', [0, 550], [2700, 550]);
  });
  w.polyline('OUTLINE', [[0, 0], [80_000, 0], [80_000, 60_000], [0, 60_000]], true);
  for (let k = 0; k < 4000; k++) {
    const x = (k % 80) * 1000;
    const y = Math.floor(k / 80) * 1000;
    if (k % 2) w.line('WALLS', [x, y], [x + 1000, y]);
    else w.line('WALLS', [x, y], [x, y + 1000]);
  }
  for (let k = 0; k < 800; k++) w.polyline('MACHINES', [[(k % 40) * 900, 52_000 + Math.floor(k / 40) * 300, 0.4], [(k % 40) * 900 + 600, 52_000 + Math.floor(k / 40) * 300]], false);
  for (let k = 0; k < 600; k++) w.arc('MACHINES', [(k % 30) * 1500, 20_000 + Math.floor(k / 30) * 1500], 400 + (k % 5) * 37.5, k % 360, (k % 360) + 100);
  for (let k = 0; k < 400; k++) w.circle('MACHINES', [(k % 20) * 2000, 45_000 + Math.floor(k / 20) * 300], 90 + (k % 3) * 10.25);
  for (let k = 0; k < 500; k++) w.insert('RACKS', 'RACK', [(k % 25) * 3000, 30_000 + Math.floor(k / 25) * 600], { rotation: (k * 13) % 360, columns: 1 + (k % 2), columnSpacing: 2800 });
  for (let k = 0; k < 500; k++) w.text('TEXT', [(k % 50) * 1500, 58_000 + Math.floor(k / 50) * 150], 100, `Bay ${k}`);
  return w.toString();
}

describe('reading the ENTITIES section off the text gives what the parser gives', () => {
  it('every sample floor plan, with its own unit, another unit and other tolerances', () => {
    for (const file of Object.values(SAMPLE_FILES)) {
      const text = readSample(file);
      const r = expectSame(text);
      expect('result' in r).toBe(true);
      expect(streamsWhole(text)).toBe(true);
      expectSame(text, { units: 'in' });
      expectSame(text, { chordToleranceMm: 0.05, joinToleranceMm: 5 });
      expectSame(text.replace(/\n/g, '\r\n'));
    }
  });

  it('every entity type the import reads, counts or leaves out, with blocks, arrays, mirrors and odd groups', () => {
    const r = expectSame(everyTypeFile());
    expect('result' in r).toBe(true);
    expect(streamsWhole(everyTypeFile())).toBe(true);
    if (!('result' in r)) return;
    const result = r.result as { stats: { skipped: Record<string, number> }; warnings: string[]; geometry: { features: unknown[] } };
    // the file reaches every path: skipped kinds, block notes and labels show up in the result
    expect(Object.keys(result.stats.skipped)).toEqual(expect.arrayContaining(['HATCH (not supported)', 'CIRCLE (zero size)', 'TEXT (empty)', 'LINE (invisible)', 'LINE (on a paper-space layout)']));
    expect(result.warnings.join(' ')).toMatch(/NOWHERE/);
    expect(result.warnings.join(' ')).toMatch(/SELF/);
  });

  it('a large plan read in many pieces', () => {
    const text = largePlan();
    expect(text.length).toBeGreaterThan(2 * ENTITY_CHUNK_CHARS);
    expect(streamsWhole(text)).toBe(true);
    const r = expectSame(text);
    expect('result' in r).toBe(true);
  });

  it('the same error where a bad coordinate and a broken point lie in one piece, and in different pieces', () => {
    const bad: Groups = [[0, 'LINE'], [8, 'WALLS'], [10, '1e300'], [20, 0], [11, 0], [21, 0]];
    const broken: Groups = [[0, 'LINE'], [8, 'WALLS'], [10, 0], [30, 0], [11, 5], [21, 5]];
    const one = expectSame(entitiesDxf([...lineGroups('WALLS', [0, 0], [1, 0]), ...bad, ...broken]));
    // the parser reads the whole piece before drawing: the broken point is what it reports
    expect('error' in one && one.error.message).toMatch(/x coordinate without its y/);
    const filler: Groups = [];
    for (let i = 0; filler.length < (ENTITY_CHUNK_CHARS / 20) * 8; i++) filler.push(...lineGroups('WALLS', [i, 0], [i, 1000]));
    const apart = expectSame(entitiesDxf([...bad, ...filler, ...broken]));
    expect('error' in apart && apart.error.code).toBe('bad-coordinates');
    expectSame(entitiesDxf([...filler, ...broken]));
    expectSame(entitiesDxf([...broken, ...filler]));
  });

  it('files the stream reader hands to the parser: points written x, x, y, y and values the scan repaired', () => {
    const old = expectSame(entitiesDxf([[0, 'LINE'], [8, 'WALLS'], [10, 0], [11, 5000], [20, 0], [21, 0], ...lineGroups('WALLS', [0, 0], [0, 10])]));
    expect('result' in old && JSON.stringify(old.result)).toMatch(/old order/);
    expectSame(entitiesDxf([...lineGroups('WALLS', [0, 0], [0, 10]), [0, 'LINE'], [8, 'WALLS'], [290, 7], [10, 0], [20, 0], [11, 1], [21, 1]]));
    expectSame(entitiesDxf([[0, 'LWPOLYLINE'], [8, 'WALLS'], [90, 0], [10, 0], [20, 0], [10, 100], [20, 0]]));
    expectSame(entitiesDxf([[0, 'LWPOLYLINE'], [8, 'WALLS'], [90, 2], [10, 0], [20, 0], [10, 100], [20, 0], [10, 100], [20, 100], [10, 0], [20, 100]]));
  });

  it('numbers as the parser reads them: signs, exponents, long decimals, blanks, junk after the digits', () => {
    const values = ['-0', '+12.5', '.5', '7.', '1e3', '-2.5E-2', '0.1000000000000000055511151231257827', '123456789012345678', '  42  ', '3.14abc', '0x10', '1_000'];
    for (const v of values) {
      const text = entitiesDxf([...lineGroups('WALLS', [0, 0], [1000, 0]), [0, 'LINE'], [8, 'WALLS'], [10, v], [20, 10], [11, 2000], [21, v], [0, 'INSERT'], [2, 'NONE'], [10, 0], [20, 0], [70, v]]);
      expectSame(text);
      expect(streamsWhole(text)).toBe(true);
    }
  });

  it('values read as parseFloat and parseInt read them (the stream reader parses plain decimals itself)', () => {
    const fixed = ['0.3', '-0.1', '1.1', '2.675', '123.456', '-2.7', '0.000001', '99999999999.9999', '4503599627370497', '9007199254740993',
      '-0', '+0', '1e21', '5e-324', '.', '-', '', ' ', '1.2.3', '12 34', '\u00a07', 'NaN', 'Infinity', '0x1f', '08', '1_0'];
    const check = (v: string) => {
      const r = new GroupReader(`10\n${v}\n70\n${v}\n`, 0);
      r.next();
      expect(Object.is(r.float(), Number.parseFloat(v.trim())), `float ${JSON.stringify(v)}`).toBe(true);
      r.next();
      expect(Object.is(r.int(), Number.parseInt(v.trim())), `int ${JSON.stringify(v)}`).toBe(true);
    };
    fixed.forEach(check);
    const decimal = fc
      .tuple(fc.constantFrom('', '-', '+', ' '), fc.stringMatching(/^\d{0,12}$/), fc.constantFrom('', '.'), fc.stringMatching(/^\d{0,12}$/), fc.constantFrom('', ' ', '\t'))
      .map((p) => p.join(''));
    fc.assert(fc.property(fc.oneof(decimal, fc.double().map(String)), (v) => check(v)), { numRuns: 3000 });
  });

  it('damaged samples and damaged every-type files give the same result or the same error (400 runs)', () => {
    const samples = [...Object.values(SAMPLE_FILES).map((f) => readSample(f)), everyTypeFile()].map((t) => t.split('\n'));
    fc.assert(
      fc.property(fc.nat({ max: samples.length - 1 }), fc.array(mutation, { minLength: 1, maxLength: 6 }), (which, ops) => {
        expectSame(mutate(samples[which], ops));
      }),
      { numRuns: 400 },
    );
  }, 120_000);
});
