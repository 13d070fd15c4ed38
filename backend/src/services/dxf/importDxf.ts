import type { Feature, Geometry, Polygon } from 'geojson';
import type { ImportGaps, ImportLayer, ImportResult, PlanFeatureProps, UnitName } from '@shared/schemas/floorPlan';
import { drawEntities, drawOne, localTolerance, newBlockWalk, type BlockWalk } from './blocks';
import type { DrawContext } from './entities';
import { streamEntities, StreamBail } from './entityStream';
import { DxfImportError } from './errors';
import { checkDrawingUnit } from '@shared/geometry';
import { scanGroups, sliceWithEdits, type GroupScan } from './groupScan';
import { joinPaths, MAX_LISTED_ENDS, type JoinStats } from './join';
import { colorHex, defaultLayerHeight, guessLayerRole } from './layerRoles';
import {
  DEFAULT_CHORD_TOLERANCE_MM,
  DEFAULT_JOIN_TOLERANCE_MM,
  MAX_CHORD_TOLERANCE_MM,
  MAX_SEGMENTS_PER_CURVE,
  MIN_CHORD_TOLERANCE_MM,
} from './limits';
import { ringSelfIntersects } from './outline';
import { localOrigin, moveToOrigin } from './origin';
import { COUNTED_ONLY_TYPES, parseDxfText, type ParsedDxf } from './parse';
import { PlanBuilder } from './planBuilder';
import { decodeDxfBytes, sniffDxf } from './sniff';
import { scaling, type Affine } from './transform';
import { resolveUnits, UNIT_NAMES } from './units';

export interface ImportOptions {
  /** Read the drawing in this unit, whatever its header says. */
  units?: UnitName;
  /** Largest distance between a curve and its polyline, mm (default 1). */
  chordToleranceMm?: number;
  /** Ends of lines and arcs closer than this are joined, mm (default 1). */
  joinToleranceMm?: number;
}

/** Entity types dxf-parser 1.1.2 reads; every other type it drops without a word. */
const PARSER_TYPES = new Set([
  '3DFACE', 'ARC', 'ATTDEF', 'CIRCLE', 'DIMENSION', 'ELLIPSE', 'INSERT', 'LINE', 'LWPOLYLINE', 'MTEXT', 'POINT',
  'POLYLINE', 'SOLID', 'SPLINE', 'TEXT', ...COUNTED_ONLY_TYPES,
]);

/**
 * Entity types a floor plan leaves out on purpose: annotation, fills, views, pictures. (Their
 * outlines, where they matter, are drawn by lines of their own.)
 */
const IGNORED_TYPES = new Set([
  'ATTDEF', 'ATTRIB', 'DIMENSION', 'ARC_DIMENSION', 'LEADER', 'MLEADER', 'MULTILEADER', 'TOLERANCE', 'HATCH', 'WIPEOUT',
  'VIEWPORT', 'IMAGE', 'OLE2FRAME', 'POINT', 'RAY', 'XLINE', 'LIGHT', 'UNDERLAY', 'PDFUNDERLAY', 'DGNUNDERLAY', 'DWFUNDERLAY',
]);
/** Skip reasons that are choices, not failures. */
const IGNORED_REASONS = new Set(['on a paper-space layout', 'invisible', 'zero size', 'empty', 'on a layer that is off or frozen']);

/** True when a skipped-count key ("HATCH (not supported)") was left out on purpose. */
function ignoredOnPurpose(key: string): boolean {
  const m = /^(.*?) \((.*)\)$/.exec(key);
  if (!m) return false;
  return IGNORED_REASONS.has(m[2]) || (m[2] === 'not supported' && IGNORED_TYPES.has(m[1]));
}

/** A file's HEADER section cut out (for a header the parser cannot read); null when it has none. */
function withoutHeader(text: string): string | null {
  const start = /(^|\n)[ \t]*0[ \t]*\n[ \t]*SECTION[ \t]*\n[ \t]*2[ \t]*\n[ \t]*HEADER[ \t]*\n/.exec(text);
  if (!start) return null;
  const from = start.index + start[1].length;
  const end = /\n[ \t]*0[ \t]*\n[ \t]*ENDSEC[ \t]*\n/g;
  end.lastIndex = from;
  const m = end.exec(text);
  if (!m) return null;
  return text.slice(0, from) + text.slice(m.index + m[0].length);
}

