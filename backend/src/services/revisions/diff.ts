/**
 * What changed between two revisions of a layout, from their snapshots: a generic compare of
 * everything the analysis reads (the layout's content, the arm models' parameters, the floor plan,
 * the project and layout names), grouped by element and written in words (diffWords.ts), plus the
 * findings new, gone and changed. Every field is compared, known or not: one without words is
 * reported under its raw path, so nothing added to the snapshot can change unseen.
 */
import type { DiffElement, RevisionChange, RevisionChangeGroup, RevisionDiff, RevisionSnapshot } from '@shared/schemas/revision';
import { snapshotChecksum } from './checksum';
import { ELEMENT_WORDS, fieldPattern, pairText, wordsFor, type FieldWords, type Seg, type Unit, type WordsCtx } from './diffWords';

/** The parts of a snapshot a diff compares: all of it but the analysis results, of which only the findings. */
export type DiffSide = Pick<RevisionSnapshot, 'project' | 'layout' | 'floorPlan' | 'models'> & { analysis: Pick<RevisionSnapshot['analysis'], 'findings'> };

/** sha256 of each side's floor plan when the caller has them (the revisions' floorPlanChecksum); computed otherwise. */
export interface DiffOptions {
  floorPlanChecksums?: { before: string | null; after: string | null };
}

type Rec = Record<string, unknown>;
const isRec = (v: unknown): v is Rec => typeof v === 'object' && v !== null && !Array.isArray(v);
const absent = (v: unknown) => v === undefined || v === null;

/** Deep equality of JSON values; a null and a missing member are the same (nothing there). */
export function sameJson(a: unknown, b: unknown): boolean {
  if (absent(a) || absent(b)) return absent(a) && absent(b);
  if (Array.isArray(a) || Array.isArray(b)) return Array.isArray(a) && Array.isArray(b) && a.length === b.length && a.every((v, i) => sameJson(v, b[i]));
  if (isRec(a) && isRec(b)) {
    for (const k of Object.keys(a)) if (!sameJson(a[k], b[k])) return false;
    for (const k of Object.keys(b)) if (!(k in a) && !absent(b[k])) return false;
    return true;
  }
  return a === b;
}

/** Member names of two objects: the first one's order, then what only the second has. */
function keysOf(a: unknown, b: unknown): string[] {
  const out = isRec(a) ? Object.keys(a) : [];
  for (const k of isRec(b) ? Object.keys(b) : []) if (!out.includes(k)) out.push(k);
  return out;
}

/** A value for a line about a field without words (written "field ‘path’ a → b"): JSON, cut short. */
const rawText = (v: unknown) => {
  if (absent(v)) return 'none';
  const s = typeof v === 'string' ? `‘${v}’` : JSON.stringify(v);
  return s.length > 60 ? `${s.slice(0, 57)}…` : s;
};

/** Walks the fields of one element on both sides and writes a change line for each difference. */
class ElementWalk {
  readonly changes: RevisionChange[] = [];
  private readonly keyedAt = new Set<number>();
  constructor(
    private readonly element: DiffElement,
    private readonly ctx: Omit<WordsCtx, 'path'>,
  ) {}

  private push(path: readonly Seg[], text: string) {
    if (!this.changes.some((c) => c.text === text)) this.changes.push({ field: path.join('.'), text });
  }

  walk(a: unknown, b: unknown, path: Seg[] = []): void {
    if (sameJson(a, b)) return;
    const pattern = fieldPattern(path, this.keyedAt);
    const words = wordsFor(this.element, pattern);
    const c: WordsCtx = { ...this.ctx, path };
    const label = words ? (typeof words.label === 'string' ? words.label : words.label(c)) : `field ‘${path.join('.')}’`;
    if (words?.line) return this.walkWhole(a, b, path, words, c);
    const before = this.changes.length;
    if (words?.keyedBy && (Array.isArray(a) || absent(a)) && (Array.isArray(b) || absent(b))) this.walkKeyed(a as unknown[] | undefined, b as unknown[] | undefined, path, words.keyedBy, label, c);
    else if ((isRec(a) || absent(a)) && (isRec(b) || absent(b))) {
      for (const k of keysOf(a, b)) this.walk(isRec(a) ? a[k] : undefined, isRec(b) ? b[k] : undefined, [...path, k]);
    } else if ((Array.isArray(a) || absent(a)) && (Array.isArray(b) || absent(b))) {
      const la = Array.isArray(a) ? a.length : 0;
      const lb = Array.isArray(b) ? b.length : 0;
      for (let i = 0; i < Math.max(la, lb); i++) this.walk(Array.isArray(a) ? a[i] : undefined, Array.isArray(b) ? b[i] : undefined, [...path, i]);
    } else if (words) {
      const unit: Unit = typeof words.unit === 'function' ? words.unit(c) : (words.unit ?? '');
      return this.push(path, `${label} ${pairText(a, b, unit, words.text && ((v, side) => words.text!(v, side, c)), words.none)}`);
    } else return this.push(path, `${label} ${rawText(a)} → ${rawText(b)}`);
    // Objects or lists that differ but gave no line (e.g. an empty object against none).
    if (this.changes.length === before) this.push(path, `${label} changed`);
  }

