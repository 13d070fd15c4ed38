/**
 * A revision's snapshot: the layout as stored now (content, floor plan, the arm models' parameters,
 * the analysis), frozen as plain JSON, and the sha256 of its canonical JSON. The floor plan is
 * stored apart, once per content (snapshot_floor_plans, keyed by the sha256 of its canonical JSON);
 * the revision's checksum is taken over the whole snapshot with the floor plan in it, as it always was.
 */
import type { Transaction } from 'sequelize';
import type { LayoutContent } from '@shared/schemas/layout';
import { upgradeFloorPlanNames, upgradeSnapshotNames, type RevisionSnapshot, type SnapshotFloorPlan as FloorPlanPart, type StoredRevisionSnapshot } from '@shared/schemas/revision';
import { notFound } from '../../http/errors';
import { ArmModel, FloorPlan, Project, SnapshotFloorPlan, type Layout, type Revision } from '../../models';
import { analyzeLayout } from '../layoutAnalysis';
import { snapshotChecksum } from './checksum';

export { snapshotChecksum };

/** Freezes a layout as stored now into a snapshot (JSON-normalised, so it reads back identically); reads inside `transaction` when given. */
export async function buildSnapshot(layout: Layout, transaction?: Transaction): Promise<RevisionSnapshot> {
  const content = layout.content as LayoutContent;
  const project = await Project.findByPk(layout.projectId, { transaction });
  if (!project) throw notFound('Project');
  const fp = layout.floorPlanId ? await FloorPlan.findByPk(layout.floorPlanId, { attributes: ['id', 'fileName', 'units', 'geometry', 'layers', 'bounds'], transaction }) : null;
  const ids = [...new Set(content.arms.map((a) => a.armModelId))];
  const models = await ArmModel.findAll({ where: { id: ids }, attributes: ['id', 'name', 'family', 'params'], order: [['id', 'ASC']], transaction });
  const analysis = await analyzeLayout(layout, undefined, transaction);
  const raw: RevisionSnapshot = {
    project: { id: project.id, name: project.name, clientName: project.clientName ?? null, siteName: project.siteName ?? null },
    layout: { id: layout.id, name: layout.name, version: layout.version, content },
    floorPlan: fp ? { id: fp.id, fileName: fp.fileName, units: fp.units, geometry: fp.geometry, layers: fp.layers, bounds: fp.bounds } : null,
    models: models.map((m) => ({ id: m.id, name: m.name, family: m.family, params: m.params })),
    analysis,
  };
  return JSON.parse(JSON.stringify(raw)) as RevisionSnapshot;
}

/** The snapshot split for storage: the rest as the revision's row holds it, and the floor plan with its checksum. */
export function splitSnapshot(snapshot: RevisionSnapshot): { stored: StoredRevisionSnapshot; floorPlan: FloorPlanPart | null; floorPlanChecksum: string | null } {
  const { floorPlan, ...rest } = snapshot;
  return { stored: rest, floorPlan, floorPlanChecksum: floorPlan ? snapshotChecksum(floorPlan) : null };
}

/** Stores a frozen floor plan once: a plan with the same content (same checksum) is already there and is shared. */
export async function storeSnapshotFloorPlan(floorPlan: FloorPlanPart, checksum: string, transaction: Transaction): Promise<void> {
  if (await SnapshotFloorPlan.findByPk(checksum, { attributes: ['checksum'], transaction })) return;
  await SnapshotFloorPlan.bulkCreate([{ checksum, content: floorPlan }], { transaction, ignoreDuplicates: true });
}

/** The floor plan a revision froze: the shared stored row, or the copy inside snapshots stored before plans were kept apart. */
async function storedFloorPlan(rev: Pick<Revision, 'floorPlanChecksum' | 'storedSnapshot'>, transaction?: Transaction): Promise<FloorPlanPart | null> {
  if (rev.floorPlanChecksum) {
    const row = await SnapshotFloorPlan.findByPk(rev.floorPlanChecksum, { transaction });
    if (!row) throw new Error(`stored floor plan ${rev.floorPlanChecksum} is missing`);
    return row.content;
  }
  return rev.storedSnapshot().floorPlan ?? null;
}

/** The floor plan a revision froze (the shared stored row, or the copy inside older snapshots), read under today's names. */
export async function loadSnapshotFloorPlan(rev: Pick<Revision, 'floorPlanChecksum' | 'storedSnapshot'>, transaction?: Transaction): Promise<FloorPlanPart | null> {
  return upgradeFloorPlanNames(await storedFloorPlan(rev, transaction));
}

/** The whole snapshot of a revision, floor plan included, exactly as stored: what its checksum is computed over. */
export async function fullSnapshot(rev: Pick<Revision, 'floorPlanChecksum' | 'storedSnapshot'>): Promise<RevisionSnapshot> {
  return { ...rev.storedSnapshot(), floorPlan: await storedFloorPlan(rev) } as RevisionSnapshot;
}

/** The whole snapshot of a revision read under today's names (what pages, sheets and diffs use). */
export async function readSnapshot(rev: Pick<Revision, 'floorPlanChecksum' | 'storedSnapshot'>): Promise<RevisionSnapshot> {
  return upgradeSnapshotNames(await fullSnapshot(rev));
}
