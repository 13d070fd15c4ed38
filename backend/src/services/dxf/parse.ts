import DxfParser from 'dxf-parser';
import { DxfImportError } from './errors';
import { findBrokenPoint } from './groupScan';

/** A group as dxf-parser's scanner hands it to entity handlers. */
interface Group {
  code: number;
  value: number | string | boolean;
}
interface Scanner {
  next(): Group;
  isEOF(): boolean;
  rewind(n?: number): void;
  lastReadGroup: Group;
}
type Loose = Record<string, unknown>;

/** Same reading (and same error text) as dxf-parser's own point helper. */
function readPoint(scanner: Scanner, curr: Group): { x: number; y: number; z?: number } {
  const code = curr.code;
  const p: { x: number; y: number; z?: number } = { x: curr.value as number, y: Number.NaN };
  let g = scanner.next();
  if (g.code !== code + 10) {
    throw new Error(`Expected code for point value to be ${code + 10} but got ${g.code}.`);
  }
  p.y = g.value as number;
  g = scanner.next();
  if (g.code !== code + 20) {
    scanner.rewind();
    return p;
  }
  p.z = g.value as number;
  return p;
}

/** Common entity groups, read as dxf-parser reads them; false when the group is not one. */
function readCommon(e: Loose, curr: Group, scanner: Scanner): boolean {
  switch (curr.code) {
    case 5:
      e.handle = curr.value;
      return true;
    case 8:
      e.layer = curr.value;
      return true;
    case 60:
      e.visible = curr.value === 0;
      return true;
    case 62:
      e.colorIndex = curr.value;
      return true;
    case 67:
      e.inPaperSpace = curr.value !== 0;
      return true;
    case 101: {
      // Embedded object (DXF 2018): skip to the next entity, as dxf-parser does.
      let g = curr;
      while (g.code !== 0) g = scanner.next();
      scanner.rewind();
      return true;
    }
    default:
      return false;
  }
}

/** Reads one entity: `onGroup` handles the entity's own groups, the rest are common ones. */
function readEntity(scanner: Scanner, first: Group, onGroup: (e: Loose, g: Group) => boolean): Loose {
  const e: Loose = { type: first.value };
  let curr = scanner.next();
  while (!scanner.isEOF()) {
    if (curr.code === 0) break;
    if (!onGroup(e, curr)) readCommon(e, curr, scanner);
    curr = scanner.next();
  }
  return e;
}

function extrusion(e: Loose, g: Group): boolean {
  if (g.code === 210) e.extrusionDirectionX = g.value;
  else if (g.code === 220) e.extrusionDirectionY = g.value;
  else if (g.code === 230) e.extrusionDirectionZ = g.value;
  else return false;
  return true;
}

/*
 * dxf-parser 1.1.2 drops the extrusion direction of CIRCLE, TEXT and ELLIPSE and the weights
 * of SPLINE; these handlers read the same groups as its own plus those.
 */
class CircleHandler {
  ForEntityName = 'CIRCLE' as const;
  parseEntity(scanner: Scanner, curr: Group): Loose {
    return readEntity(scanner, curr, (e, g) => {
      if (g.code === 10) e.center = readPoint(scanner, g);
      else if (g.code === 40) e.radius = g.value;
      else return extrusion(e, g);
      return true;
    });
  }
}

class TextHandler {
  ForEntityName = 'TEXT' as const;
  parseEntity(scanner: Scanner, curr: Group): Loose {
    return readEntity(scanner, curr, (e, g) => {
      switch (g.code) {
        case 10:
          e.startPoint = readPoint(scanner, g);
          return true;
        case 11:
          e.endPoint = readPoint(scanner, g);
          return true;
        case 40:
          e.textHeight = g.value;
          return true;
        case 41:
          e.xScale = g.value;
          return true;
        case 50:
          e.rotation = g.value;
          return true;
        case 1:
          e.text = g.value;
          return true;
        case 72:
          e.halign = g.value;
          return true;
        case 73:
          e.valign = g.value;
          return true;
        default:
          return extrusion(e, g);
      }
    });
  }
}

