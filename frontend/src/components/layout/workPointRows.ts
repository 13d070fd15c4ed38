import { WorkPoint } from '@shared/schemas/layout';
import { issueSentence } from '@shared/schemas/labels';
import type { AnalysisResult } from '@shared/analysis';
import { isReached } from '@shared/analysis';
import { parseNumberCell } from './workPointsCsv';

/** What the analysis says about one point: best margin (mm, positive = reached) and who reaches it. */
export interface PointCoverage {
  /** Largest margin over the layout's arms, mm; null when the point was not analysed or there are no arms. */
  best: number | null;
  bestArm: string | null;
  /** Arms that reach the point (`isReached`), best first. */
  reachedBy: string[];
}

/** One line of the work-points table. */
export interface WorkPointRow extends PointCoverage {
  point: WorkPoint;
}

/** Best margin and reaching arms of one coverage row (armId → margin mm); arms not in `armIds` are skipped. */
export function pointCoverage(row: Record<string, number> | undefined, armIds: ReadonlyArray<string>, order?: ReadonlyMap<string, number>): PointCoverage {
  if (!row) return { best: null, bestArm: null, reachedBy: [] };
  // A row names only the arms near the point: walk its own entries (a handful) rather than every
  // arm of the layout, and break ties by the layout's arm order as before.
  const index = order ?? new Map(armIds.map((a, i) => [a, i]));
  let best: number | null = null;
  let bestArm: string | null = null;
  let bestAt = Infinity;
  const reached: Array<[string, number]> = [];
  for (const a in row) {
    const at = index.get(a);
    if (at === undefined) continue;
    const m = row[a];
    if (typeof m !== 'number' || Number.isNaN(m)) continue;
    if (best === null || m > best || (m === best && at < bestAt)) {
      best = m;
      bestArm = a;
      bestAt = at;
    }
    if (isReached(m)) reached.push([a, m]);
  }
  reached.sort((p, q) => q[1] - p[1] || (p[0] < q[0] ? -1 : 1));
  return { best, bestArm, reachedBy: reached.map(([a]) => a) };
}

/** Table rows of the layout's work points with their coverage (none when there is no analysis yet). */
export function workPointRows(points: ReadonlyArray<WorkPoint>, armIds: ReadonlyArray<string>, analysis: AnalysisResult | null): WorkPointRow[] {
  const order = new Map(armIds.map((a, i) => [a, i]));
  return points.map((point) => ({ point, ...pointCoverage(analysis?.coverage[point.id], armIds, order) }));
}

/** The table columns a user may edit in place. */
export const EDITABLE_FIELDS = ['id', 'x', 'y', 'z', 'approach', 'tag', 'assignedArm'] as const;
export type EditableField = (typeof EDITABLE_FIELDS)[number];

export type EditOutcome = { ok: true; points: WorkPoint[]; point: WorkPoint } | { ok: false; message: string };

/**
 * The work points after setting one field of one point from the text typed into its cell,
 * checked with the WorkPoint schema, unique ids and the layout's arms. A rejected edit is a value
 * with a message for the cell; the input list is never changed.
 */
export function editWorkPoint(
  points: ReadonlyArray<WorkPoint>,
  id: string,
  field: EditableField,
  raw: string,
  armIds: ReadonlyArray<string>,
): EditOutcome {
  const index = points.findIndex((p) => p.id === id);
  if (index < 0) throw new Error(`id ${id} is not a work point of this cell layout`);
  if (!EDITABLE_FIELDS.includes(field)) throw new Error(`field ${String(field)} cannot be edited`);
  const draft: Record<string, unknown> = { ...points[index] };
  if (field === 'x' || field === 'y' || field === 'z') {
    const n = parseNumberCell(raw);
    if (n === null) return { ok: false, message: raw.trim() === '' ? `${field} is missing` : `${field} is not a number` };
    draft[field] = n;
  } else if (field === 'assignedArm') {
    const a = raw.trim();
    if (a === '') delete draft.assignedArm;
    else if (!armIds.includes(a)) return { ok: false, message: `arm ${a} is not on this cell layout` };
    else draft.assignedArm = a;
  } else if (field === 'approach') {
    const a = raw.trim().toLowerCase();
    if (a !== 'top' && a !== 'any') return { ok: false, message: 'approach must be top or any' };
    draft.approach = a;
  } else {
    draft[field] = raw;
  }
  const checked = WorkPoint.safeParse(draft);
  if (!checked.success) return { ok: false, message: checked.error.issues[0] ? issueSentence(checked.error.issues[0]) : 'not a valid work point' };
  const next = checked.data;
  if (next.id !== id && points.some((p) => p.id === next.id)) return { ok: false, message: `id ${next.id} is already used` };
  const out = points.slice();
  out[index] = next;
  return { ok: true, points: out, point: next };
}

/** The next free id of the form P<n> (one above the largest P-number in use). */
export function nextWorkPointId(points: ReadonlyArray<WorkPoint>): string {
  const used = new Set(points.map((p) => p.id));
  let n = 0;
  for (const p of points) {
    const m = /^P(\d+)$/.exec(p.id);
    if (m) n = Math.max(n, Number(m[1]));
  }
  let id = `P${n + 1}`;
  while (used.has(id)) id = `P${++n + 1}`;
  return id;
}

/** A new point beside the last one (same height, 500 mm east), or at the plan origin when there is none. */
export function newWorkPoint(points: ReadonlyArray<WorkPoint>): WorkPoint {
  const last = points[points.length - 1];
  const base = last ? { x: last.x + 500, y: last.y, z: last.z, tag: last.tag } : { x: 0, y: 0, z: 0, tag: '' };
  return WorkPoint.parse({ id: nextWorkPointId(points), approach: 'top', ...base });
}

/** The work points without those whose id is in `ids`. */
export function removeWorkPoints(points: ReadonlyArray<WorkPoint>, ids: ReadonlySet<string>): WorkPoint[] {
  return points.filter((p) => !ids.has(p.id));
}

/**
 * Rows matching a filter text: every whitespace-separated word must occur (case-insensitive) in
 * the point's id, tag, approach, assigned arm or reaching arms; "not reached" (or "unreached") matches the rows no arm reaches.
 */
export function filterWorkPointRows(rows: ReadonlyArray<WorkPointRow>, text: string): WorkPointRow[] {
  const words = text.trim().toLowerCase().replace(/\bnot[\s-]+reached\b/g, 'unreached').split(/\s+/).filter(Boolean);
  if (!words.length) return rows.slice();
  return rows.filter((r) => {
    const hay = [r.point.id, r.point.tag, r.point.approach, r.point.assignedArm ?? '', ...r.reachedBy].join(' ').toLowerCase();
    return words.every((w) => (w === 'unreached' ? r.best !== null && !isReached(r.best) : hay.includes(w)));
  });
}