interface DrawnPlan {
  builder: PlanBuilder;
  walk: BlockWalk;
  curves: { capped: number };
  /** True when coordinates had to be put in x, y, z order first (see parseDxfText). */
  reordered: boolean;
}

/**
 * Draws the drawing's entities (blocks placed) into a new PlanBuilder. The one plain ENTITIES
 * section is streamed when `reading` is 'stream' and no repair of scanGroups lies inside it, else
 * (or when the stream reader stops) parsed in pieces, each drawn and dropped before the next is
 * parsed; a file whose ENTITIES section is not plain is drawn from the whole parse.
 */
function drawPlan(text: string, scan: GroupScan, dxf: ParsedDxf, root: Affine, chordTol: number, reading: EntityReading): DrawnPlan {
  const span = scan.entities;
  const edits = scan.edits;
  const plan = (): DrawnPlan & { ctx: DrawContext } => {
    const curves = { capped: 0 };
    return {
      builder: new PlanBuilder(),
      walk: newBlockWalk(dxf.blocks, chordTol),
      curves,
      reordered: dxf.pointsReordered === true,
      ctx: { m: root, tol: localTolerance(root, chordTol), layer: '0', curves },
    };
  };
  if (span && reading === 'stream' && !edits.some((e) => e.end > span.start && e.start < span.end)) {
    const p = plan();
    if (streamSection(text, span, (e) => drawOne(e, p.ctx, [], p.walk, p.builder))) return p;
  }
  const p = plan();
  if (span) {
    const bounds = [span.start, ...span.cuts, span.end];
    for (let i = 0; i + 1 < bounds.length; i++) {
      const piece = `0\nSECTION\n2\nENTITIES\n${sliceWithEdits(text, bounds[i], bounds[i + 1], edits)}0\nENDSEC\n0\nEOF\n`;
      const part = parseDxfText(piece, scan.lastLine, text);
      if (part.pointsReordered) p.reordered = true;
      drawEntities(Array.isArray(part.entities) ? part.entities : [], p.ctx, [], p.walk, p.builder);
    }
  } else {
    drawEntities(Array.isArray(dxf.entities) ? dxf.entities : [], p.ctx, [], p.walk, p.builder);
  }
  return p;
}

/**
 * Streams the ENTITIES section through `draw`; false when the stream reader stopped (the section
 * must then be parsed). An error of drawing is thrown only when the parser would have read the
 * piece it lies in: the parser reads a whole piece before drawing any of it, so a piece it cannot
 * read fails before an error of drawing within it.
 */
function streamSection(text: string, span: NonNullable<GroupScan['entities']>, draw: (e: Record<string, unknown>) => void): boolean {
  let at = span.start;
  try {
    streamEntities(text, span.start, (e, offset) => {
      at = offset;
      draw(e);
    });
    return true;
  } catch (err) {
    if (err instanceof StreamBail) return false;
    const pieceEnd = span.cuts.find((c) => c > at) ?? span.end;
    try {
      streamEntities(text, at, () => undefined, pieceEnd);
    } catch (inner) {
      if (inner instanceof StreamBail) return false;
      throw inner;
    }
    throw err;
  }
}

/** The parser's header, or one made of the raw $INSUNITS and $MEASUREMENT when it has none. */
function headerOf(dxf: ParsedDxf, scan: GroupScan): Record<string, unknown> | undefined {
  if (dxf.header && typeof dxf.header === 'object') return dxf.header;
  const h: Record<string, unknown> = {};
  if (scan.headerUnits.insunits !== null) h.$INSUNITS = scan.headerUnits.insunits;
  if (scan.headerUnits.measurement !== null) h.$MEASUREMENT = scan.headerUnits.measurement;
  return Object.keys(h).length ? h : undefined;
}

type PlanFeature = Feature<Geometry, PlanFeatureProps>;
type Loose = Record<string, unknown>;

