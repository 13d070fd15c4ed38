import { parseFindingId } from './messages';
import type { Finding } from './types';

/** What a finding can concern, as people call it. */
export type ConcernRole = 'arm' | 'fence' | 'access opening' | 'keep-out' | 'operator area' | 'boundary' | 'layer' | 'work point';

/** One element a finding concerns: its role, its id in the layout and how it is named ("R1 (case packer)"). */
export interface FindingConcern {
  role: ConcernRole;
  id: string;
  name: string;
}

/** The parts of a cell layout a finding's elements are looked up in (labels and kinds). */
export interface ConcernContent {
  arms: ReadonlyArray<{ id: string; label?: string }>;
  boundaries: ReadonlyArray<{ id: string; kind: string; label?: string }>;
  workPoints?: ReadonlyArray<{ id: string; tag?: string }>;
}

const BOUNDARY_ROLE: Record<string, ConcernRole> = { fence: 'fence', opening: 'access opening', keepout: 'keep-out', operator: 'operator area' };
/** Kinds whose ids name a floor-plan layer (structure) beside the arm. */
const LAYER_KINDS = new Set(['reach-into-structure', 'base-on-column', 'crushing-gap']);
/** The first id of a `computation-failed` finding says which check failed; it names no element. */
const FAILED_CHECKS = new Set(['overlap', 'structure', 'boundary', 'safeguard', 'fence']);

const named = (id: string, label: string | undefined) => (label ? `${id} (${label})` : id);

/**
 * A layout's arms, boundaries and work points by id, built once for many findings: a large layout
 * has thousands of findings and tens of thousands of work points, and indexing them per finding
 * costs seconds. Build it again when the content changes.
 */
export class ConcernLookup {
  readonly arms: ReadonlyMap<string, ConcernContent['arms'][number]>;
  readonly boundaries: ReadonlyMap<string, ConcernContent['boundaries'][number]>;
  readonly points: ReadonlyMap<string, NonNullable<ConcernContent['workPoints']>[number]>;

  constructor(content: ConcernContent) {
    this.arms = new Map(content.arms.map((a) => [a.id, a]));
    this.boundaries = new Map(content.boundaries.map((z) => [z.id, z]));
    this.points = new Map((content.workPoints ?? []).map((p) => [p.id, p]));
  }
}

/**
 * The elements a finding concerns, by their names in the layout: its arms, the boundaries and
 * floor-plan layers in its id, its work points. The finding id itself is for matching comments
 * across revisions and is never shown; ids the layout no longer has are left out. For many findings
 * of one layout, pass a ConcernLookup of it.
 */
export function findingConcerns(f: Pick<Finding, 'id'> & Partial<Pick<Finding, 'arms' | 'points'>>, content: ConcernContent | ConcernLookup): FindingConcern[] {
  const parsed = parseFindingId(f.id);
  const { arms, boundaries, points } = content instanceof ConcernLookup ? content : new ConcernLookup(content);
  const own = new Set(f.points ?? []);
  const out: FindingConcern[] = [];
  const seen = new Set<string>();
  const add = (role: ConcernRole, id: string, name: string) => {
    if (seen.has(`${role}:${id}`)) return;
    seen.add(`${role}:${id}`);
    out.push({ role, id, name });
  };
  for (const id of f.arms ?? []) add('arm', id, named(id, arms.get(id)?.label));
  const ids = parsed?.ids ?? [];
  const layerCheck = parsed?.kind === 'computation-failed' && ids[0] === 'structure';
  ids.forEach((id, i) => {
    if (parsed?.kind === 'computation-failed' && i === 0 && FAILED_CHECKS.has(id)) return;
    const arm = arms.get(id);
    const boundary = boundaries.get(id);
    if (arm) add('arm', id, named(id, arm.label));
    else if (boundary) add(BOUNDARY_ROLE[boundary.kind] ?? 'boundary', id, named(id, boundary.label));
    else if (points.has(id) || own.has(id)) add('work point', id, named(id, points.get(id)?.tag));
    else if (layerCheck || (parsed && LAYER_KINDS.has(parsed.kind))) {
      const layer = id.replace(/#\d+$/, '');
      add('layer', layer, `“${layer}”`);
    }
  });
  for (const id of f.points ?? []) add('work point', id, named(id, points.get(id)?.tag));
  const order: ConcernRole[] = ['arm', 'fence', 'access opening', 'keep-out', 'operator area', 'boundary', 'layer', 'work point'];
  return out.sort((a, b) => order.indexOf(a.role) - order.indexOf(b.role));
}

const PLURAL: Record<ConcernRole, string> = {
  arm: 'Arms',
  fence: 'Fences',
  'access opening': 'Access openings',
  'keep-out': 'Keep-outs',
  'operator area': 'Operator areas',
  boundary: 'Boundaries',
  layer: 'Layers',
  'work point': 'Work points',
};

/** The concerns as one line: "Arm R1 (case packer) · Fence F1 · Work points P1, P2 and 4 more" ('' when there are none). */
export function concernsText(concerns: ReadonlyArray<FindingConcern>, maxPerRole = 6): string {
  const groups = new Map<ConcernRole, string[]>();
  for (const c of concerns) groups.set(c.role, [...(groups.get(c.role) ?? []), c.name]);
  return [...groups]
    .map(([role, names]) => {
      const head = names.length === 1 ? role[0].toUpperCase() + role.slice(1) : PLURAL[role];
      const shown = names.slice(0, maxPerRole).join(', ');
      return `${head} ${shown}${names.length > maxPerRole ? ` and ${names.length - maxPerRole} more` : ''}`;
    })
    .join(' · ');
}
