import { describe, expect, it } from 'vitest';
import { findingId } from '@shared/analysis/messages';
import { sharedZoneRows } from '../../../frontend/src/components/layout/sharedZoneRows';

const boundary = (a: string, b: string, areaM2: number) => ({
  arms: [a, b] as [string, string],
  areaM2,
  points: ['P2', 'P1'],
  geometry: null,
  byHeight: [{ height: 1100, areaM2: areaM2 / 2 }, { height: 150, areaM2 }],
});

describe('sharedZoneRows', () => {
  it('orders boundaries largest first, pairs in id order, heights ascending, inputs untouched', () => {
    const input = Object.freeze([boundary('R1', 'R2', 1.5), boundary('R4', 'R3', 3.25), boundary('R2', 'R3', 1.5)].map((z) => Object.freeze(z)));
    const rows = sharedZoneRows(input);
    expect(rows.map((r) => r.arms.join('+'))).toEqual(['R3+R4', 'R1+R2', 'R2+R3']);
    expect(rows[0].byHeight.map((b) => b.height)).toEqual([150, 1100]);
    expect(input[1].byHeight[0].height).toBe(1100);
  });

  it('names the same finding the analysis raises for the pair', () => {
    const [row] = sharedZoneRows([boundary('R4', 'R3', 1)]);
    expect(findingId('shared-zone', ...row.arms)).toBe('shared-zone:R3+R4');
  });
});