function checkOptions(opts: ImportOptions): void {
  if (opts.units !== undefined && !UNIT_NAMES.some((u) => u.name === opts.units)) {
    throw new RangeError(`units: unknown unit "${String(opts.units)}"`);
  }
  const t = opts.chordToleranceMm;
  if (t !== undefined && !(t >= MIN_CHORD_TOLERANCE_MM && t <= MAX_CHORD_TOLERANCE_MM)) {
    throw new RangeError(`chordToleranceMm: must lie between ${MIN_CHORD_TOLERANCE_MM} and ${MAX_CHORD_TOLERANCE_MM} mm`);
  }
  const j = opts.joinToleranceMm;
  if (j !== undefined && !(j >= 0 && j <= MAX_CHORD_TOLERANCE_MM)) {
    throw new RangeError(`joinToleranceMm: must lie between 0 and ${MAX_CHORD_TOLERANCE_MM} mm`);
  }
}

function plural(n: number, one: string, many: string): string {
  return `${n} ${n === 1 ? one : many}`;
}

/** "3 HATCH entities were skipped (not supported)." from a skipped-count key "HATCH (not supported)". */
function skippedSentence(key: string, n: number): string {
  const m = /^(.*?) \((.*)\)$/.exec(key);
  const type = m ? m[1] : key;
  const reason = m ? m[2] : 'not supported';
  return `${n} ${type} ${n === 1 ? 'entity was' : 'entities were'} skipped (${reason}).`;
}

function listNames(names: Set<string>): string {
  const all = [...names].sort();
  const shown = all.slice(0, 5).map((s) => `"${s}"`).join(', ');
  return all.length > 5 ? `${shown} and ${all.length - 5} more` : shown;
}

/**
 * Reads an ASCII DXF floor plan into plan geometry (x east, y north, millimetres): units from
 * $INSUNITS (or chosen), blocks expanded with their transforms, curves cut into chords within
 * the chord tolerance, touching lines and arcs joined into closed rings, layers with guessed
 * roles. Throws DxfImportError for a file that cannot be read; never returns NaN.
 */
export function importDxf(input: string | Uint8Array, opts: ImportOptions = {}): ImportResult {
  return importDxfReading(input, opts, 'stream');
}

/**
 * How the ENTITIES section is read: 'stream' straight off the text, entity by entity
 * (entityStream.ts), falling back to 'parser' where that reader stops; 'parser' by dxf-parser,
 * in pieces of about ENTITY_CHUNK_CHARS. Both give the same result and the same errors.
 */
export type EntityReading = 'stream' | 'parser';

