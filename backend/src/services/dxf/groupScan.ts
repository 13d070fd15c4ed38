import { DxfImportError } from './errors';

/** What one pass over the group codes of a DXF text found. */
export interface GroupScan {
  /** Entity types met in the ENTITIES section and in blocks (not the layout blocks), with counts. */
  entityTypes: Map<string, number>;
  /** True when a 0/EOF group ends the file. */
  hasEof: boolean;
  /** True when the last group of a file without EOF closes a section (0/ENDSEC). */
  endsAfterSection: boolean;
  /** Number of the last line read (1-based). */
  lastLine: number;
  /** Names of the sections in file order. */
  sections: string[];
  /**
   * Where the file's one ENTITIES section lies (character offsets of line starts): its body
   * from `start` to `end` (the 0/ENDSEC line), cut at `cuts` into pieces of about
   * ENTITY_CHUNK_CHARS that each begin with a top-level entity. Null when the file has no
   * ENTITIES section, more than one, or one without its ENDSEC.
   */
  entities: { start: number; end: number; cuts: number[] } | null;
  /** LAYER table records as written in the file (flags and colour read here, not by the parser). */
  layers: Map<string, RawLayer>;
  /** $INSUNITS and $MEASUREMENT as written in the HEADER (null when absent or not a number). */
  headerUnits: { insunits: number | null; measurement: number | null };
  /**
   * Changes that let the parser read the file, in file order and not overlapping: values of
   * boolean groups (290–299) written as other whole numbers, set to 0 or 1; block definitions
   * without a name (which nothing can insert) left out.
   */
  edits: TextEdit[];
  /** Boolean group values that were not 0 or 1, and block definitions without a name. */
  repaired: { booleans: number; unnamedBlocks: number };
}

/** A LAYER table record: group 70 flags (bit 1 = frozen) and group 62 colour (negative = off). */
export interface RawLayer {
  flags: number;
  color: number | null;
}

/** Replace text[start, end) by `text`. */
export interface TextEdit {
  start: number;
  end: number;
  text: string;
}

/** text[from, to) with the edits that lie inside it applied (edits in file order). */
export function sliceWithEdits(text: string, from: number, to: number, edits: readonly TextEdit[]): string {
  let out = '';
  let at = from;
  for (const e of edits) {
    if (e.start < from || e.end > to) continue;
    out += text.slice(at, e.start) + e.text;
    at = e.end;
  }
  return out + text.slice(at, to);
}

/** Size of the pieces the ENTITIES section is parsed in (characters). */
export const ENTITY_CHUNK_CHARS = 250_000;
/** Code-0 groups that continue the entity before them (no piece may start with one). */
const CONTINUATION = new Set(['VERTEX', 'SEQEND', 'ATTRIB', 'ENDSEC', 'EOF']);

/** Types that mark structure rather than an entity of their own. */
const STRUCTURAL = new Set(['BLOCK', 'ENDBLK', 'ENDSEC', 'SEQEND', 'VERTEX', 'EOF', 'SECTION']);
/** Group codes that may follow an LWPOLYLINE vertex x (code 10) without confusing the parser. */
const LW_VERTEX_CODES = new Set([0, 10, 20, 30, 40, 41, 42]);

function fail(message: string, line: number): never {
  throw new DxfImportError('parse-error', `${message} (line ${line}).`, line);
}

/**
 * Reads the file as dxf-parser will (pairs of lines: group code, value) and checks the few
 * structures on which that parser would loop for ever or run out of memory: a LAYER or VPORT
 * table holding a foreign record, a POLYLINE not closed by SEQEND, an LWPOLYLINE vertex whose x is
 * not followed by its y, or an LWPOLYLINE declaring more vertices than it lists. Every group code
 * must be a whole number. Also counts entity types per section, so that the types the parser
 * drops silently (HATCH, …) can be reported. `text` uses "\n" line ends (see sniffDxf).
 */
