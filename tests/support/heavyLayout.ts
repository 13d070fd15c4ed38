// A large posted layout for tests and benchmarks of the heavy-work pool: the demo layout's arm
// models repeated on a grid with many work points and heights (invented, like all demo data).
import type { LayoutContent } from '@shared/schemas/layout';

/** `arms` arms on a 2.5 m grid using the given model ids in turn, `points` work points among them, at `heights`. */
export function heavyLayoutContent(modelIds: readonly number[], arms = 24, points = 1500, heights: number[] = [0, 400, 800, 1200]): LayoutContent {
  const side = Math.ceil(Math.sqrt(arms));
  return {
    arms: Array.from({ length: arms }, (_, i) => ({
      id: `H${i + 1}`,
      armModelId: modelIds[i % modelIds.length],
      label: '',
      x: (i % side) * 2500,
      y: Math.floor(i / side) * 2500,
      yaw: (i * 37) % 360,
      mountHeight: 0,
    })),
    workPoints: Array.from({ length: points }, (_, i) => ({
      id: `P${i + 1}`,
      x: ((i * 7919) % (side * 2500)) - 500,
      y: ((i * 104729) % (side * 2500)) - 500,
      z: 200 + (i % 5) * 150,
      approach: 'any' as const,
      tag: '',
    })),
    boundaries: [],
    workHeights: heights,
  };
}