/** importDxf with the way of reading the ENTITIES section chosen (importDxf streams). */
export function importDxfReading(input: string | Uint8Array, opts: ImportOptions, reading: EntityReading): ImportResult {
  checkOptions(opts);
  const chordTol = opts.chordToleranceMm ?? DEFAULT_CHORD_TOLERANCE_MM;
  const joinTol = opts.joinToleranceMm ?? DEFAULT_JOIN_TOLERANCE_MM;
  let text = sniffDxf(typeof input === 'string' ? input : decodeDxfBytes(input));
  const warnings: string[] = [];
  const ignored: string[] = [];
  const unread: string[] = [];

  const scan = scanGroups(text);
  if (!scan.hasEof) {
    if (!scan.endsAfterSection) {
      throw new DxfImportError(
        'parse-error',
        `The file ends in the middle of the drawing, without its end marker (EOF): it looks cut off (line ${scan.lastLine}). Export or upload it again.`,
        scan.lastLine,
      );
    }
    text += text.endsWith('\n') ? '0\nEOF\n' : '\n0\nEOF\n';
    warnings.push('The file has no end marker (EOF); it was read up to its last complete section.');
  }

  // Header, tables and blocks are parsed first (the ENTITIES body cut out), then the entities
  // are read one by one and drawn at once (drawPlan): the objects of a large file's entities
  // never all live at once. A file whose ENTITIES section is not plain is parsed whole.
  const span = scan.entities;
  const edits = scan.edits;
  const head = span
    ? sliceWithEdits(text, 0, span.start, edits) + sliceWithEdits(text, span.end, text.length, edits)
    : edits.length
      ? sliceWithEdits(text, 0, text.length, edits)
      : text;
  let dxf: ParsedDxf;
  try {
    dxf = parseDxfText(head, scan.lastLine, text);
  } catch (err) {
    // Header variables the plan does not use never refuse a drawing: the unit is read raw.
    const rest = withoutHeader(head);
    if (rest === null) throw err;
    dxf = parseDxfText(rest, scan.lastLine, text);
    ignored.push('The file header could not be read and was left out; the drawing unit was taken from its $INSUNITS value.');
  }
  const units = resolveUnits(headerOf(dxf, scan), opts.units);
  if (units.warning) warnings.push(units.warning);
  if (scan.repaired.booleans > 0) {
    ignored.push(`${plural(scan.repaired.booleans, 'yes/no value was', 'yes/no values were')} written as another number than 0 or 1 and read as yes for any number but 0.`);
  }
  if (scan.repaired.unnamedBlocks > 0) {
    ignored.push(`${plural(scan.repaired.unnamedBlocks, 'block definition has', 'block definitions have')} no name, so nothing can place ${scan.repaired.unnamedBlocks === 1 ? 'it' : 'them'}; left out.`);
  }

  const { builder, walk, curves, reordered } = drawPlan(text, scan, dxf, scaling(units.mmPerUnit), chordTol, reading);
  if (reordered) ignored.push('Coordinates written in an old order (x, x, y, y) were read in their proper order.');
  const skipped = new Map(builder.skipped);
  for (const [type, n] of scan.entityTypes) {
    if (!PARSER_TYPES.has(type)) skipped.set(`${type} (not supported)`, (skipped.get(`${type} (not supported)`) ?? 0) + n);
  }

  // (one push per feature: spreading an array of unbounded length overflows the call stack)
  const features: PlanFeature[] = [];
  const labels: PlanFeature[] = [];
  for (const f of builder.features) (f.geometry.type === 'Point' ? labels : features).push(f);
  const join: JoinStats = { gapsClosed: 0, openByLayer: new Map(), ends: new Map(), degenerate: 0 };
  for (const f of joinPaths(builder.open, joinTol, join)) features.push(f);
  for (const f of labels) features.push(f);

  if (features.length === 0) {
    const found = [...skipped.entries()].map(([k, n]) => `${n} ${k}`).join(', ');
    throw new DxfImportError(
      'no-entities',
      found
        ? `The drawing holds nothing that can be shown as a floor plan (found: ${found}). Lines, polylines, arcs, circles and text are read.`
        : 'The drawing holds no entities: no lines, polylines, arcs, circles or text.',
    );
  }

  // layers: file (table) order first, then as met. Off (negative colour) and frozen (flag bit 1)
  // come from the raw table: the parser also takes "frozen in new viewports" (bit 2) as frozen.
  const table = (dxf.tables?.layer?.layers ?? {}) as Record<string, Loose>;
  const names = [...Object.keys(table).filter((n) => builder.layerCounts.has(n))];
  const listed = new Set(names);
  for (const n of builder.layerCounts.keys()) if (!listed.has(n)) names.push(n);
  const layers: ImportLayer[] = names.map((name) => {
    const rec = table[name];
    const raw = scan.layers.get(name);
    let role = guessLayerRole(name);
    const frozen = raw !== undefined && (raw.flags & 1) !== 0;
    const off = raw !== undefined && raw.color !== null && raw.color < 0;
    if (frozen || off) {
      role = 'ignore';
      warnings.push(`Layer "${name}" is ${frozen && off ? 'switched off and frozen' : frozen ? 'frozen' : 'switched off'} in the drawing, so it is set to be ignored.`);
    }
    return {
      name,
      role,
      height: defaultLayerHeight(role),
      entityCount: builder.layerCounts.get(name) ?? 0,
      color: colorHex(rec?.color),
    };
  });

  const bounds = { minX: builder.minX, minY: builder.minY, maxX: builder.maxX, maxY: builder.maxY };
  const origin = localOrigin(bounds);
  if (origin.x !== 0 || origin.y !== 0) {
    moveToOrigin(features, bounds, origin);
    for (const list of join.ends.values()) {
      for (const g of list) {
        g.x = g.x - origin.x;
        g.y = g.y - origin.y;
      }
    }
    warnings.push(
      `The drawing lies ${(Math.hypot(origin.x, origin.y) / 1e6).toFixed(0)} km from its own origin (map grid coordinates); it was moved by ${(origin.x / 1000).toFixed(0)} m east and ${(origin.y / 1000).toFixed(0)} m north to a local origin, and the cell layout's DXF export moves it back.`,
    );
  }
  const unitCheck = checkDrawingUnit(bounds, units.units);
  if (unitCheck.message) warnings.push(unitCheck.message);

  outlineWarnings(layers, features, joinTol, warnings);
  // gaps: reported for the floor outline (walls end freely at openings)
  const outlineLayers = new Set(layers.filter((l) => l.role === 'outline').map((l) => l.name));
  for (const name of outlineLayers) {
    const n = join.openByLayer.get(name) ?? 0;
    if (n > 0) warnings.push(`${plural(n, 'line end', 'line ends')} on layer "${name}" ${n === 1 ? 'meets' : 'meet'} nothing within ${joinTol} mm (marked on the preview).`);
  }

  if (curves.capped > 0) {
    warnings.push(
      `${plural(curves.capped, 'curve needs', 'curves need')} more than ${MAX_SEGMENTS_PER_CURVE} segments and ${curves.capped === 1 ? 'is' : 'are'} drawn coarser than the ${chordTol} mm tolerance.`,
    );
  }
  if (walk.missing.size > 0) warnings.push(`Blocks named in the drawing but not defined in the file: ${listNames(walk.missing)}.`);
  if (walk.recursive.size > 0) warnings.push(`Blocks that contain themselves, drawn once only: ${listNames(walk.recursive)}.`);
  if (walk.tooDeep.size > 0) warnings.push(`Blocks nested too deeply to follow: ${listNames(walk.tooDeep)}.`);
  if (walk.xrefs.size > 0) warnings.push(`External references not included in the file: ${listNames(walk.xrefs)}.`);
  for (const key of [...skipped.keys()].sort()) (ignoredOnPurpose(key) ? ignored : unread).push(skippedSentence(key, skipped.get(key)!));

  const ends: ImportGaps['ends'] = [];
  let openOnOutlines = 0;
  for (const name of outlineLayers) {
    openOnOutlines += join.openByLayer.get(name) ?? 0;
    for (const g of join.ends.get(name) ?? []) if (ends.length < MAX_LISTED_ENDS) ends.push(g);
  }
  if (join.gapsClosed > 0 || join.degenerate > 0) {
    ignored.push(
      `${plural(join.gapsClosed, 'gap', 'gaps')} of up to ${joinTol} mm between line ends ${join.gapsClosed === 1 ? 'was' : 'were'} closed${join.degenerate > 0 ? `, and ${plural(join.degenerate, 'piece', 'pieces')} shorter than that dropped` : ''}.`,
    );
  }

  return {
    units: units.units,
    unitsSource: units.unitsSource,
    insunits: units.insunits,
    // every feature reuses positions the builder placed (and measured)
    bounds,
    layers,
    geometry: { type: 'FeatureCollection', features },
    warnings,
    stats: { entities: builder.entities, features: features.length, skipped: Object.fromEntries(skipped) },
    chordToleranceMm: chordTol,
    origin,
    notes: { ignored, unread },
    gaps: { closed: join.gapsClosed, open: openOnOutlines, ends },
  };
}

