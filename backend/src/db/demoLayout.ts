import { readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import type { Transaction } from 'sequelize';
import { LayoutContent } from '@shared/schemas/layout';
import { ArmModel, FloorPlan, Layout } from '../models';
import { firstDraftOf } from './demoHistory';
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

/** The demo layout with its arms' models as the catalogue in the database names them. */
export async function loadDemoLayout(transaction: Transaction): Promise<ReturnType<typeof readDemoLayout>> {
  const models = await ArmModel.findAll({ attributes: ['id', 'name'], transaction });
  const byName = new Map(models.map((m) => [m.name, m.id]));
  return readDemoLayout((n) => byName.get(n));
}

/**
 * Seeds the Fernhill line 3 layout on the demo hall (after the catalogue and floor-plan steps) as it
 * was first drawn (samples/demo-history.json); the review step then edits it into the working copy
 * of samples/layouts/fernhill-line3.json.
 */
export const seedDemoLayout: SeedStep = async ({ transaction, planner, project, history }) => {
  const demo = await loadDemoLayout(transaction);
  const plan = await FloorPlan.findOne({ where: { projectId: project.id, fileName: demo.floorPlan }, attributes: ['id'], transaction });
  await Layout.create(
    {
      projectId: project.id,
      floorPlanId: plan?.id ?? null,
      name: demo.name,
      content: firstDraftOf(demo.content, history),
      createdBy: planner.id,
      createdAt: history.layoutDrawn,
      updatedAt: history.layoutDrawn,
    },
    { transaction, silent: true },
  );
};
