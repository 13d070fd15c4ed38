import type { SharedZone } from '@shared/analysis';

/** One line of the shared-zones table: the pair in id order (as finding ids use it), areas m², points inside. */
export interface SharedZoneRow {
  arms: [string, string];
  areaM2: number;
  byHeight: Array<{ height: number; areaM2: number }>;
  points: string[];
}

/** Shared zones largest first (ties by pair), each pair in id order and its heights ascending. */
export function sharedZoneRows(sharedZones: ReadonlyArray<SharedZone>): SharedZoneRow[] {
  return sharedZones
    .map((o) => ({
      arms: (o.arms[0] <= o.arms[1] ? [o.arms[0], o.arms[1]] : [o.arms[1], o.arms[0]]) as [string, string],
      areaM2: o.areaM2,
      byHeight: [...o.byHeight].sort((a, b) => a.height - b.height),
      points: [...o.points],
    }))
    .sort((a, b) => b.areaM2 - a.areaM2 || (a.arms.join('+') < b.arms.join('+') ? -1 : 1));
}