  /** A field written as one line; members its line does not read (`covers`) are still compared one by one. */
  private walkWhole(a: unknown, b: unknown, path: Seg[], words: FieldWords, c: WordsCtx) {
    const covers = words.covers;
    if (!covers || !(isRec(a) || isRec(b))) return this.push(path, words.line!(a, b, c));
    const part = (v: unknown, inside: boolean) => (isRec(v) ? Object.fromEntries(Object.entries(v).filter(([k]) => covers.includes(k) === inside)) : v);
    if (!sameJson(part(a, true), part(b, true))) this.push(path, words.line!(a, b, c));
    for (const k of keysOf(a, b)) if (!covers.includes(k)) this.walk(isRec(a) ? a[k] : undefined, isRec(b) ? b[k] : undefined, [...path, k]);
  }

  private walkKeyed(a: unknown[] | undefined, b: unknown[] | undefined, path: Seg[], key: string, label: string, c: WordsCtx) {
    const byKey = (list: unknown[] | undefined) => new Map((list ?? []).map((v) => [String(isRec(v) ? v[key] : v), v]));
    const ma = byKey(a);
    const mb = byKey(b);
    const text = wordsFor(this.element, fieldPattern(path, this.keyedAt))?.text;
    const say = (v: unknown, side: 'before' | 'after') => (text ? ` (${text(v, side, c)})` : '');
    this.keyedAt.add(path.length);
    for (const [k, v] of mb) {
      if (!ma.has(k)) this.push([...path, k], `${label} ${k} added${say(v, 'after')}`);
      else this.walk(ma.get(k), v, [...path, k]);
    }
    for (const [k, v] of ma) if (!mb.has(k)) this.push([...path, k], `${label} ${k} removed${say(v, 'before')}`);
    this.keyedAt.delete(path.length);
  }
}

interface Sides {
  ctx: Omit<WordsCtx, 'path' | 'before' | 'after'>;
  groups: RevisionChangeGroup[];
}

/** One element on both sides (either may be absent) → its group, when anything differs. */
function compareElement(s: Sides, element: DiffElement, id: string | null, whole: { a: unknown; b: unknown }, lead: RevisionChange[] = []): void {
  const words = ELEMENT_WORDS[element];
  const without = (v: unknown, left: ReadonlySet<string>) => (left.size && isRec(v) ? Object.fromEntries(Object.entries(v).filter(([k]) => !left.has(k))) : v);
  const skip = new Set(words.skip ?? []);
  const a = without(whole.a, skip);
  const b = without(whole.b, skip);
  if (sameJson(a, b) && !lead.length) return;
  const ctx = { ...s.ctx, before: a, after: b };
  const title = words.title(absent(b) ? a : b, id);
  if (absent(a) || absent(b)) {
    const status = absent(a) ? 'added' : 'removed';
    s.groups.push({ element, id, title, status, changes: [...lead, { field: '', text: words.summary(absent(a) ? b : a, status, { ...ctx, path: [] }) }] });
    return;
  }
  const walk = new ElementWalk(element, ctx);
  const combined = new Set<string>();
  for (const combo of words.combined ?? []) {
    const ra = a as Rec;
    const rb = b as Rec;
    if (combo.fields.some((f) => !sameJson(ra[f], rb[f]))) walk.changes.push({ field: combo.field, text: combo.line(ra, rb) });
    for (const f of combo.fields) combined.add(f);
  }
  walk.walk(without(a, combined), without(b, combined));
  const changes = [...lead, ...walk.changes];
  if (changes.length) s.groups.push({ element, id, title, status: 'changed', changes });
}