/** Warnings about the floor outline: missing, not closed, crossing itself. */
function outlineWarnings(layers: readonly ImportLayer[], features: readonly PlanFeature[], joinTol: number, warnings: string[]): void {
  const outlines = layers.filter((l) => l.role === 'outline');
  if (outlines.length === 0) {
    warnings.push('No layer was recognised as the floor outline; choose one when mapping the layers.');
    return;
  }
  for (const l of outlines) {
    const own = features.filter((f) => f.properties.layer === l.name);
    const rings = own.filter((f) => f.geometry.type === 'Polygon');
    const open = own.filter((f) => f.geometry.type === 'LineString').length;
    if (rings.length === 0) {
      warnings.push(
        `Layer "${l.name}" looks like the floor outline but holds no closed outline: its ${plural(open, 'piece does', 'pieces do')} not join up within ${joinTol} mm. Close the outline in the drawing, or choose another layer.`,
      );
      continue;
    }
    if (open > 0) {
      warnings.push(`${plural(open, 'piece', 'pieces')} on the floor outline layer "${l.name}" ${open === 1 ? 'does' : 'do'} not close into an outline.`);
    }
    let crossing = 0;
    for (const f of rings) if (ringSelfIntersects((f.geometry as Polygon).coordinates[0]) === true) crossing++;
    if (crossing > 0) {
      warnings.push(`${plural(crossing, 'outline', 'outlines')} on layer "${l.name}" ${crossing === 1 ? 'crosses' : 'cross'} itself; check the drawing.`);
    }
  }
}