class EllipseHandler {
  ForEntityName = 'ELLIPSE' as const;
  parseEntity(scanner: Scanner, curr: Group): Loose {
    return readEntity(scanner, curr, (e, g) => {
      switch (g.code) {
        case 10:
          e.center = readPoint(scanner, g);
          return true;
        case 11:
          e.majorAxisEndPoint = readPoint(scanner, g);
          return true;
        case 40:
          e.axisRatio = g.value;
          return true;
        case 41:
          e.startAngle = g.value;
          return true;
        case 42:
          e.endAngle = g.value;
          return true;
        default:
          return extrusion(e, g);
      }
    });
  }
}

class SplineHandler {
  ForEntityName = 'SPLINE' as const;
  parseEntity(scanner: Scanner, curr: Group): Loose {
    const push = (e: Loose, key: string, v: unknown) => {
      const list = (e[key] as unknown[] | undefined) ?? [];
      list.push(v);
      e[key] = list;
    };
    return readEntity(scanner, curr, (e, g) => {
      switch (g.code) {
        case 10:
          push(e, 'controlPoints', readPoint(scanner, g));
          return true;
        case 11:
          push(e, 'fitPoints', readPoint(scanner, g));
          return true;
        case 12:
          e.startTangent = readPoint(scanner, g);
          return true;
        case 13:
          e.endTangent = readPoint(scanner, g);
          return true;
        case 40:
          push(e, 'knotValues', g.value);
          return true;
        case 41:
          push(e, 'weights', g.value);
          return true;
        case 70: {
          const f = Number(g.value);
          e.closed = (f & 1) !== 0;
          e.periodic = (f & 2) !== 0;
          e.rational = (f & 4) !== 0;
          return true;
        }
        case 71:
          e.degreeOfSplineCurve = g.value;
          return true;
        case 210:
          e.normalVector = readPoint(scanner, g);
          return true;
        default:
          return false;
      }
    });
  }
}

/**
 * Entity types dxf-parser drops without a trace; read here as their type, layer, paper-space
 * flag and visibility only, so that each placed copy (also inside blocks) is counted.
 */
const COUNTED_ONLY = ['HATCH', 'VIEWPORT', 'WIPEOUT', 'IMAGE', 'LEADER', 'MLEADER', 'MULTILEADER', 'REGION', '3DSOLID', 'BODY', 'RAY', 'XLINE', 'TOLERANCE', 'OLE2FRAME', 'ACAD_PROXY_ENTITY', 'ARC_DIMENSION', 'SHAPE', 'TRACE', 'MLINE', 'SURFACE', 'MESH', 'HELIX', 'LIGHT', 'SECTION', 'UNDERLAY', 'PDFUNDERLAY', 'DGNUNDERLAY', 'DWFUNDERLAY'] as const;
export const COUNTED_ONLY_TYPES: ReadonlySet<string> = new Set(COUNTED_ONLY);

function countedOnlyHandler(type: string) {
  return class {
    ForEntityName = type;
    parseEntity(scanner: Scanner, curr: Group): Loose {
      return readEntity(scanner, curr, (_e, g) => g.code !== 8 && g.code !== 60 && g.code !== 67 && g.code !== 101);
    }
  };
}

/** The parsed drawing as the import engine reads it (loose: a damaged file may lack anything). */
export interface ParsedDxf {
  header?: Record<string, unknown>;
  entities?: Loose[];
  blocks?: Record<string, Loose>;
  tables?: { layer?: { layers?: Record<string, Loose> } };
  /** True when coordinates had to be put in x, y, z order first (old files write 10, 11, 20, 21). */
  pointsReordered?: boolean;
}

const CONSOLE_METHODS = ['log', 'warn', 'error', 'info', 'debug', 'trace'] as const;

/** A dxf-parser with the extra entity handlers of this module. */
export function createParser(): DxfParser {
  const parser = new DxfParser();
  for (const H of [CircleHandler, TextHandler, EllipseHandler, SplineHandler, ...COUNTED_ONLY.map(countedOnlyHandler)]) {
    parser.registerEntityHandler(H as unknown as Parameters<DxfParser['registerEntityHandler']>[0]);
  }
  return parser;
}

const GENERIC =
  'The structure of the file could not be read; it may be damaged, or written by a program that does not follow the DXF format';

/**
 * Parses checked DXF text (see scanGroups) with dxf-parser, its console output silenced, and
 * turns every failure into a DxfImportError; `lastLine` is where a cut-off file ends and
 * `wholeFile` the file `text` was cut from (for line numbers).
 */
