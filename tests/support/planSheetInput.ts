// Plan-sheet inputs built without a database: the Fernhill demo (samples/, read by the app's own
// importer, catalogue reader and layout reader) and a generated many-arm layout for benchmarks.
import { readFileSync } from 'node:fs';
import { createAnalyzer, prepareFloor, type FloorLayer } from '@shared/analysis';
import { armReachFor } from '@shared/analysis/armReach';
import type { LayoutContent } from '@shared/schemas/layout';
import { readDemoCatalogue } from '../../backend/src/db/demoCatalogue';
import { DEMO_FLOOR_PLAN_FILE } from '../../backend/src/db/demoFloorPlan';
import { readDemoLayout } from '../../backend/src/db/demoLayout';
import { importDxf } from '../../backend/src/services/dxf';
import type { PlanSheetInput } from '../../backend/src/services/planSheet';

type Models = PlanSheetInput['models'];

function analyse(content: LayoutContent, models: Models, floorPlan: PlanSheetInput['floorPlan']) {
  const params = new Map(models.map((m) => [m.id, m.params]));
  const analyzer = createAnalyzer((id, restrict) => armReachFor(params.get(id), restrict));
  const floor = floorPlan ? prepareFloor(floorPlan.geometry, floorPlan.layers as FloorLayer[]) : null;
  return analyzer.analyze({ arms: content.arms, workPoints: content.workPoints, boundaries: content.boundaries, workHeights: content.workHeights, floor });
}

/** The demo catalogue with ids 1… in file order. */
export function demoModels(): Models {
  return readDemoCatalogue().map((m, i) => ({ id: i + 1, name: m.name, family: m.params.family, params: m.params as Record<string, unknown> }));
}

/** The demo hall as the importer reads it. */
export function demoFloorPlan(): NonNullable<PlanSheetInput['floorPlan']> {
  const r = importDxf(readFileSync(DEMO_FLOOR_PLAN_FILE));
  return { geometry: r.geometry, layers: r.layers, bounds: r.bounds };
}

/** The Fernhill line 3 cell on the demo hall, analysed with the shared analysis. */
export function demoSheetInput(): PlanSheetInput {
  const models = demoModels();
  const demo = readDemoLayout((n) => models.find((m) => m.name === n)?.id);
  const floorPlan = demoFloorPlan();
  return {
    project: { name: 'Fernhill line 3 end-of-line cell', clientName: 'Fernhill Biscuit Works', siteName: 'Packing hall' },
    layout: { id: 1, name: demo.name, content: demo.content },
    floorPlan,
    analysis: analyse(demo.content, models, floorPlan),
    models,
    revision: null,
    history: [],
    drawnBy: 'Demo Planner',
    reviewedBy: null,
  };
}

/** A generated layout of `n` arms on a grid (cycling the demo models), with work points between them, no floor plan. */
export function gridSheetInput(n: number): PlanSheetInput {
  const models = demoModels();
  const cols = Math.ceil(Math.sqrt(n));
  const arms: LayoutContent['arms'] = [];
  const workPoints: LayoutContent['workPoints'] = [];
  for (let i = 0; i < n; i++) {
    const x = (i % cols) * 3500, y = Math.floor(i / cols) * 3500;
    arms.push({ id: `R${i + 1}`, armModelId: models[i % models.length].id, label: `Cell arm ${i + 1}`, x, y, yaw: (i * 37) % 360, mountHeight: 0 });
    for (let k = 0; k < 5; k++) workPoints.push({ id: `P${i + 1}.${k + 1}`, x: x + 400 + k * 250, y: y + 300 - k * 120, z: 300, approach: 'any', tag: `station ${i + 1}` });
  }
  const w = cols * 3500;
  const content: LayoutContent = {
    arms,
    workPoints,
    boundaries: [{ id: 'F1', kind: 'fence', label: '', points: [[-3000, -3000], [w, -3000], [w, w], [-3000, w]], height: 2000 }],
    workHeights: [300],
  };
  return {
    project: { name: 'Generated grid', clientName: 'Fernhill Biscuit Works', siteName: 'Packing hall' },
    layout: { id: 2, name: `${n}-arm grid`, content },
    floorPlan: null,
    analysis: analyse(content, models, null),
    models,
    revision: null,
    history: [],
    drawnBy: 'Demo Planner',
    reviewedBy: null,
  };
}
