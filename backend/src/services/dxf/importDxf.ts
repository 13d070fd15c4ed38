import type { Feature, Geometry, Polygon } from 'geojson';
import type { ImportLayer, ImportResult, PlanFeatureProps, UnitName } from '@shared/schemas/floorPlan';
import { drawEntities, localTolerance, newBlockWalk } from './blocks';
import { DxfImportError } from './errors';
import { scanGroups } from './groupScan';
import { joinPaths } from './join';
import { colorHex, defaultLayerHeight, guessLayerRole } from './layerRoles';
import {
  DEFAULT_CHORD_TOLERANCE_MM,
  DEFAULT_JOIN_TOLERANCE_MM,
  MAX_CHORD_TOLERANCE_MM,
  MAX_SEGMENTS_PER_CURVE,
  MIN_CHORD_TOLERANCE_MM,
} from './limits';
import { ringSelfIntersects } from './outline';
import { parseDxfText } from './parse';
import { PlanBuilder } from './planBuilder';
import { decodeDxfBytes, sniffDxf } from './sniff';
import { scaling } from './transform';
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
  'POLYLINE', 'SOLID', 'SPLINE', 'TEXT',
]);

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
  checkOptions(opts);
  const chordTol = opts.chordToleranceMm ?? DEFAULT_CHORD_TOLERANCE_MM;
  const joinTol = opts.joinToleranceMm ?? DEFAULT_JOIN_TOLERANCE_MM;
  let text = sniffDxf(typeof input === 'string' ? input : decodeDxfBytes(input));
  const warnings: string[] = [];

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

  // Header, tables and blocks first (the ENTITIES body cut out), then the entities in pieces,
  // each drawn and dropped before the next is parsed: the parser's objects for a large file
  // never all live at once. A file whose ENTITIES section is not plain is parsed whole.
  const span = scan.entities;
  const dxf = span
    ? parseDxfText(text.slice(0, span.start) + text.slice(span.end), scan.lastLine, text)
    : parseDxfText(text, scan.lastLine);
  const header = dxf.header && typeof dxf.header === 'object' ? dxf.header : undefined;
  const units = resolveUnits(header, opts.units);
  if (units.warning) warnings.push(units.warning);

  const builder = new PlanBuilder();
  const walk = newBlockWalk(dxf.blocks, chordTol);
  const root = scaling(units.mmPerUnit);
  const curves = { capped: 0 };
  const ctx = { m: root, tol: localTolerance(root, chordTol), layer: '0', curves };
  if (span) {
    const bounds = [span.start, ...span.cuts, span.end];
    for (let i = 0; i + 1 < bounds.length; i++) {
      const piece = `0\nSECTION\n2\nENTITIES\n${text.slice(bounds[i], bounds[i + 1])}0\nENDSEC\n0\nEOF\n`;
      const part = parseDxfText(piece, scan.lastLine, text);
      drawEntities(Array.isArray(part.entities) ? part.entities : [], ctx, [], walk, builder);
    }
  } else {
    drawEntities(Array.isArray(dxf.entities) ? dxf.entities : [], ctx, [], walk, builder);
  }

  const skipped = new Map(builder.skipped);
  for (const [type, n] of scan.entityTypes) {
    if (!PARSER_TYPES.has(type)) skipped.set(`${type} (not supported)`, (skipped.get(`${type} (not supported)`) ?? 0) + n);
  }

  const features: PlanFeature[] = [];
  const labels: PlanFeature[] = [];
  for (const f of builder.features) (f.geometry.type === 'Point' ? labels : features).push(f);
  features.push(...joinPaths(builder.open, joinTol));
  features.push(...labels);

  if (features.length === 0) {
    const found = [...skipped.entries()].map(([k, n]) => `${n} ${k}`).join(', ');
    throw new DxfImportError(
      'no-entities',
      found
        ? `The drawing holds nothing that can be shown as a floor plan (found: ${found}). Lines, polylines, arcs, circles and text are read.`
        : 'The drawing holds no entities: no lines, polylines, arcs, circles or text.',
    );
  }

  // layers: file (table) order first, then as met
  const table = (dxf.tables?.layer?.layers ?? {}) as Record<string, Loose>;
  const names = [...Object.keys(table).filter((n) => builder.layerCounts.has(n))];
  for (const n of builder.layerCounts.keys()) if (!names.includes(n)) names.push(n);
  const layers: ImportLayer[] = names.map((name) => {
    const rec = table[name];
    let role = guessLayerRole(name);
    if (rec && (rec.visible === false || rec.frozen === true)) {
      role = 'ignore';
      warnings.push(`Layer "${name}" is switched off or frozen in the drawing, so it is set to be ignored.`);
    }
    return {
      name,
      role,
      height: defaultLayerHeight(role),
      entityCount: builder.layerCounts.get(name) ?? 0,
      color: colorHex(rec?.color),
    };
  });

  outlineWarnings(layers, features, joinTol, warnings);

  if (curves.capped > 0) {
    warnings.push(
      `${plural(curves.capped, 'curve needs', 'curves need')} more than ${MAX_SEGMENTS_PER_CURVE} segments and ${curves.capped === 1 ? 'is' : 'are'} drawn coarser than the ${chordTol} mm tolerance.`,
    );
  }
  if (walk.missing.size > 0) warnings.push(`Blocks named in the drawing but not defined in the file: ${listNames(walk.missing)}.`);
  if (walk.recursive.size > 0) warnings.push(`Blocks that contain themselves, drawn once only: ${listNames(walk.recursive)}.`);
  if (walk.tooDeep.size > 0) warnings.push(`Blocks nested too deeply to follow: ${listNames(walk.tooDeep)}.`);
  if (walk.xrefs.size > 0) warnings.push(`External references not included in the file: ${listNames(walk.xrefs)}.`);
  for (const key of [...skipped.keys()].sort()) warnings.push(skippedSentence(key, skipped.get(key)!));

  return {
    units: units.units,
    unitsSource: units.unitsSource,
    insunits: units.insunits,
    // every feature reuses positions the builder placed (and measured)
    bounds: { minX: builder.minX, minY: builder.minY, maxX: builder.maxX, maxY: builder.maxY },
    layers,
    geometry: { type: 'FeatureCollection', features },
    warnings,
    stats: { entities: builder.entities, features: features.length, skipped: Object.fromEntries(skipped) },
    chordToleranceMm: chordTol,
  };
}

