import { readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { FloorPlan } from '../models';
import { readFloorPlan, storedGeometry } from '../services/floorPlanImport';
import type { SeedStep } from './seed';

export const DEMO_FLOOR_PLAN_FILE = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../../samples/floor-plans/fernhill-hall.dxf');

/** Seeds the demo hall (samples/floor-plans/fernhill-hall.dxf) into the demo project, read by the real importer, dated as the history says. */
export const seedDemoFloorPlan: SeedStep = async ({ transaction, planner, project, history }) => {
  const bytes = readFileSync(DEMO_FLOOR_PLAN_FILE);
  const result = await readFloorPlan(bytes);
  await FloorPlan.create(
    {
      projectId: project.id,
      fileName: path.basename(DEMO_FLOOR_PLAN_FILE),
      originalDxf: bytes,
      units: result.units,
      unitsSource: result.unitsSource,
      bounds: result.bounds,
      layers: result.layers,
      geometry: storedGeometry(FloorPlan.sequelize!, result.geometryJson),
      warnings: result.warnings,
      stats: { ...result.stats, chordToleranceMm: result.chordToleranceMm, insunits: result.insunits },
      createdBy: planner.id,
      createdAt: history.floorPlanImported,
      updatedAt: history.floorPlanImported,
    },
    { transaction, silent: true },
  );
};