export function scanGroups(text: string): GroupScan {
  const entityTypes = new Map<string, number>();
  const sections: string[] = [];
  const len = text.length;
  let pos = 0;
  let line = 1; // line number of the current code line
  let section: string | null = null;
  let expectSectionName = false;
  let expectTableName = false;
  let tableGuard: string | null = null;
  let tableLine = 0;
  let polylineLine = 0; // > 0 while inside POLYLINE … SEQEND
  let inLw = false;
  let lwLine = 0;
  let lwDeclared = -1;
  let lwCount = 0;
  let prevLw10 = false;
  let lastCode0 = '';
  let lastWasCode0 = false;
  let hasEof = false;
  let entitiesSeen = 0;
  let inEntities = false; // inside the first ENTITIES section
  let entStart = -1;
  let entEnd = -1;
  let lastCut = 0;
  const cuts: number[] = [];
  let expectBlockName = false;
  let blockName = '';
  let countBlock = true; // false inside the *Model_Space / *Paper_Space blocks
  let blockPos = 0; // where the current block's 0/BLOCK group starts
  let dropFrom = -1; // start of an unnamed block being left out, until the group after its ENDBLK
  let dropEnding = false;
  const layers = new Map<string, RawLayer>();
  let layerRec: { name: string; flags: number; color: number | null } | null = null;
  let headerVar = '';
  const headerUnits: GroupScan['headerUnits'] = { insunits: null, measurement: null };
  const edits: TextEdit[] = [];
  const repaired = { booleans: 0, unnamedBlocks: 0 };
  const endLayer = () => {
    if (layerRec && layerRec.name !== '') layers.set(layerRec.name, { flags: layerRec.flags, color: layerRec.color });
    layerRec = null;
  };

  while (pos < len) {
    const codeEnd0 = text.indexOf('\n', pos);
    const codeEnd = codeEnd0 === -1 ? len : codeEnd0;
    // Parse the group code: optional blanks, optional minus, digits, optional blanks.
    let i = pos;
    while (i < codeEnd && (text.charCodeAt(i) === 32 || text.charCodeAt(i) === 9)) i++;
    let neg = false;
    if (i < codeEnd && text.charCodeAt(i) === 45) {
      neg = true;
      i++;
    }
    let code = 0;
    let digits = 0;
    while (i < codeEnd) {
      const c = text.charCodeAt(i);
      if (c < 48 || c > 57) break;
      code = code * 10 + (c - 48);
      digits++;
      i++;
    }
    while (i < codeEnd && (text.charCodeAt(i) === 32 || text.charCodeAt(i) === 9)) i++;
    if (digits === 0 || i !== codeEnd || digits > 9) {
      if (codeEnd0 === -1 && i === codeEnd && digits === 0) break; // trailing blank line
      const shown = text.slice(pos, Math.min(codeEnd, pos + 40)).trim();
      fail(`Line ${line} should hold a group code (a whole number) but holds "${shown}"`, line);
    }
    if (neg) code = -code;
    if (codeEnd0 === -1) {
      fail('The file ends after a group code without its value: it looks cut off', line);
    }
    const valueStart = codeEnd + 1;
    const valueEnd0 = text.indexOf('\n', valueStart);
    const valueEnd = valueEnd0 === -1 ? len : valueEnd0;
    const codeLine = line;

    // most groups need no look at their value: pass them by
    if (
      code !== 0 && !inLw && !prevLw10 && layerRec === null && !expectSectionName && !expectTableName && !expectBlockName &&
      section !== 'HEADER' && !(code >= 290 && code <= 299)
    ) {
      lastWasCode0 = false;
      line += 2;
      if (valueEnd0 === -1) break;
      pos = valueEnd + 1;
      continue;
    }

    let value: string | null = null;
    const inLayerRec = layerRec !== null && (code === 2 || code === 70 || code === 62);
    const isBool = code >= 290 && code <= 299;
    const needValue =
      code === 0 || expectSectionName || expectTableName || (expectBlockName && code === 2) || (inLw && code === 90) ||
      inLayerRec || isBool || (section === 'HEADER' && (code === 9 || headerVar !== ''));
    if (needValue) value = text.slice(valueStart, valueEnd).trim();

    if (isBool && value !== '0' && value !== '1') {
      // The parser refuses anything but 0 and 1 here; some programs write other whole numbers.
      const n = Number.parseInt(value as string, 10);
      edits.push({ start: valueStart, end: valueEnd, text: Number.isFinite(n) && n !== 0 ? '1' : '0' });
      repaired.booleans++;
    }
    if (inLayerRec && layerRec) {
      const rec: { name: string; flags: number; color: number | null } = layerRec;
      if (code === 2) rec.name = value as string;
      else {
        const n = Number.parseInt(value as string, 10);
        if (code === 70) rec.flags = Number.isFinite(n) ? n : 0;
        else rec.color = Number.isFinite(n) ? n : null;
      }
    }
    if (section === 'HEADER' && code !== 0) {
      if (code === 9) headerVar = value as string;
      else if (headerVar !== '') {
        if (code === 70 && (headerVar === '$INSUNITS' || headerVar === '$MEASUREMENT')) {
          const n = Number.parseInt(value as string, 10);
          if (Number.isFinite(n)) headerUnits[headerVar === '$INSUNITS' ? 'insunits' : 'measurement'] = n;
        }
        headerVar = '';
      }
    }

    if (prevLw10 && !LW_VERTEX_CODES.has(code)) {
      fail('An LWPOLYLINE vertex has an x coordinate without its y coordinate', codeLine);
    }
    prevLw10 = false;

    if (expectSectionName) {
      expectSectionName = false;
      if (code === 2) {
        section = value;
        sections.push(value as string);
        if (value === 'ENTITIES' && ++entitiesSeen === 1 && valueEnd0 !== -1) {
          inEntities = true;
          entStart = lastCut = valueEnd + 1;
        }
      }
    }
    if (expectTableName) {
      expectTableName = false;
      if (value === 'LAYER' || value === 'VPORT') {
        tableGuard = value;
        tableLine = codeLine;
      }
    }

    if (expectBlockName && code === 2) {
      // the parser keeps the last name given before the block's first entity
      blockName = value as string;
      const u = blockName.toUpperCase();
      countBlock = !u.startsWith('*MODEL_SPACE') && !u.startsWith('*PAPER_SPACE');
    }

    if (code === 0) {
      const v = value as string;
      if (inEntities) {
        if (v === 'ENDSEC' || v === 'EOF') {
          inEntities = false;
          if (v === 'ENDSEC') entEnd = pos;
        } else if (polylineLine === 0 && !CONTINUATION.has(v) && pos - lastCut >= ENTITY_CHUNK_CHARS) {
          cuts.push(pos);
          lastCut = pos;
        }
      }
      if (dropEnding) {
        edits.push({ start: dropFrom, end: pos, text: '' });
        dropEnding = false;
        dropFrom = -1;
      }
      // dxf-parser takes a block's name only before the block's first entity, and logs (past
      // any console silencing) when there is none; such a block could never be inserted, so
      // it is left out of what the parser reads.
      if (expectBlockName) {
        if (!blockName) {
          dropFrom = blockPos;
          countBlock = false;
          repaired.unnamedBlocks++;
        }
        expectBlockName = false;
      }
      if (layerRec) endLayer();
      if (v === 'LAYER' && tableGuard === 'LAYER') layerRec = { name: '', flags: 0, color: null };
      if (v === 'BLOCK') {
        blockPos = pos;
        blockName = '';
        expectBlockName = true;
        countBlock = true;
      } else if (v === 'ENDBLK') {
        expectBlockName = false;
        countBlock = true;
        if (dropFrom >= 0) dropEnding = true;
      }
      if (inLw) {
        if (lwDeclared > lwCount) {
          fail(`An LWPOLYLINE declares ${lwDeclared} vertices but lists ${lwCount}`, lwLine);
        }
        inLw = false;
      }
      // (even EOF: the parser's LAYER/VPORT loops stop only at ENDTAB)
      if (tableGuard !== null && v !== tableGuard && v !== 'ENDTAB') {
        fail(`The ${tableGuard} table that starts at line ${tableLine} holds a "${v}" record`, codeLine);
      }
      if (v === 'ENDTAB') tableGuard = null;
      if (polylineLine > 0) {
        if (v === 'SEQEND') polylineLine = 0;
        else if (v !== 'VERTEX' && v !== 'EOF') {
          fail(`The POLYLINE that starts at line ${polylineLine} is not closed by SEQEND`, polylineLine);
        }
      } else if (v === 'POLYLINE') {
        polylineLine = codeLine;
      }
      if (v === 'LWPOLYLINE') {
        inLw = true;
        lwLine = codeLine;
        lwDeclared = -1;
        lwCount = 0;
      }
      if (v === 'SECTION') expectSectionName = true;
      else if (v === 'TABLE') expectTableName = true;
      else if (v === 'ENDSEC') section = null;
      else if ((section === 'ENTITIES' || (section === 'BLOCKS' && countBlock)) && !STRUCTURAL.has(v)) {
        entityTypes.set(v, (entityTypes.get(v) ?? 0) + 1);
      }
      lastCode0 = v;
      lastWasCode0 = true;
      if (v === 'EOF') {
        hasEof = true;
        line += 2;
        break;
      }
    } else {
      lastWasCode0 = false;
      if (inLw) {
        if (code === 90) {
          const n = Number.parseInt(value as string, 10);
          lwDeclared = Number.isFinite(n) ? n : -1;
        } else if (code === 10) {
          lwCount++;
          prevLw10 = true;
        }
      }
    }

    line += 2;
    if (valueEnd0 === -1) break; // the last value ran to the end of the text
    pos = valueEnd + 1;
  }

  return {
    entityTypes,
    hasEof,
    endsAfterSection: !hasEof && lastWasCode0 && lastCode0 === 'ENDSEC',
    lastLine: Math.max(1, line - 1),
    sections,
    entities: entitiesSeen === 1 && entEnd > entStart ? { start: entStart, end: entEnd, cuts } : null,
    layers,
    headerUnits,
    edits,
    repaired,
  };
}

/**
 * Line of the first point whose x (code `xCode`) is followed by `gotCode` instead of its y —
 * where dxf-parser stops with "Expected code for point value to be … but got …".
 */
export function findBrokenPoint(text: string, xCode: number, gotCode: number): number | undefined {
  const lines = text.split('\n');
  let prev = Number.NaN;
  for (let i = 0; i + 1 < lines.length; i += 2) {
    const code = Number.parseInt(lines[i], 10);
    if (prev === xCode && code === gotCode) return i - 1; // 1-based line of the x code
    prev = code;
  }
  return undefined;
}