/** Warnings about the floor boundary: missing, not closed, crossing itself. */
function outlineWarnings(layers: readonly ImportLayer[], features: readonly PlanFeature[], joinTol: number, warnings: string[]): void {
  const boundary = layers.filter((l) => l.role === 'boundary');
  if (boundary.length === 0) {
    warnings.push('No layer was recognised as the floor boundary; choose one when mapping the layers.');
    return;
  }
  for (const l of boundary) {
    const own = features.filter((f) => f.properties.layer === l.name);
    const rings = own.filter((f) => f.geometry.type === 'Polygon');
    const open = own.filter((f) => f.geometry.type === 'LineString').length;
    if (rings.length === 0) {
      warnings.push(
        `Layer "${l.name}" looks like the floor boundary but holds no closed outline: its ${plural(open, 'piece does', 'pieces do')} not join up within ${joinTol} mm. Close the outline in the drawing, or choose another layer.`,
      );
      continue;
    }
    if (open > 0) {
      warnings.push(`${plural(open, 'piece', 'pieces')} on the floor boundary layer "${l.name}" ${open === 1 ? 'does' : 'do'} not close into an outline.`);
    }
    let crossing = 0;
    for (const f of rings) if (ringSelfIntersects((f.geometry as Polygon).coordinates[0]) === true) crossing++;
    if (crossing > 0) {
      warnings.push(`${plural(crossing, 'outline', 'outlines')} on layer "${l.name}" ${crossing === 1 ? 'crosses' : 'cross'} itself; check the drawing.`);
    }
  }
}
