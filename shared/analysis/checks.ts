/**
 * Which checks the analysis ran on a cell layout, in words, so an empty findings list says what was
 * looked at rather than a bare "no findings". A check is listed when the layout holds what it
 * looks at (two arms for shared zones, a fence for the fence checks …); the analysis itself runs
 * the same conditions (analyze.ts, clearance.ts, safeguarding.ts).
 */

/** What the check list needs to know of a layout. */
export interface CheckedContent {
  arms: ReadonlyArray<unknown>;
  workPoints?: ReadonlyArray<unknown>;
  boundaries: ReadonlyArray<{ kind: string }>;
}

/** What the check list needs to know of the floor plan; null when the layout has none. */
export interface CheckedFloor {
  /** The floor plan has a floor outline layer. */
  outline: boolean;
  /** The floor plan has walls, columns or machines. */
  structure: boolean;
}

/** The checks run on a layout, each as a short phrase, in the order findings are listed. */
export function checksRun(content: CheckedContent, floor: CheckedFloor | null): string[] {
  const arms = content.arms.length;
  const has = (kind: 'fence' | 'opening' | 'keepout' | 'operator') => content.boundaries.some((b) => b.kind === kind);
  const out: string[] = [];
  if (content.workPoints?.length) out.push('every work point reached by an arm (and by its assigned arm)');
  if (arms) out.push('every arm model known and its reach computed');
  if (arms >= 2) out.push('shared zones of every pair of arms');
  if (arms && floor?.outline) out.push('arm bases on the floor outline');
  if (arms && floor?.structure) out.push('bases clear of columns, reach into walls, columns and machines');
  if (arms && has('fence')) out.push('reach beyond guard fences, fence clearance and height, reach over and through fences (ISO 13857)');
  if (arms && has('opening')) out.push('reach through access openings and separation distances at safeguarded openings (ISO 13855)');
  if (arms && has('operator')) out.push('reach into operator areas');
  if (arms && has('keepout')) out.push('reach into keep-outs');
  if (arms && (floor?.structure || has('fence'))) out.push('crushing gaps between restricted spaces and structure or fences (ISO 13854)');
  return out;
}

/** The sentence an empty findings list shows: what was checked, or what to add before anything can be. */
export function noFindingsSentence(content: CheckedContent, floor: CheckedFloor | null): string {
  const checks = checksRun(content, floor);
  if (!checks.length) return 'Nothing to check yet: place an arm or add work points, and the checks run as you edit.';
  return `No findings from the checks run on this cell layout: ${checks.join('; ')}.`;
}

/** The check list's view of a floor plan from its layers' roles (ignored layers count for nothing). */
export function checkedFloorOf(layers: ReadonlyArray<{ role: string }> | null | undefined): CheckedFloor | null {
  if (!layers) return null;
  return { outline: layers.some((l) => l.role === 'outline'), structure: layers.some((l) => l.role === 'wall' || l.role === 'column' || l.role === 'obstacle') };
}
