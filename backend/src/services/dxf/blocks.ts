import { DxfImportError } from './errors';
import { drawEntity, entityRef, extrusionPoint, num, pt, type DrawContext } from './entities';
import { MAX_BLOCK_DEPTH, MAX_ENTITY_INSTANCES } from './limits';
import type { PlanBuilder } from './planBuilder';
import { compose, insertTransform, planScale, type Affine } from './transform';

type Loose = Record<string, unknown>;

/** Block definitions by name, and notes on what could not be followed. */
export interface BlockWalk {
  blocks: Map<string, Loose>;
  chordToleranceMm: number;
  /** Names of missing blocks that INSERTs refer to. */
  missing: Set<string>;
  /** Names of blocks that insert themselves (directly or through others). */
  recursive: Set<string>;
  /** Names of blocks nested deeper than MAX_BLOCK_DEPTH. */
  tooDeep: Set<string>;
  /** External references (xrefs) that are not part of the file. */
  xrefs: Set<string>;
  instances: number;
  /** Entities one placement of a block lays out, its nested blocks and arrays included (by block name, upper case). */
  placed: Map<string, number>;
}

export function newBlockWalk(rawBlocks: unknown, chordToleranceMm: number): BlockWalk {
  const blocks = new Map<string, Loose>();
  if (rawBlocks && typeof rawBlocks === 'object') {
    for (const [name, blk] of Object.entries(rawBlocks as Record<string, unknown>)) {
      if (blk && typeof blk === 'object') blocks.set(name, blk as Loose);
    }
  }
  return {
    blocks,
    chordToleranceMm,
    missing: new Set(),
    recursive: new Set(),
    tooDeep: new Set(),
    xrefs: new Set(),
    instances: 0,
    placed: new Map(),
  };
}

/** Chord tolerance in local units for a map to plan mm (infinite when the map collapses). */
export function localTolerance(m: Affine, tolMm: number): number {
  const s = planScale(m);
  return s > 1e-300 ? tolMm / s : Number.POSITIVE_INFINITY;
}

function findBlock(w: BlockWalk, name: string): Loose | undefined {
  const exact = w.blocks.get(name);
  if (exact) return exact;
  // Block names are not case-sensitive in DXF.
  const upper = name.toUpperCase();
  for (const [k, v] of w.blocks) if (k.toUpperCase() === upper) return v;
  return undefined;
}

/** Column and row counts of an INSERT (1 × 1 for a plain one; MINSERT arrays more). */
function arrayCounts(e: Loose): [number, number] {
  const count = (v: unknown) => (typeof v === 'number' && Number.isFinite(v) ? Math.max(1, Math.floor(v)) : 1);
  return [count(e.columnCount), count(e.rowCount)];
}

/**
 * How many entities one placement of `block` lays out: each entity once, each INSERT itself plus
 * columns × rows × the entities of its block, recursively (a block inserting itself, a missing
 * block or one nested too deep adds nothing: the walk skips them). Counted from the block table
 * alone, before anything is expanded.
 */
function placedEntities(w: BlockWalk, block: Loose, stack: readonly string[]): number {
  const name = typeof block.name === 'string' ? block.name.toUpperCase() : '';
  const known = w.placed.get(name);
  if (known !== undefined) return known;
  const children = Array.isArray(block.entities) ? (block.entities as unknown[]) : [];
  let n = 0;
  for (const raw of children) {
    n += 1;
    const e = raw && typeof raw === 'object' ? (raw as Loose) : null;
    if (!e || e.type !== 'INSERT' || typeof e.name !== 'string') continue;
    const inner = findBlock(w, e.name);
    const innerName = inner && typeof inner.name === 'string' ? inner.name.toUpperCase() : '';
    if (!inner || stack.includes(innerName) || name === innerName || stack.length >= MAX_BLOCK_DEPTH) continue;
    const [cols, rows] = arrayCounts(e);
    n += cols * rows * placedEntities(w, inner, [...stack, name]);
    if (n > MAX_ENTITY_INSTANCES) break; // already too many: the exact figure does not matter
  }
  w.placed.set(name, n);
  return n;
}

const count = (v: number) => (Number.isFinite(v) ? Math.round(v).toLocaleString('en-GB').replace(/,/g, ' ') : 'more than any');

/**
 * Draws a list of entities in context: INSERTs are expanded recursively with their transforms
 * (block base point, scale incl. negative = mirrored, rotation, column/row arrays, extrusion);
 * entities of a block on layer "0" take the layer of the INSERT that places them. A block that
 * inserts itself is followed once and reported.
 */
