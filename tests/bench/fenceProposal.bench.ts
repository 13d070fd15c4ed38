// Guard-ring proposal benchmark: the generated 40-arm layout (no floor plan) and the Fernhill demo
// on its hall, arm regions built once before timing (the analysis' own cost). Target: ≤ 1 s.
// Run: npm run bench fenceProposal
import { prepareFloor, type FloorLayer } from '@shared/analysis';
import { armReachFor } from '@shared/analysis/armReach';
import { proposeFence } from '@shared/analysis/fenceProposal';
import { DEFAULT_FENCE_SYSTEM } from '@shared/schemas/fenceProposal';
import { demoSheetInput, gridSheetInput } from '../support/planSheetInput';
import { report } from './report';

const TIME_TARGET_MS = 1000;
const RUNS = 7;

function measure(name: string, input: ReturnType<typeof gridSheetInput>) {
  const params = new Map(input.models.map((m) => [m.id, m.params]));
  const floor = input.floorPlan ? prepareFloor(input.floorPlan.geometry, input.floorPlan.layers as FloorLayer[]) : null;
  const run = () =>
    proposeFence({ arms: input.layout.content.arms, boundaries: input.layout.content.boundaries, floor, reachFor: (id, r) => armReachFor(params.get(id), r), system: DEFAULT_FENCE_SYSTEM });
  run(); // warm-up: regions built and cached, code compiled
  const times: number[] = [];
  let last = run();
  for (let i = 0; i < RUNS; i++) {
    const t0 = performance.now();
    last = run();
    times.push(performance.now() - t0);
  }
  times.sort((a, b) => a - b);
  const median = times[Math.floor(times.length / 2)];
  report({
    what: `guard-ring proposal, ${name} (median of ${RUNS})`, figure: median, unit: 'ms', target: TIME_TARGET_MS, better: 'lower', digits: 1,
    note: `${input.layout.content.arms.length} arms → ${last.rings.length} ring(s), ${(last.lengthMm / 1000).toFixed(1)} m, ${last.parts.panels.length} panels`,
  });
}

measure('Fernhill demo', demoSheetInput());
measure('40-arm grid', gridSheetInput(40));
