import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { WorkPoint } from '@shared/schemas/layout';
import { CAUTIONS, exportNotes } from '@shared/safety';
import { layoutStateWords } from '@shared/words';
import {
  detectDelimiter,
  mergeWorkPoints,
  parseNumberCell,
  parseWorkPointsCsv,
  workPointsToCsv,
} from '../../../frontend/src/components/layout/workPointsCsv';

const HEADER = 'id,x,y,z,approach,tag,assignedArm';
const ARMS = ['R1', 'R2'];
const wp = (p: Partial<WorkPoint> & { id: string }): WorkPoint => WorkPoint.parse({ x: 0, y: 0, z: 0, ...p });

function messagesByRow(text: string, armIds = ARMS) {
  return parseWorkPointsCsv(text, { armIds }).errors.map((e) => `row ${e.row}: ${e.message}`);
}

describe('parseWorkPointsCsv', () => {
  it('reads a plain file into schema-checked points with their spreadsheet row numbers', () => {
    const r = parseWorkPointsCsv(`${HEADER}\nP1,10000,6200,900,top,infeed,R1\nP2,10500.5,6200,900,any,,\n`, { armIds: ARMS });
    expect(r.errors).toEqual([]);
    expect(r.rowCount).toBe(2);
    expect(r.points).toEqual([
      { row: 2, point: { id: 'P1', x: 10000, y: 6200, z: 900, approach: 'top', tag: 'infeed', assignedArm: 'R1' } },
      { row: 3, point: { id: 'P2', x: 10500.5, y: 6200, z: 900, approach: 'any', tag: '' } },
    ]);
    expect(r.notes).toEqual([]);
  });

  it('reports each error kind with its row number and keeps the good rows', () => {
    const lines = [
      HEADER, //                                  row 1
      'P1,1,2,3,top,a,R1', //                      row 2 ok
      'P2,1,2,abc,top,,', //                       row 3 z not a number
      'P3,,2,3,top,,', //                          row 4 x missing
      'P1,5,5,5,top,,', //                         row 5 duplicate id
      'P5,1,2,3,side,,', //                        row 6 bad approach
      'P6,1,2,3,top,,R9', //                       row 7 arm not on layout
      'bad id!,1,2,3,top,,', //                    row 8 id charset (schema message)
      ',1,2,3,top,,', //                           row 9 id missing
      'P9,1,2,3,top,,,extra', //                   row 10 too many values
      'P10,1e3,-2.5,+.5,ANY,,R2', //               row 11 ok (exponent, signs, case)
    ];
    const r = parseWorkPointsCsv(lines.join('\n'), { armIds: ARMS });
    expect(r.errors.map((e) => `row ${e.row}: ${e.message}`)).toEqual([
      'row 3: z is not a number ("abc")',
      'row 4: x is missing',
      'row 5: duplicate id P1 (first on row 2)',
      'row 6: approach must be top or any, not "side"',
      'row 7: assigned arm R9 is not on this cell layout',
      'row 8: Id: use letters, digits, _ . or - only',
      'row 9: id is missing',
      'row 10: has 8 values but the header names 7 columns',
    ]);
    expect(r.points.map((p) => [p.row, p.point.id])).toEqual([[2, 'P1'], [11, 'P10']]);
    expect(r.points[1].point).toMatchObject({ x: 1000, y: -2.5, z: 0.5, approach: 'any', assignedArm: 'R2' });
  });

  it('counts rows as records when a quoted field spans lines, and after blank lines', () => {
    const text = `${HEADER}\nP1,1,2,3,top,"two\nlines",\n\nP2,1,2,x,top,,\n`;
    const r = parseWorkPointsCsv(text);
    // header row 1, P1 row 2 (one record over two lines; a tag is one line of text), blank row 3, P2 row 4
    expect(r.errors).toEqual([
      { row: 2, message: 'Tag: use one line of text without control characters' },
      { row: 4, message: 'z is not a number ("x")' },
    ]);
    expect(r.notes).toContain('Skipped 1 blank row.');
  });

  it('reports a duplicate-id row even when the id repeats further down more than once', () => {
    expect(messagesByRow(`${HEADER}\nP4,1,1,1,,,\nP5,1,1,1,,,\nP4,1,1,1,,,\nP4,2,2,2,,,`)).toEqual([
      'row 4: duplicate id P4 (first on row 2)',
      'row 5: duplicate id P4 (first on row 2)',
    ]);
  });

  it('reads semicolon-separated files with decimal commas and quoted fields', () => {
    // RFC 4180 §2 rules 6–7: a field with the delimiter, a quote or a line break is enclosed in
    // double quotes, and a quote inside is written twice [pub]. Decimal comma with ';' as the
    // separator is how comma-decimal locales write CSV [practice].
    const text = 'id;x;y;z;approach;tag;assignedArm\r\nP1;17250,5;2000;800;top;"case; left ""A""";R1\r\nP2;"18000,25";2100;1100,0;any;;\r\n';
    const r = parseWorkPointsCsv(text, { armIds: ARMS });
    expect(r.delimiter).toBe(';');
    expect(r.errors).toEqual([]);
    expect(r.points.map((p) => p.point)).toEqual([
      { id: 'P1', x: 17250.5, y: 2000, z: 800, approach: 'top', tag: 'case; left "A"', assignedArm: 'R1' },
      { id: 'P2', x: 18000.25, y: 2100, z: 1100, approach: 'any', tag: '' },
    ]);
  });

  it('does not read a decimal comma in a comma-separated file as a number', () => {
    expect(messagesByRow(`${HEADER}\nP1,"12,5",1,1,,,`)).toEqual(['row 2: x is not a number ("12,5")']);
  });

  it('strips a UTF-8 byte order mark before the header', () => {
    // U+FEFF at the start of a UTF-8 text is a byte order mark, not content (Unicode Standard §23.8) [pub]
    const r = parseWorkPointsCsv(`\uFEFF${HEADER}\nP1,1,2,3,top,,`);
    expect(r.errors).toEqual([]);
    expect(r.points[0].point.id).toBe('P1');
  });

  it('reads tab-separated text pasted from a spreadsheet and columns in any order and case', () => {
    const r = parseWorkPointsCsv('Z\tY\tX\tID\tAssigned Arm\n900\t6100\t12000\tP7\tR2\n', { armIds: ARMS });
    expect(r.delimiter).toBe('\t');
    expect(r.errors).toEqual([]);
    expect(r.points[0].point).toEqual({ id: 'P7', x: 12000, y: 6100, z: 900, approach: 'top', tag: '', assignedArm: 'R2' });
  });

  it('ignores unknown columns with a note and notes margin columns separately', () => {
    const r = parseWorkPointsCsv('id,x,y,z,colour,margin R1\nP1,1,2,3,red,55\n');
    expect(r.errors).toEqual([]);
    expect(r.notes).toEqual(['Ignored column not used for work points: "colour".', 'Margin columns (1) are not read: the analysis works margins out again.']);
    expect(r.points[0].point).toEqual({ id: 'P1', x: 1, y: 2, z: 3, approach: 'top', tag: '' });
  });

  it('requires a header row naming id, x, y and z', () => {
    expect(messagesByRow('P1,1,2,3\nP2,4,5,6\n')[0]).toMatch(/^row 1: the first row must name the columns/);
    expect(messagesByRow('id,x,y\nP1,1,2\n')).toEqual(['row 1: missing column z']);
    expect(messagesByRow('id,x,y,z,X\n')).toEqual(['row 1: column x appears twice (columns 2 and 5)']);
    expect(messagesByRow('')).toEqual(['row 1: the file is empty: the first row must name the columns (id, x, y, z …)']);
    expect(parseWorkPointsCsv(`${HEADER}\n`).notes).toEqual(['The file has a header but no work points.']);
  });

  it('reports an unclosed quote on its row', () => {
    const r = parseWorkPointsCsv(`${HEADER}\nP1,1,2,3,top,ok,\nP2,1,2,3,top,"open,\n`);
    expect(r.points.map((p) => p.point.id)).toEqual(['P1']);
    expect(r.errors.length).toBeGreaterThan(0);
    expect(r.errors[0].row).toBe(3);
  });

  it('throws on a non-string argument, naming it', () => {
    expect(() => parseWorkPointsCsv(42 as unknown as string)).toThrow('text must be a string');
  });
});