/** Elements of a list (arms, boundaries, work points, arm models) matched by id: added, removed, changed. */
function compareList(s: Sides, element: DiffElement, a: unknown, b: unknown): void {
  if (sameJson(a, b)) return;
  const byId = (list: unknown) => new Map((Array.isArray(list) ? list : []).map((v: unknown) => [String(isRec(v) ? v.id : v), v]));
  const before = byId(a);
  const after = byId(b);
  for (const [id, v] of after) compareElement(s, element, id, { a: before.get(id), b: v });
  for (const [id, v] of before) if (!after.has(id)) compareElement(s, element, id, { a: v, b: undefined });
}

/** Parts of the snapshot compared as elements; the rest of `layout.content` and of the snapshot goes to "other". */
const CONTENT_PARTS = new Set(['arms', 'boundaries', 'workPoints', 'workHeights']);
const TOP_PARTS = new Set(['project', 'layout', 'floorPlan', 'models', 'analysis']);

/** Findings by id: new, gone, and those whose severity or message changed. */
function compareFindings(a: DiffSide['analysis']['findings'], b: DiffSide['analysis']['findings']): RevisionDiff['findings'] {
  const brief = (f: (typeof a)[number]) => ({ id: f.id, severity: f.severity, message: f.message });
  const before = new Map(a.map((f) => [f.id, f]));
  const after = new Map(b.map((f) => [f.id, f]));
  const out: RevisionDiff['findings'] = { added: [], removed: [], changed: [] };
  for (const [id, f] of after) {
    const was = before.get(id);
    if (!was) out.added.push(brief(f));
    else if (was.severity !== f.severity || was.message !== f.message) out.changed.push({ ...brief(f), before: { severity: was.severity, message: was.message } });
  }
  for (const [id, f] of before) if (!after.has(id)) out.removed.push(brief(f));
  return out;
}

/**
 * Every change from `prev` to `cur` (null prev: a layout's first revision, nothing to compare),
 * grouped by element: project, cell layout, floor plan (checksum first), work heights, arms, arm
 * models, boundaries, work points, anything else; then the findings. Numbers are compared exactly.
 * Bookkeeping is left out: project and layout ids, the layout's version, the analysis results
 * other than findings (they follow from the inputs compared here).
 */
export function diffSnapshots(prev: DiffSide | null, cur: DiffSide, previous: RevisionDiff['previous'], opts: DiffOptions = {}): RevisionDiff {
  if (!prev) return { previous, groups: [], findings: { added: [], removed: [], changed: [] } };
  const names = (side: DiffSide) => new Map(side.models.map((m) => [m.id, m.name]));
  const s: Sides = { ctx: { modelNames: { before: names(prev), after: names(cur) } }, groups: [] };
  const pc = prev.layout.content as unknown as Rec;
  const cc = cur.layout.content as unknown as Rec;

  compareElement(s, 'project', null, { a: prev.project, b: cur.project });
  compareElement(s, 'layout', null, { a: prev.layout, b: cur.layout });
  const sum = (fp: unknown, given: string | null | undefined) => (absent(fp) ? null : (given ?? snapshotChecksum(fp)));
  const fa = sum(prev.floorPlan, opts.floorPlanChecksums?.before);
  const fb = sum(cur.floorPlan, opts.floorPlanChecksums?.after);
  if (fa !== fb) {
    const lead = fa && fb ? [{ field: 'checksum', text: `checksum ${fa.slice(0, 12)} → ${fb.slice(0, 12)}` }] : [{ field: 'checksum', text: `checksum ${(fa ?? fb)!.slice(0, 12)}` }];
    compareElement(s, 'floorPlan', null, { a: prev.floorPlan, b: cur.floorPlan }, lead);
  }
  compareElement(s, 'workHeights', null, { a: pc.workHeights, b: cc.workHeights });
  compareList(s, 'arm', pc.arms, cc.arms);
  compareList(s, 'armModel', prev.models, cur.models);
  compareList(s, 'boundary', pc.boundaries, cc.boundaries);
  compareList(s, 'workPoint', pc.workPoints, cc.workPoints);

  const other = new ElementWalk('other', { ...s.ctx, before: prev, after: cur });
  for (const k of keysOf(pc, cc)) if (!CONTENT_PARTS.has(k)) other.walk(pc[k], cc[k], ['layout', 'content', k]);
  const ps = prev as unknown as Rec;
  const cs = cur as unknown as Rec;
  for (const k of keysOf(ps, cs)) if (!TOP_PARTS.has(k)) other.walk(ps[k], cs[k], [k]);
  if (other.changes.length) s.groups.push({ element: 'other', id: null, title: ELEMENT_WORDS.other.title(null, null), status: 'changed', changes: other.changes });

  return { previous, groups: s.groups, findings: compareFindings(prev.analysis.findings, cur.analysis.findings) };
}
