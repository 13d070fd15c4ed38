/**
 * What an edit of a cell layout changed, kept in its audit event so the log can say it in words
 * (shared/audit: "Arms: 4 → 5", "Height of guard fence F1: 2000 mm → 2200 mm"): the name, the
 * floor plan, the work heights, how many arms, boundaries and work points there are, which were
 * added or removed, and each field of an element that changed (matched by id). Values that are not
 * plain (a fence's points, a J1 restriction) are recorded as changed without their values.
 */
import type { LayoutChange, LayoutList } from '@shared/audit';
import { sameJson } from '../revisions/diff';

type Rec = Record<string, unknown>;
const rec = (v: unknown): Rec => (typeof v === 'object' && v !== null && !Array.isArray(v) ? (v as Rec) : {});
type Plain = string | number | boolean | null;
const isPlain = (v: unknown): v is Plain | undefined => v === undefined || v === null || ['string', 'number', 'boolean'].includes(typeof v);

const isRecOrAbsent = (v: unknown) => v === undefined || v === null || (typeof v === 'object' && !Array.isArray(v));

/** The most changes one event keeps; the rest are counted (`more`). */
export const MAX_LAYOUT_CHANGES = 40;

export interface LayoutSide {
  name: string;
  floorPlanId: number | null;
  content: unknown;
}

const LISTS: LayoutList[] = ['arms', 'boundaries', 'workPoints'];

/** Field changes of one element on both sides; nested objects (a safeguard) by member, one level down. */
function fieldChanges(list: LayoutList, id: string, kind: string | undefined, a: Rec, b: Rec, out: LayoutChange[], prefix = ''): void {
  const keys = [...new Set([...Object.keys(a), ...Object.keys(b)])].filter((k) => k !== 'id');
  for (const k of keys) {
    const va = a[k];
    const vb = b[k];
    if (sameJson(va, vb)) continue;
    const field = `${prefix}${k}`;
    if (isPlain(va) && isPlain(vb)) out.push({ what: 'field', list, id, ...(kind ? { kind } : {}), field, from: va ?? null, to: vb ?? null });
    else if (!prefix && isRecOrAbsent(va) && isRecOrAbsent(vb)) fieldChanges(list, id, kind, rec(va), rec(vb), out, `${k}.`);
    else out.push({ what: 'field', list, id, ...(kind ? { kind } : {}), field });
  }
}

/** The changes from one version of a layout to the next, at most MAX_LAYOUT_CHANGES, and how many more. */
export function layoutChanges(before: LayoutSide, after: LayoutSide): { changes: LayoutChange[]; more: number } {
  const out: LayoutChange[] = [];
  if (before.name !== after.name) out.push({ what: 'name', from: before.name, to: after.name });
  if (before.floorPlanId !== after.floorPlanId) out.push({ what: 'floorPlan', from: before.floorPlanId, to: after.floorPlanId });
  const ca = rec(before.content);
  const cb = rec(after.content);
  const heights = (v: unknown) => (Array.isArray(v) ? v.filter((h): h is number => typeof h === 'number') : []);
  if (!sameJson(ca.workHeights, cb.workHeights)) out.push({ what: 'workHeights', from: heights(ca.workHeights), to: heights(cb.workHeights) });
  for (const list of LISTS) {
    const items = (v: unknown) => new Map((Array.isArray(v) ? v : []).map((x) => [String(rec(x).id), rec(x)]));
    const ma = items(ca[list]);
    const mb = items(cb[list]);
    if (ma.size !== mb.size) out.push({ what: 'count', list, from: ma.size, to: mb.size });
    const kindOf = (x: Rec) => (typeof x.kind === 'string' ? { kind: x.kind } : {});
    for (const [id, x] of mb) if (!ma.has(id)) out.push({ what: 'added', list, id, ...kindOf(x) });
    for (const [id, x] of ma) if (!mb.has(id)) out.push({ what: 'removed', list, id, ...kindOf(x) });
    for (const [id, x] of mb) {
      const was = ma.get(id);
      if (was && !sameJson(was, x)) fieldChanges(list, id, typeof x.kind === 'string' ? x.kind : undefined, was, x, out);
    }
  }
  return { changes: out.slice(0, MAX_LAYOUT_CHANGES), more: Math.max(0, out.length - MAX_LAYOUT_CHANGES) };
}