describe('workPointsToCsv', () => {
  const points = [
    wp({ id: 'P1', x: 10000, y: 6200.5, z: 900, tag: 'infeed, left', assignedArm: 'R1' }),
    wp({ id: 'P2', x: -17250.25, y: 2000, z: 800, approach: 'any', tag: 'says "hi"' }),
    wp({ id: 'P3', x: 1, y: 2, z: 3, tag: '=SUM(A1:A9)' }),
    // Tags are one line now (the schema refuses a line break); the writer still quotes one stored before.
    { ...wp({ id: 'P4', x: 1, y: 2, z: 3 }), tag: 'two\nlines' },
  ];
  const coverage = { P1: { R1: 120.5, R2: -40 }, P2: { R1: -3.2, R2: 0 } };

  it('writes the import columns and one margin column per arm, blank where not analysed', () => {
    const text = workPointsToCsv(points, ARMS, coverage);
    // Read back with papaparse itself as the independent CSV reader.
    const rows = Papa.parse<string[]>(text, { skipEmptyLines: true }).data;
    expect(rows[0]).toEqual(['id', 'x (mm)', 'y (mm)', 'z (mm above floor)', 'approach (top/any)', 'tag', 'assignedArm', 'margin R1 (mm)', 'margin R2 (mm)']);
    expect(rows[1]).toEqual(['P1', '10000', '6200.5', '900', 'top', 'infeed, left', 'R1', '120.5', '-40']);
    expect(rows[2]).toEqual(['P2', '-17250.25', '2000', '800', 'any', 'says "hi"', '', '-3.2', '0']);
    expect(rows[3].slice(7)).toEqual(['', '']);
    // A tag a spreadsheet would run as a formula is prefixed with an apostrophe (OWASP "CSV injection") [practice].
    expect(rows[3][5]).toBe("'=SUM(A1:A9)");
  });

  it('quotes by RFC 4180: delimiter, quote and line break inside fields [pub]', () => {
    const text = workPointsToCsv(points, [], null);
    expect(text).toContain('"infeed, left"');
    expect(text).toContain('"says ""hi"""');
    expect(text).toContain('"two\nlines"');
    expect(text.split('\r\n')[0]).toBe('id,x (mm),y (mm),z (mm above floor),approach (top/any),tag,assignedArm');
  });

  it('round-trips: export then import gives the same points, margins noted and not read', () => {
    const oneLine = points.filter((p) => p.id !== 'P4');
    const back = parseWorkPointsCsv(workPointsToCsv(oneLine, ARMS, coverage), { armIds: ARMS });
    expect(back.errors).toEqual([]);
    expect(back.points.map((p) => p.point)).toEqual(oneLine);
    expect(back.notes).toEqual(['Margin columns (2) are not read: the analysis works margins out again.']);
  });
});

