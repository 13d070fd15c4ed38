/**
 * A revision's snapshot: the layout as stored now (content, floor plan, the arm models' parameters,
 * the analysis), frozen as plain JSON, and the sha256 of its canonical JSON.
 */
import { createHash } from 'node:crypto';
import { canonicalJson } from '@shared/canonicalJson';
import type { LayoutContent } from '@shared/schemas/layout';
import type { RevisionSnapshot } from '@shared/schemas/revision';
import { notFound } from '../../http/errors';
import { ArmModel, FloorPlan, Project, type Layout } from '../../models';
import { analyzeLayout } from '../layoutAnalysis';

/** sha256 (hex) of the canonical JSON of a snapshot (keys sorted at every level). */
export function snapshotChecksum(snapshot: unknown): string {
  return createHash('sha256').update(canonicalJson(snapshot)).digest('hex');
}

/** Freezes a layout as stored now into a snapshot (JSON-normalised, so it reads back identically). */
export async function buildSnapshot(layout: Layout): Promise<RevisionSnapshot> {
  const content = layout.content as LayoutContent;
  const project = await Project.findByPk(layout.projectId);
  if (!project) throw notFound('Project');
  const fp = layout.floorPlanId ? await FloorPlan.findByPk(layout.floorPlanId, { attributes: ['id', 'fileName', 'units', 'geometry', 'layers', 'bounds'] }) : null;
  const ids = [...new Set(content.arms.map((a) => a.armModelId))];
  const models = await ArmModel.findAll({ where: { id: ids }, attributes: ['id', 'name', 'family', 'params'], order: [['id', 'ASC']] });
  const analysis = await analyzeLayout(layout);
  const raw: RevisionSnapshot = {
    project: { id: project.id, name: project.name, clientName: project.clientName ?? null, siteName: project.siteName ?? null },
    layout: { id: layout.id, name: layout.name, version: layout.version, content },
    floorPlan: fp ? { id: fp.id, fileName: fp.fileName, units: fp.units, geometry: fp.geometry, layers: fp.layers, bounds: fp.bounds } : null,
    models: models.map((m) => ({ id: m.id, name: m.name, family: m.family, params: m.params })),
    analysis,
  };
  return JSON.parse(JSON.stringify(raw)) as RevisionSnapshot;
}
