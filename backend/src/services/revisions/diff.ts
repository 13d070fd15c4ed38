/** What changed between two revisions of a layout, from their snapshots. */
import type { RevisionDiff, RevisionSnapshot } from '@shared/schemas/revision';

type Finding = RevisionSnapshot['analysis']['findings'][number];

/** The parts of a snapshot a diff compares: its arms and its findings. */
export interface DiffSide {
  layout: { content: Pick<RevisionSnapshot['layout']['content'], 'arms'> };
  analysis: Pick<RevisionSnapshot['analysis'], 'findings'>;
}

/** Moves smaller than this (mm) or turns smaller than this (deg) are rounding, not changes. */
const MOVE_EPS_MM = 0.5;
const YAW_EPS_DEG = 0.01;

/** Arms added/removed/moved (Euclidean plan distance, yaw change wrapped to ±180°) and findings new/gone by id. */
export function diffSnapshots(prev: DiffSide | null, cur: DiffSide, previous: RevisionDiff['previous']): RevisionDiff {
  const before = new Map((prev?.layout.content.arms ?? []).map((a) => [a.id, a]));
  const after = new Map(cur.layout.content.arms.map((a) => [a.id, a]));
  const diff: RevisionDiff = { previous, arms: { added: [], removed: [], moved: [] }, findings: { added: [], removed: [] } };
  if (!prev) return diff;
  for (const [id, a] of after) {
    const b = before.get(id);
    if (!b) {
      diff.arms.added.push({ id, x: a.x, y: a.y });
      continue;
    }
    const distance = Math.hypot(a.x - b.x, a.y - b.y);
    const yawChange = ((((a.yaw - b.yaw) % 360) + 540) % 360) - 180;
    if (distance > MOVE_EPS_MM || Math.abs(yawChange) > YAW_EPS_DEG) diff.arms.moved.push({ id, from: [b.x, b.y], to: [a.x, a.y], distance, yawChange });
  }
  for (const [id, b] of before) if (!after.has(id)) diff.arms.removed.push({ id, x: b.x, y: b.y });
  const fBefore = new Map(prev.analysis.findings.map((f) => [f.id, f]));
  const fAfter = new Map(cur.analysis.findings.map((f) => [f.id, f]));
  const pick = (f: Finding) => ({ id: f.id, severity: f.severity, message: f.message });
  for (const [id, f] of fAfter) if (!fBefore.has(id)) diff.findings.added.push(pick(f));
  for (const [id, f] of fBefore) if (!fAfter.has(id)) diff.findings.removed.push(pick(f));
  return diff;
}