export function parseDxfText(text: string, lastLine: number, wholeFile: string = text): ParsedDxf {
  const saved = CONSOLE_METHODS.map((m) => console[m]);
  const quiet = () => undefined;
  for (const m of CONSOLE_METHODS) console[m] = quiet;
  let dxf: unknown;
  let reordered = false;
  try {
    try {
      dxf = createParser().parseSync(text);
    } catch (err) {
      // Old files may write a point's groups as 10, 11, 20, 21: put them in order and try once more.
      const msg = err instanceof Error ? err.message : '';
      if (!msg.startsWith('Expected code for point value')) throw err;
      const fixed = reorderPointGroups(text);
      if (fixed === null) throw err;
      try {
        dxf = createParser().parseSync(fixed);
        reordered = true;
      } catch {
        throw err;
      }
    }
  } catch (err) {
    throw toImportError(err, wholeFile, lastLine);
  } finally {
    CONSOLE_METHODS.forEach((m, i) => (console[m] = saved[i] as typeof console.log));
  }
  if (dxf === null || typeof dxf !== 'object') throw new DxfImportError('parse-error', `${GENERIC}.`);
  const d = dxf as ParsedDxf;
  if (reordered) d.pointsReordered = true;
  if (!d.header && !d.entities && !d.blocks && !d.tables) {
    throw new DxfImportError(
      'parse-error',
      'No HEADER, BLOCKS or ENTITIES section could be read from the file; its group codes may be damaged.',
    );
  }
  return d;
}

/**
 * The text with each object's coordinate groups in the order the parser needs: every x
 * (codes 10–18) directly followed by its y (+10) and z (+20). Null when nothing had to move.
 */
export function reorderPointGroups(text: string): string | null {
  const lines = text.split('\n');
  const out: string[] = [];
  let moved = false;
  let i = 0;
  while (i + 1 < lines.length) {
    // one object: from a code-0 group up to the next
    let j = i + 2;
    while (j + 1 < lines.length && lines[j].trim() !== '0') j += 2;
    const codes: number[] = [];
    for (let k = i; k < j; k += 2) codes.push(Number.parseInt(lines[k], 10));
    const used = new Uint8Array(codes.length);
    let placed = 0;
    const put = (k: number) => {
      used[k] = 1;
      if (k !== placed++) moved = true;
      out.push(lines[i + 2 * k], lines[i + 2 * k + 1]);
    };
    for (let a = 0; a < codes.length; a++) {
      if (used[a]) continue;
      put(a);
      const c = codes[a];
      if (!(c >= 10 && c <= 18)) continue;
      for (const want of [c + 10, c + 20]) {
        // the partner before this point's x comes again (the next point of the object)
        let b = a + 1;
        while (b < codes.length && (used[b] || codes[b] !== want) && codes[b] !== c) b++;
        if (b >= codes.length || codes[b] !== want) break;
        put(b);
      }
    }
    i = j;
  }
  if (!moved) return null;
  for (; i < lines.length; i++) out.push(lines[i]);
  return out.join('\n');
}

function toImportError(err: unknown, text: string, lastLine: number): DxfImportError {
  const msg = err instanceof Error ? err.message : String(err);
  if (msg === 'Empty file') {
    return new DxfImportError('empty', 'The file is empty. Upload the floor plan as an ASCII DXF file.');
  }
  if (msg.startsWith('Unexpected end of input')) {
    return new DxfImportError(
      'parse-error',
      `The file ends before its end marker (EOF) in the middle of a section: it looks cut off (line ${lastLine}).`,
      lastLine,
    );
  }
  if (msg.startsWith("Cannot call 'next' after EOF")) {
    return new DxfImportError(
      'parse-error',
      'The end-of-file marker (EOF) comes before the drawing is complete; the file may be damaged.',
    );
  }
  const point = /^Expected code for point value to be (-?\d+) but got (-?\d+|NaN)/.exec(msg);
  if (point) {
    const want = Number(point[1]);
    const line = findBrokenPoint(text, want - 10, Number(point[2]));
    const where = line === undefined ? '' : ` (line ${line})`;
    return new DxfImportError(
      'parse-error',
      `A point in the file has an x coordinate without its y coordinate${where}; the file may be damaged.`,
      line,
    );
  }
  if (msg.startsWith('n must be greater than 0')) {
    return new DxfImportError(
      'parse-error',
      'An LWPOLYLINE lists vertices without saying how many it has; the file may be damaged.',
    );
  }
  return new DxfImportError('parse-error', `${GENERIC}.`);
}