describe('export notes', () => {
  const points = [wp({ id: 'P1', x: 10000, y: 6200.5, z: 900, tag: 'infeed' })];
  const notes = exportNotes({ what: 'work points', layoutName: 'Cell 1', state: layoutStateWords(null), at: new Date('2026-03-04T05:06:07Z') });

  it('opens with what the file is, its state and date, the frame and every caution, each a "# " line', () => {
    const text = workPointsToCsv(points, ARMS, null, notes);
    // Read back with papaparse as the independent CSV reader: each note is one cell.
    const rows = Papa.parse<string[]>(text, { skipEmptyLines: true }).data;
    const noteRows = rows.filter((r) => r[0].startsWith('# '));
    expect(noteRows.every((r) => r.length === 1)).toBe(true);
    expect(noteRows[0][0]).toBe('# Ringfence work points · cell layout Cell 1 · Working copy (not a revision) · exported 2026-03-04 05:06 UTC');
    for (const c of CAUTIONS) expect(noteRows.map((r) => r[0])).toContain(`# ${c}`);
    expect(rows[noteRows.length][0]).toBe('id');
  });

  it('imports again: note lines and unit brackets are read past, row numbers stay the spreadsheet ones', () => {
    const text = workPointsToCsv(points, ARMS, null, notes);
    const back = parseWorkPointsCsv(text, { armIds: ARMS });
    expect(back.errors).toEqual([]);
    expect(back.points.map((p) => p.point)).toEqual(points);
    expect(back.points[0].row).toBe(notes.length + 2);
    // a semicolon file with notes still finds its delimiter from the header line
    expect(detectDelimiter('"# a, b, c"\nid;x;y;z\n')).toBe(';');
  });
});

describe('mergeWorkPoints', () => {
  const existing = [wp({ id: 'P1', x: 1 }), wp({ id: 'P2', x: 2 }), wp({ id: 'P3', x: 3 })];
  const incoming = [wp({ id: 'P2', x: 20 }), wp({ id: 'P9', x: 9 })];

  it('add / update by id keeps order, replaces known ids and appends new ones', () => {
    const m = mergeWorkPoints(existing, incoming, 'merge');
    expect(m.points.map((p) => [p.id, p.x])).toEqual([['P1', 1], ['P2', 20], ['P3', 3], ['P9', 9]]);
    expect([m.added, m.updated, m.removed]).toEqual([1, 1, 0]);
  });

  it('replace all keeps only the file and counts what goes away', () => {
    const m = mergeWorkPoints(existing, incoming, 'replace');
    expect(m.points).toEqual(incoming);
    expect([m.added, m.updated, m.removed]).toEqual([1, 1, 2]);
  });

  it('does not change its inputs', () => {
    const frozen = Object.freeze(existing.map((p) => Object.freeze({ ...p })));
    expect(() => mergeWorkPoints(frozen, Object.freeze([...incoming]), 'merge')).not.toThrow();
    expect(() => mergeWorkPoints(existing, incoming, 'both' as 'merge')).toThrow('mode must be replace or merge');
  });
});

describe('cells', () => {
  it('reads numbers strictly', () => {
    expect(parseNumberCell(' 12.5 ')).toBe(12.5);
    expect(parseNumberCell('1e3')).toBe(1000);
    expect(parseNumberCell('')).toBeNull();
    expect(parseNumberCell('0x10')).toBeNull();
    expect(parseNumberCell('12mm')).toBeNull();
    expect(parseNumberCell('Infinity')).toBeNull();
    expect(parseNumberCell('12,5')).toBeNull();
    expect(parseNumberCell('12,5', true)).toBe(12.5);
    expect(parseNumberCell('1,234,5', true)).toBeNull();
  });

  it('detects the delimiter from the header outside quotes', () => {
    expect(detectDelimiter('id;x;y;z\n1,2')).toBe(';');
    expect(detectDelimiter('"a;b",x,y\n')).toBe(',');
    expect(detectDelimiter('\n\nid\tx\n')).toBe('\t');
    expect(detectDelimiter('id\n')).toBe(',');
  });
});