export function drawEntities(
  entities: readonly unknown[],
  ctx: DrawContext,
  stack: readonly string[],
  w: BlockWalk,
  b: PlanBuilder,
): void {
  for (const raw of entities) {
    if (raw && typeof raw === 'object') drawOne(raw as Loose, ctx, stack, w, b);
  }
}

/** Draws one entity in context (see drawEntities). */
export function drawOne(e: Loose, ctx: DrawContext, stack: readonly string[], w: BlockWalk, b: PlanBuilder): void {
  const type = String(e.type);
  if (++w.instances > MAX_ENTITY_INSTANCES) {
    throw new DxfImportError(
      'too-complex',
      `The drawing expands to more than ${MAX_ENTITY_INSTANCES.toLocaleString('en')} entities once its blocks are placed, more than one floor plan import may hold.`,
    );
  }
  if (stack.length === 0 && e.inPaperSpace === true) {
    b.skip(type, 'on a paper-space layout');
    return;
  }
  if (e.visible === false) {
    b.skip(type, 'invisible');
    return;
  }
  const own = typeof e.layer === 'string' && e.layer !== '' ? e.layer : '0';
  const layer = own === '0' && stack.length > 0 ? ctx.layer : own;
  const here = layer === ctx.layer ? ctx : { m: ctx.m, tol: ctx.tol, layer, block: ctx.block, curves: ctx.curves };
  if (type === 'INSERT') drawInsert(e, here, stack, w, b);
  else drawEntity(e, here, b);
}

function drawInsert(e: Loose, ctx: DrawContext, stack: readonly string[], w: BlockWalk, b: PlanBuilder): void {
  const ref = entityRef(e, ctx.block);
  const name = typeof e.name === 'string' ? e.name : '';
  const block = name ? findBlock(w, name) : undefined;
  if (!block) {
    w.missing.add(name || '(no name)');
    b.skip('INSERT', 'block missing');
    return;
  }
  const blockName = typeof block.name === 'string' ? block.name : name;
  if (stack.includes(blockName)) {
    w.recursive.add(blockName);
    b.skip('INSERT', 'block inserts itself');
    return;
  }
  if (stack.length >= MAX_BLOCK_DEPTH) {
    w.tooDeep.add(blockName);
    b.skip('INSERT', 'nested too deep');
    return;
  }
  if (typeof block.type === 'number' && (block.type & 4) !== 0) {
    w.xrefs.add(blockName);
    b.skip('INSERT', 'external reference');
    return;
  }
  const children = Array.isArray(block.entities) ? (block.entities as unknown[]) : [];
  if (children.length === 0) return;

  const pos = pt(e.position, ref, 'insertion point') ?? [0, 0, 0];
  const base = pt(block.position, ref, 'block base point') ?? [0, 0, 0];
  const sx = num(e, 'xScale', 1, ref);
  const sy = num(e, 'yScale', 1, ref);
  const sz = num(e, 'zScale', 1, ref);
  const rot = num(e, 'rotation', 0, ref);
  const cols = Math.max(1, Math.floor(num(e, 'columnCount', 1, ref)));
  const rows = Math.max(1, Math.floor(num(e, 'rowCount', 1, ref)));
  const dc = num(e, 'columnSpacing', 0, ref);
  const dr = num(e, 'rowSpacing', 0, ref);
  // Refuse an array (or nest of blocks) that would place too many entities before placing any:
  // a small file can otherwise expand to millions of copies.
  const placed = cols * rows * placedEntities(w, block, stack.map((s) => s.toUpperCase()));
  if (w.instances + placed > MAX_ENTITY_INSTANCES) {
    const array = cols * rows > 1 ? ` as an array of ${count(cols)} × ${count(rows)} copies` : '';
    throw new DxfImportError(
      'too-complex',
      `Block "${blockName}" is inserted${array} that would place ${count(placed)} entities; one floor plan import may place at most ${count(MAX_ENTITY_INSTANCES)}. Reduce the array or explode fewer copies and try again.`,
    );
  }
  const ocs = extrusionPoint(e.extrusionDirection, ref);
  const outer = ocs ? compose(ctx.m, ocs) : ctx.m;
  const inner = [...stack, blockName];
  const P = { x: pos[0], y: pos[1], z: pos[2] };
  const B = { x: base[0], y: base[1], z: base[2] };
  for (let r = 0; r < rows; r++) {
    for (let c = 0; c < cols; c++) {
      const m = compose(outer, insertTransform(P, B, sx, sy, sz, rot, c * dc, r * dr));
      const child: DrawContext = {
        m,
        tol: localTolerance(m, w.chordToleranceMm),
        layer: ctx.layer,
        block: blockName,
        curves: ctx.curves,
      };
      drawEntities(children, child, inner, w, b);
    }
  }
}
