/**
 * Layout edits of the placement search and auto-layout (pure; one call = one undo step): which
 * work points a search is for, placing or moving an arm at a candidate, taking a proposal.
 */
import type { PlacementCandidate } from '@shared/analysis';
import type { ArmPlacement, LayoutContent } from '@shared/schemas/layout';
import { nextFreeId, normalizeYaw, roundMm } from './layoutEdits';

/** Which work points to search for: the selected one, one tag, those no arm is assigned to, or all. */
export type PointChoice = { kind: 'selected'; id: string } | { kind: 'tag'; tag: string } | { kind: 'unassigned' } | { kind: 'all' };

/** The ids of the chosen work points, in layout order. */
export function chosenPoints(content: Readonly<LayoutContent>, choice: PointChoice): string[] {
  return content.workPoints
    .filter((p) => (choice.kind === 'selected' ? p.id === choice.id : choice.kind === 'tag' ? p.tag === choice.tag : choice.kind === 'unassigned' ? !p.assignedArm : true))
    .map((p) => p.id);
}

/** The tags of the layout's work points, sorted, without the empty one. */
export function pointTags(content: Readonly<LayoutContent>): string[] {
  return [...new Set(content.workPoints.map((p) => p.tag).filter(Boolean))].sort();
}

/**
 * Puts an arm at a candidate: moves and turns the placed arm `armId`, or adds a new arm of the model
 * with the search's mount height and restricting limits. Returns the new content and the arm's id.
 */
export function placeAtCandidate(
  content: Readonly<LayoutContent>,
  c: Readonly<Pick<PlacementCandidate, 'x' | 'y' | 'yawDeg'>>,
  arm: { armId: string } | { armModelId: number; mountHeight: number; restrict?: ArmPlacement['restrict'] },
): { content: LayoutContent; id: string } {
  if ('armId' in arm) {
    if (!content.arms.some((a) => a.id === arm.armId)) throw new Error(`No arm ${arm.armId} on this cell layout`);
    return { content: { ...content, arms: content.arms.map((a) => (a.id === arm.armId ? { ...a, x: roundMm(c.x), y: roundMm(c.y), yaw: normalizeYaw(c.yawDeg) } : a)) }, id: arm.armId };
  }
  const id = nextFreeId('R', content.arms.map((a) => a.id));
  const placed: ArmPlacement = { id, armModelId: arm.armModelId, label: '', x: roundMm(c.x), y: roundMm(c.y), yaw: normalizeYaw(c.yawDeg), mountHeight: arm.mountHeight, ...(arm.restrict ? { restrict: arm.restrict } : {}) };
  return { content: { ...content, arms: [...content.arms, placed] }, id };
}
