import { readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { LayoutContent } from '@shared/schemas/layout';
import { ArmModel, FloorPlan, Layout } from '../models';
import type { SeedStep } from './seed';

export const DEMO_LAYOUT_FILE = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../../samples/layouts/fernhill-line3.json');

interface DemoLayoutFile {
  name: string;
  floorPlan: string;
  /** arm id → catalogue model name (ids are assigned at seeding). */
  models: Record<string, string>;
  content: unknown;
}

/** Reads samples/layouts/fernhill-line3.json with its arms' models resolved by name; validated by the app's schema. */
export function readDemoLayout(modelIdByName: (name: string) => number | undefined): { name: string; floorPlan: string; content: LayoutContent } {
  const file = JSON.parse(readFileSync(DEMO_LAYOUT_FILE, 'utf8')) as DemoLayoutFile;
  const raw = file.content as { arms: Array<{ id: string; armModelId: number }> };
  for (const arm of raw.arms) {
    const id = modelIdByName(file.models[arm.id]);
    if (!id) throw new Error(`demo layout: arm ${arm.id} names the model "${file.models[arm.id]}", which is not in the catalogue`);
    arm.armModelId = id;
  }
  return { name: file.name, floorPlan: file.floorPlan, content: LayoutContent.parse(raw) };
}

/** Seeds the Fernhill line 3 layout on the demo hall (after the catalogue and floor-plan steps). */
export const seedDemoLayout: SeedStep = async ({ transaction, planner, project }) => {
  const models = await ArmModel.findAll({ attributes: ['id', 'name'], transaction });
  const byName = new Map(models.map((m) => [m.name, m.id]));
  const demo = readDemoLayout((n) => byName.get(n));
  const plan = await FloorPlan.findOne({ where: { projectId: project.id, fileName: demo.floorPlan }, attributes: ['id'], transaction });
  await Layout.create({ projectId: project.id, floorPlanId: plan?.id ?? null, name: demo.name, content: demo.content, createdBy: planner.id }, { transaction });
};
